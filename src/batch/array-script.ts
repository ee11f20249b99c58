/**
 * The Slurm array-job script for a batch split into parts: task K of an `sbatch --array=0-(N-1)` job runs
 * `whereabouts batch … --part K/N`, and a task run again (requeued, or after a node failure) resumes its
 * part where it stopped. Every task reads the same gazetteer file, opened read-only.
 */
import { resolve } from 'node:path';
import type { BatchSettings } from './georeference-group.ts';
import { checkRunTimestamp } from './partition.ts';

export interface ArrayScriptOptions {
  /** The gazetteer every task reads. */
  dbPath: string;
  input: string;
  parts: number;
  /** Folder of the part files, their job databases and the tasks' logs (on a file system every node sees). */
  workDir: string;
  /** The merged output, for the merge command the script names. */
  output: string;
  runTimestamp: string;
  settings: BatchSettings;
  /** CPUs a task asks for (default 2: one reads and writes the rows, one georeferences). */
  cpusPerTask?: number;
  /** More `#SBATCH` lines, such as `--time=02:00:00` or `--partition=short`. */
  sbatchOptions?: string[];
  /** How to start whereabouts on the nodes (default: this Node.js and this whereabouts, by absolute path). */
  command?: string[];
}

/**
 * The script's text.
 * @example arrayJobScript({ dbPath: 'g.sqlite', input: 'in.csv', parts: 4, workDir: 'parts', output: 'out.csv', runTimestamp: '2026-05-01T09:30:00Z', settings })
 *   // '#!/bin/bash\n…#SBATCH --array=0-3\n…'
 */
export function arrayJobScript(options: ArrayScriptOptions): string {
  checkRunTimestamp(options.runTimestamp);
  const work = resolve(options.workDir);
  const command = options.command ?? [process.execPath, new URL('../../bin/whereabouts.js', import.meta.url).pathname];
  const settingFlags = [
    ...(options.settings.coverAmbiguous ? ['--cover-ambiguous'] : []),
    ...(options.settings.administrativeFallback ? ['--administrative-fallback'] : []),
    ...(options.settings.routeKilometrePost ? ['--route-kilometre-post', options.settings.routeKilometrePost] : []),
  ];
  const db = ['--db', resolve(options.dbPath)];
  const cpus = options.cpusPerTask ?? 2;
  const partFile = `${work}/part-$SLURM_ARRAY_TASK_ID.wpart`;
  const merge = [...command, ...db, 'merge', '--out', resolve(options.output), '--input', resolve(options.input)].map(quote).join(' ');
  return [
    '#!/bin/bash',
    `# whereabouts: ${options.parts} parts of ${resolve(options.input)}, one Slurm array task a part.`,
    '# Submit with: sbatch <this file>. A task that stops part way (killed, requeued, node lost) resumes',
    '# its part where it stopped when it runs again. Every task reads the gazetteer read-only.',
    '# When every task has finished, join the parts (in input order, checked to belong together):',
    `#   ${merge} ${quote(work)}/part-*.wpart`,
    '#SBATCH --job-name=whereabouts',
    `#SBATCH --array=0-${options.parts - 1}`,
    `#SBATCH --cpus-per-task=${cpus}`,
    '#SBATCH --requeue',
    `#SBATCH --output=${work}/part-%a.log`,
    ...(options.sbatchOptions ?? []).map((o) => `#SBATCH ${o}`),
    'set -euo pipefail',
    `exec ${[...command, ...db, 'batch', resolve(options.input)].map(quote).join(' ')} \\`,
    `  --part "$SLURM_ARRAY_TASK_ID/${options.parts}" --out "${partFile}" \\`,
    `  --run-timestamp ${options.runTimestamp} --threads ${Math.max(1, cpus - 1)} --quiet${settingFlags.map((f) => ` ${f}`).join('')}`,
    '',
  ].join('\n');
}

/** A word for the shell: single-quoted unless it is plainly safe. */
function quote(word: string): string {
  return /^[\w@%+=:,./-]+$/.test(word) ? word : `'${word.replace(/'/g, `'\\''`)}'`;
}
