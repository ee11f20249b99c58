/**
 * Shared by bench/server.ts and bench/load.ts: the demo gazetteer in a temporary file, the real
 * `whereabouts serve` in a child process on 127.0.0.1 (so clients and server do not share an event
 * loop), keep-alive clients that post demo localities, and the latency figures.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { Agent, request } from 'node:http';
import { cpus, loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { parse } from 'csv-parse/sync';
import { importGazetteer } from '../src/store/import.ts';
import { openGazetteer } from '../src/store/gazetteer-store.ts';
import { largest } from '../src/geodesy/extremes.ts';

const ROOT = new URL('..', import.meta.url).pathname;

export interface Service {
  url: string;
  stop(): Promise<void>;
}

/** Imports the demo gazetteer into a temporary file and starts `whereabouts serve --rate-limit 0` on it. */
export async function startService(extraArgs: string[] = []): Promise<Service> {
  const dir = mkdtempSync(join(tmpdir(), 'whereabouts-bench-'));
  const dbPath = join(dir, 'demo.sqlite');
  const store = openGazetteer(dbPath);
  await importGazetteer(store, join(ROOT, 'gazetteer/demo.geojson'), { format: 'geojson', citation: 'whereabouts demo gazetteer' });
  store.close();
  const child: ChildProcess = spawn(process.execPath, [join(ROOT, 'bin/whereabouts.js'), 'serve', '--host', '127.0.0.1', '--port', '0', '--rate-limit', '0', '--db', dbPath, ...extraArgs], {
    stdio: ['ignore', 'pipe', 'inherit'],
    env: { ...process.env, WHEREABOUTS_TOKEN: '', WHEREABOUTS_TOKEN_FILE: '' },
  });
  const url = await new Promise<string>((resolve, reject) => {
    let out = '';
    child.stdout!.on('data', (chunk) => {
      out += chunk;
      const match = /http:\/\/127\.0\.0\.1:\d+/.exec(out);
      if (match) resolve(match[0]);
    });
    child.on('exit', (code) => reject(new Error(`whereabouts serve exited with ${code}`)));
  });
  return {
    url,
    stop: async () => {
      const exited = new Promise((r) => child.once('exit', r));
      child.kill('SIGTERM');
      await exited;
      rmSync(dir, { recursive: true, force: true });
    },
  };
}

/** The demo batch's records as request bodies: a realistic mix of locality types. */
export function demoBodies(): string[] {
  const rows = parse(readFileSync(join(ROOT, 'gazetteer/demo-localities.csv')), { columns: true }) as Record<string, string>[];
  return rows.map((r) => {
    const body: Record<string, string> = { locality: r.locality };
    for (const field of ['countryCode', 'country', 'stateProvince', 'county', 'verbatimCoordinates', 'geodeticDatum']) if (r[field]) body[field] = r[field];
    return JSON.stringify(body);
  });
}

export interface RunResult {
  latenciesMs: number[];
  errors: number;
  errorSamples: string[];
  seconds: number;
}

/**
 * `clients` concurrent keep-alive clients posting to /api/v1/georeference until `maxRequests` have
 * been sent or `maxSeconds` have passed, whichever comes first.
 */
export async function run(url: string, clients: number, maxRequests: number, maxSeconds: number): Promise<RunResult> {
  const bodies = demoBodies();
  const agent = new Agent({ keepAlive: true, maxSockets: clients });
  const { hostname, port } = new URL(url);
  const latenciesMs: number[] = [];
  const errorSamples: string[] = [];
  let errors = 0;
  let sent = 0;
  const started = performance.now();
  const deadline = started + maxSeconds * 1000;

  const one = (body: string) =>
    new Promise<void>((resolve) => {
      const t0 = performance.now();
      const req = request({ hostname, port, path: '/api/v1/georeference', method: 'POST', agent, headers: { 'content-type': 'application/json', 'content-length': Buffer.byteLength(body) } }, (res) => {
        res.resume();
        res.on('end', () => {
          latenciesMs.push(performance.now() - t0);
          if (res.statusCode !== 200) {
            errors++;
            if (errorSamples.length < 5) errorSamples.push(`HTTP ${res.statusCode}`);
          }
          resolve();
        });
      });
      req.on('error', (error) => {
        errors++;
        if (errorSamples.length < 5) errorSamples.push(error.message);
        resolve();
      });
      req.end(body);
    });

  const client = async () => {
    while (sent < maxRequests && performance.now() < deadline) {
      const body = bodies[sent++ % bodies.length];
      await one(body);
    }
  };
  await Promise.all(Array.from({ length: clients }, client));
  agent.destroy();
  return { latenciesMs, errors, errorSamples, seconds: (performance.now() - started) / 1000 };
}

/** The q-quantile (0..1) by the nearest-rank method. */
export function quantile(values: number[], q: number): number {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.min(sorted.length - 1, Math.max(0, Math.ceil(q * sorted.length) - 1))] ?? NaN;
}

/** One line of figures. */
export function describe(result: RunResult): string {
  const l = result.latenciesMs;
  return [
    `requests ${l.length} in ${result.seconds.toFixed(1)} s (${(l.length / result.seconds).toFixed(0)} per second)`,
    `latency p50 ${quantile(l, 0.5).toFixed(2)} ms, p99 ${quantile(l, 0.99).toFixed(2)} ms, max ${largest(l).toFixed(2)} ms`,
    `errors ${result.errors}${result.errorSamples.length ? ` (${result.errorSamples.join('; ')})` : ''}`,
    // Other work on a shared machine moves these figures: the load says how much there was.
    `machine load average at the end ${loadavg().map((l) => l.toFixed(2)).join(' ')} (${cpus().length} cores)`,
  ].join('\n');
}
