/**
 * The page's files, read into memory when the server starts: a request's path is only ever a key in
 * this table, so no path from a request reaches the file system. Leaflet, topojson-client and the
 * world-atlas outlines come from node_modules, so the page needs no internet connection.
 */
import { createHash } from 'node:crypto';
import { readdirSync, readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { extname, join, relative, sep } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { FastifyInstance } from 'fastify';

const WEB_ROOT = fileURLToPath(new URL('../../web/', import.meta.url));
const require = createRequire(import.meta.url);

const TYPES: Record<string, string> = {
  '.html': 'text/html; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.json': 'application/json; charset=utf-8',
  '.svg': 'image/svg+xml',
  '.png': 'image/png',
};

/** Files of installed packages the page loads, by the URL it loads them from. */
const VENDOR_FILES: Record<string, string> = {
  '/vendor/leaflet.js': 'leaflet/dist/leaflet.js',
  '/vendor/leaflet.css': 'leaflet/dist/leaflet.css',
  '/vendor/topojson-client.js': 'topojson-client/dist/topojson-client.min.js',
  // Natural Earth country outlines at 1:110 000 000 (world-atlas), the map's only basemap.
  '/vendor/countries-110m.json': 'world-atlas/countries-110m.json',
};

interface Asset {
  body: Buffer;
  type: string;
  etag: string;
}

/** Every servable file by URL path: web/ as it is (index.html also at "/"), plus the vendor files. */
export function loadAssets(): Map<string, Asset> {
  const assets = new Map<string, Asset>();
  for (const file of listFiles(WEB_ROOT)) {
    const url = `/${relative(WEB_ROOT, file).split(sep).join('/')}`;
    assets.set(url, asset(file));
  }
  for (const [url, spec] of Object.entries(VENDOR_FILES)) assets.set(url, asset(require.resolve(spec)));
  const index = assets.get('/index.html');
  if (index) assets.set('/', index);
  const login = assets.get('/login.html');
  if (login) assets.set('/login', login);
  return assets;
}

/** GET routes for the page's files; anything else under these prefixes is a plain 404. */
export function registerAssets(app: FastifyInstance, assets: Map<string, Asset>): void {
  for (const [url, file] of assets) {
    app.get(url, { schema: { hide: true } }, async (request, reply) => {
      reply.header('content-type', file.type).header('etag', file.etag).header('cache-control', 'no-cache');
      if (request.headers['if-none-match'] === file.etag) return reply.code(304).send();
      return reply.send(file.body);
    });
  }
}

function asset(file: string): Asset {
  const body = readFileSync(file);
  return { body, type: TYPES[extname(file)] ?? 'application/octet-stream', etag: `"${createHash('sha1').update(body).digest('hex').slice(0, 20)}"` };
}

function listFiles(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
    const path = join(dir, entry.name);
    if (entry.name.startsWith('.')) return [];
    return entry.isDirectory() ? listFiles(path) : TYPES[extname(entry.name)] ? [path] : [];
  });
}
