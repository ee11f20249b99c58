import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { InvalidArgumentError, type Command } from 'commander';
import { SERVER_DEFAULTS } from '../../server/defaults.ts';

/** The port `serve` listens on unless told otherwise [CHOICE]; 0 asks the system for a free one. */
export const DEFAULT_PORT = 8737;
const DEMO_GAZETTEER = fileURLToPath(new URL('../../../gazetteer/demo.geojson', import.meta.url));
const DEMO_CITATION = 'whereabouts demo gazetteer: an invented island (gazetteer/demo.geojson), for trying the tool only';

/**
 * `whereabouts serve [--host 127.0.0.1] [--port N] [--demo] [--threads N]`: the API and the page. The access token
 * comes from env WHEREABOUTS_TOKEN or WHEREABOUTS_TOKEN_FILE, never from an argument. SIGTERM and
 * SIGINT finish the requests in flight, then stop.
 */
export function registerServe(program: Command, dbPath: () => string): void {
  program
    .command('serve')
    .description('serve the georeference API and the web page (127.0.0.1 unless --host says otherwise)')
    .option('--host <address>', 'address to listen on; any but loopback needs WHEREABOUTS_TOKEN', SERVER_DEFAULTS.host)
    .option('--port <n>', 'port (0: any free port)', parsePort, DEFAULT_PORT)
    .option('--demo', 'on first run, import the demo gazetteer when the database has no sources')
    .option('--cors-origin <origin>', 'let pages from this origin call the API (no CORS by default)')
    .option('--rate-limit <n>', 'requests per client per minute, 0 for no limit', parseCount, SERVER_DEFAULTS.rateLimit.max)
    .option('--cache <n>', 'results kept in memory for repeated lookups, 0 for none', parseCount, SERVER_DEFAULTS.resultCache)
    .option('--threads <n>', 'worker threads that compute the georeferences, 0 to compute them in the main thread', parseCount, SERVER_DEFAULTS.threads)
    .option('--log', 'log each request as a JSON line')
    .action(async (opts: ServeOptions) => {
      const db = dbPath();
      if (opts.demo) await ensureDemoGazetteer(db);
      if (!existsSync(db)) throw new Error(`no database at ${db}: import a gazetteer first (whereabouts import <file>), or run with --demo`);
      const [{ readAccessToken }, { buildServer }] = await Promise.all([import('../../server/access.ts'), import('../../server/app.ts')]);
      const token = readAccessToken(process.env);
      const app = await buildServer({
        dbPath: db,
        token,
        host: opts.host,
        corsOrigin: opts.corsOrigin,
        rateLimit: opts.rateLimit === 0 ? false : { max: opts.rateLimit, timeWindowMs: 60_000 },
        resultCache: opts.cache,
        threads: opts.threads,
        logger: opts.log === true,
      });
      try {
        await app.listen({ host: opts.host, port: opts.port });
      } catch (error) {
        await app.close();
        throw listenError(error, opts.host, opts.port);
      }
      const address = app.server.address();
      const port = typeof address === 'object' && address ? address.port : opts.port;
      const shownHost = opts.host.includes(':') ? `[${opts.host}]` : opts.host;
      process.stdout.write(`whereabouts is serving ${db} at http://${shownHost}:${port}/${token ? ' (access token required)' : ''}\n`);
      const stop = async (signal: string) => {
        process.stderr.write(`whereabouts: ${signal}: finishing requests in flight, then stopping (running batch jobs resume on the next start)\n`);
        await app.close();
        process.exit(0);
      };
      process.once('SIGTERM', () => void stop('SIGTERM'));
      process.once('SIGINT', () => void stop('SIGINT'));
    });
}

interface ServeOptions {
  host: string;
  port: number;
  demo?: boolean;
  corsOrigin?: string;
  rateLimit: number;
  cache: number;
  threads: number;
  log?: boolean;
}

/** Imports gazetteer/demo.geojson when the database is new or has no sources; otherwise leaves it alone. */
async function ensureDemoGazetteer(db: string): Promise<void> {
  const [{ openGazetteer }, { importGazetteer }] = await Promise.all([import('../../store/gazetteer-store.ts'), import('../../store/import.ts')]);
  const store = openGazetteer(db);
  try {
    if (store.sources().length > 0) return;
    await importGazetteer(store, DEMO_GAZETTEER, { format: 'geojson', citation: DEMO_CITATION });
    process.stderr.write(`whereabouts: imported the demo gazetteer into ${db}\n`);
  } finally {
    store.close();
  }
}

/** The few ways listening fails, each said in one line with what to do; anything else as it came. */
function listenError(error: unknown, host: string, port: number): unknown {
  const code = (error as NodeJS.ErrnoException).code;
  if (code === 'EADDRINUSE') return new Error(`port ${port} on ${host} is already in use (another whereabouts serve, or another program): stop it, or choose a free port with --port <n> (--port 0 lets the system pick one)`);
  if (code === 'EACCES') return new Error(`not allowed to listen on port ${port} on ${host} (ports below 1024 need special rights): choose another with --port <n>`);
  if (code === 'EADDRNOTAVAIL') return new Error(`${host} is not an address of this machine: listen on 127.0.0.1 or one of its own addresses with --host`);
  return error;
}

function parsePort(value: string): number {
  const port = Number(value);
  if (!Number.isInteger(port) || port < 0 || port > 65535) throw new InvalidArgumentError('a port is a whole number from 0 to 65535');
  return port;
}

function parseCount(value: string): number {
  const count = Number(value);
  if (!Number.isInteger(count) || count < 0) throw new InvalidArgumentError('a whole number, 0 or more');
  return count;
}
