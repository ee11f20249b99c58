import { existsSync } from 'node:fs';
import type { Command } from 'commander';

/**
 * `whereabouts merge <part files…> --out <file>`: join the part files of `batch --part K/N` into the
 * output one machine would write, after checking they are the N parts of one input, made with the same
 * settings, version, gazetteer and run timestamp (and, when given, from --input and against --db).
 */
export function registerMerge(program: Command, dbPath: () => string): void {
  program
    .command('merge')
    .description('join the part files of a batch split with --part K/N into one output, in input order')
    .argument('<parts...>', 'the part files, one for each part (in any order)')
    .option('--out <file>', 'the output file, or - for standard output', '-')
    .option('--input <file>', 'check that the parts were made from this input file')
    .option('--quiet', 'no summary')
    .action(async (parts: string[], opts: { out: string; input?: string; quiet?: boolean }) => {
      const [{ inspectInput }, { mergeParts }, { gazetteerSources }] = await Promise.all([
        import('../../store/input-format.ts'),
        import('../../batch/merge.ts'),
        import('../../batch/run.ts'),
      ]);
      if (opts.input !== undefined && !existsSync(opts.input)) throw new Error(`cannot read the input ${opts.input}: no such file`);
      const summary = await mergeParts({
        parts,
        output: opts.out,
        inputSha256: opts.input === undefined ? undefined : (await inspectInput(opts.input)).sha256,
        // The gazetteer, when there is one at --db, must be the one the parts were made against.
        sources: existsSync(dbPath()) ? gazetteerSources(dbPath()) : undefined,
      });
      if (!opts.quiet) {
        process.stderr.write(`whereabouts: ${summary.parts} parts merged, ${summary.rows} rows (run timestamp ${summary.runTimestamp})\n  output: ${summary.outputPath === '-' ? 'standard output' : summary.outputPath}\n`);
      }
    });
}
