import { mkdirSync, writeFileSync } from 'node:fs';
import type { Command } from 'commander';
import type { RouteKilometrePostRule } from '../../georef/types.ts';
import { routeKilometrePostOption } from '../method-options.ts';

interface ClusterScriptOptions {
  parts: string;
  workDir: string;
  out: string;
  runTimestamp?: string;
  cpus?: string;
  sbatch: string[];
  script?: string;
  gazetteerCopy?: string;
  coverAmbiguous?: boolean;
  administrativeFallback?: boolean;
  routeKilometrePost?: RouteKilometrePostRule;
}

/**
 * `whereabouts cluster-script <input> --parts N --work-dir <dir> --out <file>`: write the Slurm array-job
 * script that runs the N parts of a batch, one task a part, and names the merge command in its comments.
 */
export function registerClusterScript(program: Command, dbPath: () => string): void {
  program
    .command('cluster-script')
    .description('write a Slurm array-job script (sbatch --array) that georeferences an input in N parts, one task a part')
    .argument('<input>', 'the input file (CSV or tab-separated), on a file system every node sees')
    .requiredOption('--parts <n>', 'how many parts (array tasks)')
    .requiredOption('--work-dir <dir>', 'folder for the part files, their job databases and logs, seen by every node')
    .requiredOption('--out <file>', 'the merged output, named in the merge command the script gives')
    .option('--run-timestamp <time>', 'the georeferencedDate every part records, UTC to the second (default: now)')
    .option('--cpus <n>', 'CPUs a task asks for (default 2: one reads and writes rows, the others georeference)')
    .option('--sbatch <option>', 'one more #SBATCH line, such as --time=02:00:00 (repeatable)', (v: string, all: string[]) => [...all, v], [])
    .option('--script <file>', 'write the script to this file instead of standard output')
    .option('--gazetteer-copy <file>', "first write a read-only copy of the gazetteer (rollback journal, not WAL) there, for the tasks to read over a network file system")
    .option('--cover-ambiguous', 'as batch --cover-ambiguous')
    .option('--administrative-fallback', 'as batch --administrative-fallback')
    .addOption(routeKilometrePostOption())
    .action(async (input: string, opts: ClusterScriptOptions) => {
      const [{ arrayJobScript }, { writeSharedGazetteerCopy }] = await Promise.all([import('../../batch/array-script.ts'), import('../../store/shared-copy.ts')]);
      if (opts.gazetteerCopy) await writeSharedGazetteerCopy(dbPath(), opts.gazetteerCopy);
      mkdirSync(opts.workDir, { recursive: true }); // Slurm writes the tasks' logs there, and does not make folders
      const script = arrayJobScript({
        dbPath: opts.gazetteerCopy ?? dbPath(),
        input,
        parts: wholeNumber(opts.parts, '--parts'),
        workDir: opts.workDir,
        output: opts.out,
        runTimestamp: opts.runTimestamp ?? new Date().toISOString().replace(/\.\d+Z$/, 'Z'),
        settings: { coverAmbiguous: Boolean(opts.coverAmbiguous), administrativeFallback: Boolean(opts.administrativeFallback), ...(opts.routeKilometrePost ? { routeKilometrePost: opts.routeKilometrePost } : {}) },
        cpusPerTask: opts.cpus === undefined ? undefined : wholeNumber(opts.cpus, '--cpus'),
        sbatchOptions: opts.sbatch,
      });
      if (opts.script) writeFileSync(opts.script, script, { mode: 0o755 });
      else process.stdout.write(script);
    });
}

function wholeNumber(value: string, option: string): number {
  const n = Number(value);
  if (!Number.isInteger(n) || n < 1) throw new Error(`${option} must be a whole number of at least 1, not "${value}"`);
  return n;
}
