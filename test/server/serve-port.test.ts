/**
 * `whereabouts serve` on a port another program holds: one clear line naming the port and what to do,
 * no stack trace, and a non-zero exit, through the real CLI.
 */
import { spawnSync } from 'node:child_process';
import { createServer, type Server } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { BIN, demoDatabase, type TempDatabase } from './helpers.ts';

let db: TempDatabase;
let holder: Server;
let port: number;

beforeAll(async () => {
  db = await demoDatabase();
  holder = createServer();
  await new Promise<void>((resolve) => holder.listen(0, '127.0.0.1', resolve));
  port = (holder.address() as { port: number }).port;
});
afterAll(async () => {
  await new Promise((resolve) => holder?.close(resolve));
  db?.remove();
});

describe('serve on a busy port', () => {
  it('says which port is taken and what to do, in one line, and exits 1', () => {
    const run = spawnSync(process.execPath, [BIN, '--db', db.dbPath, 'serve', '--port', String(port)], { encoding: 'utf8', timeout: 60_000 });
    expect(run.status).toBe(1);
    expect(run.stdout).toBe('');
    expect(run.stderr.trim().split('\n')).toEqual([
      `whereabouts: port ${port} on 127.0.0.1 is already in use (another whereabouts serve, or another program): stop it, or choose a free port with --port <n> (--port 0 lets the system pick one)`,
    ]);
  });
});
