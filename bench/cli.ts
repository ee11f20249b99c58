/**
 * Start-up of the real CLI as a script that calls it once a record meets it: `whereabouts --help` and
 * one `locate` against the demo gazetteer, each spawned N times (default 20, `--runs N`) after a warm-up,
 * wall time from spawn to exit. Builds dist/ first (`npm run build`), as `npm ci` does. Also times the
 * uncompiled path (WHEREABOUTS_FROM_SOURCE=1, tsx compiling the sources) for comparison.
 * Targets: --help ≤ 0.3 s, one locate ≤ 0.5 s (median, this 2-core machine). Each row also gives the
 * children's CPU time (user + system, from /proc/self/stat, 10 ms ticks), which a busy machine inflates
 * far less than wall time.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { cpus, loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { performance } from 'node:perf_hooks';

const ROOT = new URL('..', import.meta.url).pathname;
const BIN = join(ROOT, 'bin/whereabouts.js');
const runsArg = process.argv.indexOf('--runs');
const RUNS = runsArg > 0 ? Number(process.argv[runsArg + 1]) : 20;

execFileSync('npm', ['run', '--silent', 'build'], { cwd: ROOT, stdio: 'inherit' });
const dir = mkdtempSync(join(tmpdir(), 'whereabouts-bench-cli-'));
const db = join(dir, 'demo.sqlite');
execFileSync(process.execPath, [BIN, '--db', db, 'import', join(ROOT, 'gazetteer/demo.geojson'), '--source', 'demo'], { stdio: 'ignore' });

/** CPU seconds (user + system) of the finished children of this process, or undefined off Linux. */
function childrenCpuSeconds(): number | undefined {
  if (!existsSync('/proc/self/stat')) return undefined;
  // Fields after the command name in parentheses; cutime and cstime are fields 16 and 17 (proc(5)), in ticks of 1/100 s.
  const stat = readFileSync('/proc/self/stat', 'utf8');
  const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
  return (Number(fields[13]) + Number(fields[14])) / 100;
}

interface Timing {
  wall: number[];
  cpu: number[];
}

/** Wall and CPU seconds of each of `runs` spawns after one warm-up, sorted; throws if the command fails. */
function time(args: string[], env: NodeJS.ProcessEnv = process.env, runs = RUNS): Timing {
  const timing: Timing = { wall: [], cpu: [] };
  for (let i = 0; i <= runs; i++) {
    const cpuBefore = childrenCpuSeconds();
    const started = performance.now();
    const result = spawnSync(process.execPath, [BIN, ...args], { env, encoding: 'utf8' });
    const elapsed = (performance.now() - started) / 1000;
    const cpuAfter = childrenCpuSeconds();
    if (result.status !== 0) throw new Error(`whereabouts ${args.join(' ')} failed: ${result.stderr}`);
    if (i === 0) continue;
    timing.wall.push(elapsed);
    if (cpuBefore !== undefined && cpuAfter !== undefined) timing.cpu.push(cpuAfter - cpuBefore);
  }
  timing.wall.sort((a, b) => a - b);
  timing.cpu.sort((a, b) => a - b);
  return timing;
}

const median = (values: number[]) => values[Math.floor(values.length / 2)]!;

function row(label: string, { wall, cpu }: Timing, target?: number): string {
  const figures = `wall min ${wall[0]!.toFixed(3)} s, median ${median(wall).toFixed(3)} s, max ${wall.at(-1)!.toFixed(3)} s (${wall.length} runs)`;
  const cpuFigure = cpu.length ? `; CPU median ${median(cpu).toFixed(2)} s` : '';
  return `${label.padEnd(44)} ${figures}${cpuFigure}${target ? `; target ≤ ${target} s: ${median(wall) <= target ? 'met' : 'NOT met'}` : ''}`;
}

const LOCATE = ['--db', db, 'locate', '10 km NE of Vila Serena', '--country-code', 'QV'];
console.log(`machine: ${cpus().length} cores, node ${process.version}, load average ${loadavg().map((l) => l.toFixed(2)).join(' ')}`);
console.log(row('whereabouts --help', time(['--help']), 0.3));
console.log(row('whereabouts locate (demo)', time(LOCATE), 0.5));
console.log(row('whereabouts locate --json (demo)', time([...LOCATE, '--json']), 0.5));
const fromSource = { ...process.env, WHEREABOUTS_FROM_SOURCE: '1' };
console.log(row('uncompiled (tsx): whereabouts --help', time(['--help'], fromSource, 5)));
console.log(row('uncompiled (tsx): whereabouts locate (demo)', time(LOCATE, fromSource, 5)));
console.log(`load average at the end: ${loadavg().map((l) => l.toFixed(2)).join(' ')}`);
rmSync(dir, { recursive: true, force: true });
