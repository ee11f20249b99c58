/**
 * A batch split over a real Slurm cluster of one node (Debian's slurmctld, slurmd and munge, configured
 * here in a temporary folder and run as child processes, no systemd) must give the same bytes as one
 * machine: a 4-task array over 100,000 generated rows, one task killed with SIGKILL part way and
 * requeued, then `whereabouts merge`. The reference is the one-machine run of the same CLI with the same
 * run timestamp (common practice, no source: compare bytes). Skipped, saying why, only where the Slurm
 * and munge programs are not installed (.ci/run installs them: Debian packages slurm-wlm and munge).
 * Slurm settings used: slurm.conf(5) of Slurm 22.05 (ProctrackType, TaskPlugin, AuthInfo socket and
 * cred_expire, SlurmdSpoolDir, StateSaveLocation); munged(8) of munge 0.5 (--socket, --key-file, -F).
 */
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { createServer } from 'node:net';
import { cpus, hostname, tmpdir, userInfo } from 'node:os';
import { join } from 'node:path';
import { setTimeout as sleep } from 'node:timers/promises';
import Database from 'better-sqlite3';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { importGazetteer } from '../../src/store/import.ts';
import { openGazetteer } from '../../src/store/gazetteer-store.ts';
import { DEMO_GAZETTEER, writeGeneratedInput } from './generated-input.ts';

const BIN = new URL('../../bin/whereabouts.js', import.meta.url).pathname;
const PROGRAMS = ['slurmctld', 'slurmd', 'munged', 'sbatch', 'scontrol', 'squeue'];
const SEARCH = ['/usr/sbin', '/usr/bin', '/usr/local/sbin', '/usr/local/bin'];
const missing = PROGRAMS.filter((p) => !SEARCH.some((dir) => existsSync(join(dir, p))));
const RUN_TIMESTAMP = '2026-05-01T09:30:00Z';
const PARTS = 4;
const ROWS = 100_000;
const DISTINCT = 3_000;

if (missing.length > 0) {
  console.warn(`slurm.test.ts skipped: ${missing.join(', ')} not installed (apt-get install slurm-wlm munge; .ci/run does this)`);
}

/** A port nothing listens on now. */
async function freePort(): Promise<number> {
  const server = createServer();
  await new Promise<void>((done) => server.listen(0, '127.0.0.1', done));
  const { port } = server.address() as { port: number };
  await new Promise((done) => server.close(done));
  return port;
}

function run(command: string, args: string[], env: NodeJS.ProcessEnv): string {
  const result = spawnSync(command, args, { env, encoding: 'utf8' });
  if (result.status !== 0) throw new Error(`${command} ${args.join(' ')} failed (${result.status}): ${result.stderr}${result.stdout}`);
  return result.stdout;
}

/** Polls `check` until it gives a value; on time-out the error ends with what `explain` says (the cluster's state). */
async function waitFor<T>(what: string, seconds: number, check: () => T | undefined, explain: () => string = () => ''): Promise<T> {
  const until = Date.now() + seconds * 1000;
  for (;;) {
    const value = check();
    if (value !== undefined) return value;
    if (Date.now() > until) throw new Error(`timed out after ${seconds} s waiting for ${what}${explain()}`);
    await sleep(250);
  }
}

/** A part's job as committed (read-only, as another process would see it). */
function partJob(jobsPath: string): { state: string; rows_done: number; runner_pid: number | null } | undefined {
  if (!existsSync(jobsPath)) return undefined;
  const db = new Database(jobsPath, { readonly: true, fileMustExist: true });
  try {
    return db.prepare('SELECT state, rows_done, runner_pid FROM batch_job ORDER BY started_at DESC LIMIT 1').get() as ReturnType<typeof partJob>;
  } catch {
    return undefined; // the schema is still being written
  } finally {
    db.close();
  }
}

describe.skipIf(missing.length > 0)('a batch over a single-node Slurm cluster', () => {
  const dir = mkdtempSync(join(tmpdir(), 'whereabouts-slurm-'));
  const daemons: ChildProcess[] = [];
  let env: NodeJS.ProcessEnv = {};
  let arrayJob: string | undefined;

  const running = () => daemons.filter((d) => d.exitCode === null && d.signalCode === null);
  const killEverything = () => {
    for (const daemon of running()) daemon.kill('SIGKILL');
  };
  process.once('exit', killEverything); // even when the test run itself is stopped
  /** Cancel the array, then stop slurmd, slurmctld and munged (asked first, then killed). */
  const stopEverything = async () => {
    if (arrayJob) spawnSync('scancel', [arrayJob], { env });
    for (const daemon of [...daemons].reverse()) {
      if (daemon.exitCode !== null || daemon.signalCode !== null) continue;
      const exited = new Promise((done) => daemon.once('exit', done));
      daemon.kill('SIGTERM');
      await Promise.race([exited, sleep(5000)]);
    }
    killEverything();
  };

  beforeAll(async () => {
    const node = hostname().split('.')[0];
    const user = userInfo().username;
    for (const sub of ['spool', 'state', 'shared']) mkdirSync(join(dir, sub));
    const key = join(dir, 'munge.key');
    writeFileSync(key, randomBytes(1024), { mode: 0o600 });
    const socket = join(dir, 'munge.socket');
    const munged = spawn('munged', ['-F', '--force', `--socket=${socket}`, `--key-file=${key}`, `--pid-file=${join(dir, 'munged.pid')}`,
      `--log-file=${join(dir, 'munged.log')}`, `--seed-file=${join(dir, 'munge.seed')}`], { stdio: 'ignore' });
    daemons.push(munged);
    await waitFor('the munge socket', 20, () => (existsSync(socket) ? true : undefined));
    const conf = join(dir, 'slurm.conf');
    writeFileSync(conf, [
      'ClusterName=whereaboutstest',
      `SlurmctldHost=${node}(127.0.0.1)`,
      `SlurmUser=${user}`,
      `SlurmdUser=${user}`,
      `SlurmctldPort=${await freePort()}`,
      `SlurmdPort=${await freePort()}`,
      'AuthType=auth/munge',
      'CredType=cred/munge',
      // A requeued job may start again only when its old credential has expired: 5 s rather than 120.
      `AuthInfo=socket=${socket},cred_expire=5`,
      `StateSaveLocation=${join(dir, 'state')}`,
      `SlurmdSpoolDir=${join(dir, 'spool')}`,
      `SlurmctldPidFile=${join(dir, 'slurmctld.pid')}`,
      `SlurmdPidFile=${join(dir, 'slurmd.pid')}`,
      `SlurmctldLogFile=${join(dir, 'slurmctld.log')}`,
      `SlurmdLogFile=${join(dir, 'slurmd.log')}`,
      'ProctrackType=proctrack/linuxproc',
      'TaskPlugin=task/none',
      'JobAcctGatherType=jobacct_gather/none',
      'AccountingStorageType=accounting_storage/none',
      'JobCompType=jobcomp/none',
      'SchedulerType=sched/builtin',
      'SelectType=select/cons_tres',
      'SelectTypeParameters=CR_CPU',
      'MpiDefault=none',
      'ReturnToService=2',
      'JobRequeue=1',
      `NodeName=${node} NodeAddr=127.0.0.1 CPUs=${Math.min(cpus().length, PARTS)} State=UNKNOWN`,
      `PartitionName=test Nodes=${node} Default=YES MaxTime=INFINITE State=UP`,
      '',
    ].join('\n'));
    env = { ...process.env, SLURM_CONF: conf };
    daemons.push(spawn('slurmctld', ['-D', '-c', '-f', conf], { env, stdio: 'ignore' }));
    daemons.push(spawn('slurmd', ['-D', '-f', conf], { env, stdio: 'ignore' }));
    await waitFor('the node to be idle', 60, () => (/idle/.test(spawnSync('sinfo', ['-h', '-o', '%t'], { env, encoding: 'utf8' }).stdout) ? true : undefined));

    const store = openGazetteer(join(dir, 'gazetteer.sqlite'));
    try {
      await importGazetteer(store, DEMO_GAZETTEER, { format: 'geojson', citation: 'whereabouts demo gazetteer (invented island)' });
    } finally {
      store.close();
    }
    writeGeneratedInput(join(dir, 'input.csv'), ROWS, DISTINCT);
  }, 180_000);

  afterAll(async () => {
    await stopEverything();
    process.removeListener('exit', killEverything);
    rmSync(dir, { recursive: true, force: true });
  });

  it('gives the bytes of a one-machine run, even with a task killed with SIGKILL part way and requeued', async () => {
    const whereabouts = (...args: string[]) => run(process.execPath, [BIN, '--db', join(dir, 'gazetteer.sqlite'), ...args], env);
    whereabouts('batch', join(dir, 'input.csv'), '--out', join(dir, 'one-machine.csv'), '--run-timestamp', RUN_TIMESTAMP, '--quiet');

    const script = join(dir, 'parts.sbatch');
    const shared = join(dir, 'shared', 'gazetteer.sqlite');
    whereabouts('cluster-script', join(dir, 'input.csv'), '--parts', String(PARTS), '--work-dir', join(dir, 'parts'), '--out', join(dir, 'merged.csv'),
      '--run-timestamp', RUN_TIMESTAMP, '--cpus', '1', '--script', script, '--gazetteer-copy', shared);
    // Each committed step of a task pauses a little, so that the kill lands part way.
    arrayJob = run('sbatch', ['--parsable', script], { ...env, WHEREABOUTS_TEST_DELAY_MS: '40' }).trim().split(';')[0];

    const jobsOfPart0 = join(dir, 'parts', 'part-0.wpart.jobs.sqlite');
    const victim = await waitFor('part 0 to write rows', 120, () => {
      const job = partJob(jobsOfPart0);
      return job && job.state !== 'done' && job.rows_done > 0 && job.runner_pid ? job.runner_pid : undefined;
    });
    process.kill(victim, 'SIGKILL');
    const task0 = /JobId=(\d+)/.exec(run('scontrol', ['show', 'job', `${arrayJob}_0`], env))![1];
    await waitFor('task 0 to end', 60, () => (/JobState=(RUNNING|COMPLETING)/.test(run('scontrol', ['show', 'job', task0], env)) ? undefined : true));
    expect(partJob(jobsOfPart0)?.state).not.toBe('done');
    run('scontrol', ['requeue', task0], env);
    // slurmd refuses a credential issued in the same second as the one it revoked when the task was killed
    // ("Job credential revoked": the task then fails without running); Slurm's own begin time after a
    // requeue avoids that, and bringing the start forward must wait out that second too.
    await sleep(2000);
    spawnSync('scontrol', ['update', `JobId=${task0}`, 'StartTime=now'], { env });

    // A requeued task passes through states squeue does not list, and right after the requeue Slurm may still
    // show the killed run's end state: the task is done when its part is written, or when it has been seen
    // running again and has ended (then the check below prints its log).
    const ended = /JobState=(COMPLETED|FAILED|CANCELLED|TIMEOUT|NODE_FAIL|OUT_OF_MEMORY)/;
    let ranAgain = false;
    await waitFor('task 0 to run again and finish', 240, () => {
      const shown = run('scontrol', ['show', 'job', task0], env);
      // The start-time update above fails when it reaches Slurm before the requeue has made the task
      // pending again; a requeued task then waits out a begin time of its own: ask again while it does.
      if (/JobState=PENDING/.test(shown) && /Reason=BeginTime/.test(shown)) spawnSync('scontrol', ['update', `JobId=${task0}`, 'StartTime=now'], { env });
      if (/JobState=(RUNNING|COMPLETING)/.test(shown)) ranAgain = true;
      if (existsSync(join(dir, 'parts', 'part-0.wpart'))) return true;
      return ranAgain && ended.test(shown) ? true : undefined;
    }, () => `\n${spawnSync('scontrol', ['show', 'job', task0], { env, encoding: 'utf8' }).stdout}\nslurmctld log, last lines:\n${readFileSync(join(dir, 'slurmctld.log'), 'utf8').split('\n').slice(-40).join('\n')}`);
    await waitFor('every task to finish', 240, () => (run('squeue', ['-h', '-j', arrayJob!], env).trim() === '' ? true : undefined));
    const log = (k: number) => (existsSync(join(dir, 'parts', `part-${k}.log`)) ? readFileSync(join(dir, 'parts', `part-${k}.log`), 'utf8') : 'no log');
    for (let k = 0; k < PARTS; k++) expect(existsSync(join(dir, 'parts', `part-${k}.wpart`)), `part ${k} written; its task's log:\n${log(k)}`).toBe(true);

    const parts = Array.from({ length: PARTS }, (_, k) => join(dir, 'parts', `part-${k}.wpart`));
    whereabouts('merge', '--out', join(dir, 'merged.csv'), '--input', join(dir, 'input.csv'), ...parts.reverse());
    const merged = readFileSync(join(dir, 'merged.csv'));
    const oneMachine = readFileSync(join(dir, 'one-machine.csv'));
    expect(merged.length).toBe(oneMachine.length);
    expect(merged.equals(oneMachine)).toBe(true);
    // The tasks only read the shared gazetteer: no journal or WAL files beside it (sqlite.org/wal.html §8).
    expect(readdirSync(join(dir, 'shared'))).toEqual(['gazetteer.sqlite']);
  }, 420_000);
});
