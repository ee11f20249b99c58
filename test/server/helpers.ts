/** A real SQLite gazetteer in a temporary folder, and a real service on 127.0.0.1 over it. */
import { spawn, type ChildProcessWithoutNullStreams } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { FastifyInstance } from 'fastify';
import { afterAll, beforeAll } from 'vitest';
import { importGazetteer } from '../../src/store/import.ts';
import { openGazetteer, type GazetteerStore } from '../../src/store/gazetteer-store.ts';
import { buildServer, type ServerOptions } from '../../src/server/app.ts';

export const DEMO_GAZETTEER = new URL('../../gazetteer/demo.geojson', import.meta.url).pathname;
export const BIN = new URL('../../bin/whereabouts.js', import.meta.url).pathname;
export const DEMO_LOCALITIES = new URL('../../gazetteer/demo-localities.csv', import.meta.url).pathname;

export interface TempDatabase {
  dir: string;
  dbPath: string;
  remove(): void;
}

/**
 * The demo gazetteer imported into a fresh file, plus any extra GeoJSON features given (imported as
 * a second source named "extra").
 */
export async function demoDatabase(extraFeatures: object[] = []): Promise<TempDatabase> {
  const dir = mkdtempSync(join(tmpdir(), 'whereabouts-server-'));
  const dbPath = join(dir, 'gazetteer.sqlite');
  const store = openGazetteer(dbPath);
  try {
    await importGazetteer(store, DEMO_GAZETTEER, { format: 'geojson', citation: 'whereabouts demo gazetteer (invented island)' });
    if (extraFeatures.length) {
      const extra = join(dir, 'extra.geojson');
      writeFileSync(extra, JSON.stringify({ type: 'FeatureCollection', features: extraFeatures }));
      await importGazetteer(store, extra, { format: 'geojson', citation: 'test features', sourceId: 'extra' });
    }
  } finally {
    store.close();
  }
  return { dir, dbPath, remove: () => rmSync(dir, { recursive: true, force: true }) };
}

/**
 * The demo gazetteer imported again as a second source, "copy": every place in two sources, cited from
 * the one ranked first (docs/method.md §4a). Returns the writable connection that imported it, for the
 * test's changes made as another process would make them.
 */
export async function withDemoCopy(db: TempDatabase): Promise<GazetteerStore> {
  const other = openGazetteer(db.dbPath);
  await importGazetteer(other, DEMO_GAZETTEER, { format: 'geojson', citation: 'whereabouts demo gazetteer, second copy (invented island)', sourceId: 'copy' });
  return other;
}

export interface RunningServer {
  app: FastifyInstance;
  /** e.g. http://127.0.0.1:41234 */
  url: string;
  close(): Promise<void>;
}

/** buildServer, listening on 127.0.0.1 at a port the system picks. */
export async function listen(options: ServerOptions): Promise<RunningServer> {
  const app = await buildServer(options);
  await app.listen({ host: '127.0.0.1', port: 0 });
  const address = app.server.address();
  if (typeof address !== 'object' || !address) throw new Error('no address');
  return { app, url: `http://127.0.0.1:${address.port}`, close: () => app.close() };
}

/** The demo database and a real server over it, made before a test file's tests and removed after them. */
export interface DemoService {
  readonly db: TempDatabase;
  readonly server: RunningServer;
}

/**
 * Registers beforeAll/afterAll for a test file: the demo gazetteer in a fresh SQLite file (plus any extra
 * features, as `demoDatabase`) and `buildServer` over it on 127.0.0.1 with `options`; read `db` and `server`
 * inside the tests.
 * @example
 *   const demo = useDemoServer();
 *   it('answers', async () => expect((await post(`${demo.server.url}/api/v1/georeference`, body)).status).toBe(200));
 */
export function useDemoServer(options: Omit<ServerOptions, 'dbPath'> = {}, extraFeatures: object[] = []): DemoService {
  let db: TempDatabase | undefined;
  let server: RunningServer | undefined;
  beforeAll(async () => {
    db = await demoDatabase(extraFeatures);
    server = await listen({ ...options, dbPath: db.dbPath });
  }, 120_000);
  afterAll(async () => {
    await server?.close();
    db?.remove();
  });
  const ready = <T>(value: T | undefined, what: string): T => value ?? (() => { throw new Error(`the demo ${what} is made in beforeAll; read it inside a test`); })();
  return {
    get db() {
      return ready(db, 'database');
    },
    get server() {
      return ready(server, 'server');
    },
  };
}

/** POST JSON (or raw bytes) to the running server. */
export async function post(url: string, body: unknown, headers: Record<string, string> = {}): Promise<{ status: number; json: any; headers: Headers }> {
  const raw: string | Uint8Array = typeof body === 'string' ? body : body instanceof Uint8Array ? new Uint8Array(body) : JSON.stringify(body);
  const response = await fetch(url, { method: 'POST', body: raw as BodyInit, headers: { 'content-type': 'application/json', ...headers } });
  const text = await response.text();
  let json: any;
  try {
    json = JSON.parse(text);
  } catch {
    json = text;
  }
  return { status: response.status, json, headers: response.headers };
}

/**
 * The real `whereabouts serve` in a child process (no token in its environment), run in `cwd` (default
 * this process's); resolves with its printed URL.
 */
export function spawnServe(args: string[], cwd?: string): Promise<{ url: string; child: ChildProcessWithoutNullStreams }> {
  const { WHEREABOUTS_DB: _db, ...env } = process.env; // the database is the one the arguments or the default name
  const child = spawn(process.execPath, [BIN, 'serve', ...args], { cwd, env: { ...env, WHEREABOUTS_TOKEN: '', WHEREABOUTS_TOKEN_FILE: '' } });
  return new Promise((resolve, reject) => {
    let out = '';
    child.stdout.on('data', (chunk) => {
      out += chunk;
      const match = /http:\/\/127\.0\.0\.1:\d+/.exec(out);
      if (match) resolve({ url: match[0], child });
    });
    child.on('exit', (code) => reject(new Error(`whereabouts serve exited with ${code}`)));
  });
}

/**
 * Uploads a file for a batch to a real `whereabouts serve` over `dbPath` and stops the service with
 * SIGTERM at once; resolves with the job's id and the exit code, for tests of the resume on the next start.
 */
export async function uploadThenStop(dbPath: string, bytes: Uint8Array, name: string): Promise<{ jobId: string; uploadStatus: number; exitCode: unknown }> {
  const { url, child } = await spawnServe(['--port', '0', '--db', dbPath]);
  const form = new FormData();
  form.append('file', new Blob([new Uint8Array(bytes)]), name);
  const started = await fetch(`${url}/api/v1/batches`, { method: 'POST', body: form });
  const { jobId } = (await started.json()) as { jobId: string };
  const exited = new Promise((resolve) => child.on('exit', resolve));
  child.kill('SIGTERM');
  return { jobId, uploadStatus: started.status, exitCode: await exited };
}
