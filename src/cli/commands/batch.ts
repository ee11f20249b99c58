import type { Command } from 'commander';
import type { RouteKilometrePostRule } from '../../georef/types.ts';
import { routeKilometrePostOption } from '../method-options.ts';
import type cliProgress from 'cli-progress';
import type { ArchiveSummary } from '../../batch/archive/archive-job.ts';
import type { BatchProgressEvent } from '../../batch/run.ts';
import { parsePartSpec } from '../../batch/partition.ts';
import type { GeneralisationSettings } from '../../georef/generalisation.ts';
import { resultFormat, RESULT_FORMATS, type ResultFormat } from '../../output/result-formats.ts';

interface BatchCommandOptions {
  out?: string;
  format: ResultFormat;
  resume?: string;
  quiet?: boolean;
  threads?: number;
  coverAmbiguous?: boolean;
  administrativeFallback?: boolean;
  routeKilometrePost?: RouteKilometrePostRule;
  allowEmptyGazetteer?: boolean;
  part?: string;
  runTimestamp?: string;
  sensitiveTaxa?: string;
  sensitiveColumn?: string;
  generaliseTo?: string;
  generaliseToMeters?: string;
  generaliseWithin?: string;
}

const PHASE_LABELS: Record<BatchProgressEvent['phase'], string> = {
  reading: 'reading rows        ',
  georeferencing: 'distinct localities ',
  writing: 'writing rows        ',
};

/**
 * `whereabouts batch <in.csv|->`: georeference a whole file as a resumable job. Progress on stderr
 * (only on a terminal, and not with --quiet); exit 0 when the file was processed, whatever the rows' status.
 */
export function registerBatch(program: Command, dbPath: () => string): void {
  program
    .command('batch')
    .description('georeference every row of a CSV or tab-separated file or of a Darwin Core Archive\'s occurrence core, as a job that can be stopped and resumed')
    .argument('[input]', 'the input file (CSV or tab-separated; any of UTF-8, UTF-16, Windows-1252; or a Darwin Core Archive, a zip with meta.xml, whose output is a new archive, or with --format geojson|gpkg a GIS file of its core\'s rows), or - for standard input')
    .option('--out <file>', 'the output file, or - for standard output', '-')
    .option('--format <format>', `the output format: ${RESULT_FORMATS.join(', ')} (GeoJSON and GeoPackage are made from the CSV when the job is done; a Darwin Core Archive with csv comes back as a new archive, and as GeoJSON or GeoPackage only its core's rows, not its extensions')`, resultFormat, 'csv' as ResultFormat)
    .option('--resume <job>', 'finish a job that was stopped (its id is printed when it starts)')
    .option('--quiet', 'write nothing to standard error but errors: no progress bar, job id, method choices or summary')
    .option('--threads <n>', 'worker threads for the distinct localities (default: one a core but one, which reads and writes the rows)', (v) => positiveInteger(v))
    .option('--cover-ambiguous', 'for an ambiguous name, one circle covering every candidate')
    .option('--administrative-fallback', "for text naming no place, georeference to the record's smallest administrative unit")
    .addOption(routeKilometrePostOption())
    .option('--allow-empty-gazetteer', 'run even when the gazetteer holds no source (every row then comes back not found)')
    .option('--part <K/N>', 'only part K (from 0) of N, cut by locality, written as a part file for `whereabouts merge` (needs --out and --run-timestamp; its job database is <out>.jobs.sqlite)')
    .option('--run-timestamp <time>', 'the georeferencedDate to record, UTC to the second (2026-05-01T09:30:00Z); default the time the job starts')
    .option('--sensitive-taxa <file>', "generalise the rows of these taxa: a CSV with the column scientificName and, for each taxon, one of gridDegrees, gridMeters or distanceMeters (the holder's policy), matched to the input's scientificName after folding case and white space; the point goes to the centre of its grid cell, the precise one stays in the job database")
    .option('--sensitive-column <name>', 'generalise the rows this input column marks (any value but empty, 0, false or no), as one of --generalise-to, --generalise-to-meters or --generalise-within says')
    .option('--generalise-to <degrees>', 'for --sensitive-column: a grid in degrees (such as 0.1 or 0.01)')
    .option('--generalise-to-meters <meters>', 'for --sensitive-column: a grid in meters, the UTM grid of the point\'s zone with cells of this side (10 to 100000)')
    .option('--generalise-within <meters>', 'for --sensitive-column: a stated distance, the precise point kept within it of the point shown (10 to 70710; a UTM grid cell whose half-diagonal is this distance)')
    .action(async (input: string | undefined, opts: BatchCommandOptions) => {
      if (!input && !opts.resume) throw new Error('batch needs an input file (or - for standard input), or --resume <job>');
      if (opts.format !== 'csv' && opts.part) throw new Error('a part (--part) is always a CSV part file: merge the parts, then convert');
      const generalise = await generalisationOf(opts);
      const bar = opts.quiet || !process.stderr.isTTY ? undefined : progressBar((await import('cli-progress')).default);
      const [{ startBatch }, { batchCsvPath, writeResults }] = await Promise.all([
        import('../../batch/archive/archive-job.ts'),
        import('../../batch/gis-output.ts'),
      ]);
      const { jobId, methodChoices, done } = await startBatch({
        dbPath: dbPath(),
        input,
        output: batchCsvPath(opts.format, opts.out ?? '-'),
        // A GIS file is made from the georeferenced core table, as from a CSV input's output; no new archive.
        coreOnly: opts.format !== 'csv',
        resume: opts.resume,
        threads: opts.threads,
        coverAmbiguous: opts.coverAmbiguous,
        administrativeFallback: opts.administrativeFallback,
        routeKilometrePost: opts.routeKilometrePost,
        allowEmptyGazetteer: opts.allowEmptyGazetteer,
        part: opts.part === undefined ? undefined : parsePartSpec(opts.part),
        runTimestamp: opts.runTimestamp,
        generalise,
        onProgress: bar?.update,
      });
      if (!opts.quiet) process.stderr.write(`whereabouts: batch job ${jobId} (if stopped, finish it with: whereabouts batch --resume ${jobId})\n${describeChoices(methodChoices)}`);
      try {
        const summary = await done;
        bar?.stop();
        const output = opts.out ?? '-';
        await writeResults({ format: opts.format, csvPath: summary.outputPath, delimiter: summary.delimiter, output, runTimestamp: summary.runTimestamp });
        summary.outputPath = opts.format === 'csv' ? summary.outputPath : output;
        if (!opts.quiet) process.stderr.write(describe(summary, opts.format));
      } catch (error) {
        bar?.stop();
        throw error;
      }
    });
}

/** The generalisation asked for, if any, read and checked before a job starts. */
async function generalisationOf(opts: BatchCommandOptions): Promise<GeneralisationSettings | undefined> {
  const ways = { gridDegrees: opts.generaliseTo, gridMeters: opts.generaliseToMeters, distanceMeters: opts.generaliseWithin };
  const wayGiven = Object.values(ways).some((v) => v !== undefined);
  if (opts.sensitiveColumn === undefined && wayGiven) throw new Error('--generalise-to, --generalise-to-meters and --generalise-within say how to generalise the rows of --sensitive-column: name the column that marks the rows');
  if (opts.sensitiveColumn !== undefined && !wayGiven) throw new Error('--sensitive-column needs --generalise-to <degrees>, --generalise-to-meters <meters> or --generalise-within <meters>, how to generalise the marked rows (such as --generalise-to 0.1)');
  if (opts.sensitiveTaxa === undefined && opts.sensitiveColumn === undefined) return undefined;
  if (opts.resume) throw new Error('a resumed job keeps the generalisation it was started with: leave out --sensitive-taxa, --sensitive-column and the --generalise options');
  const [{ readFile }, { readSensitiveTaxa }, { readGeneralisation }] = await Promise.all([
    import('node:fs/promises'),
    import('../../batch/sensitive-records.ts'),
    import('../../georef/generalisation.ts'),
  ]);
  const taxa = opts.sensitiveTaxa === undefined ? undefined : readSensitiveTaxa(await readFile(opts.sensitiveTaxa, 'utf8'), `the sensitive taxa list ${opts.sensitiveTaxa}`);
  const forColumn = () => {
    try {
      return readGeneralisation(ways);
    } catch (error) {
      throw new Error(`--sensitive-column: ${(error as Error).message.replaceAll('gridDegrees', '--generalise-to').replaceAll('gridMeters', '--generalise-to-meters').replaceAll('distanceMeters', '--generalise-within')}`);
    }
  };
  return { ...(taxa ? { taxa } : {}), ...(opts.sensitiveColumn !== undefined ? { column: opts.sensitiveColumn, ...forColumn() } : {}) };
}

function positiveInteger(value: string): number {
  const n = Number(value);
  if (!Number.isInteger(n) || n < 1) throw new Error(`--threads must be a whole number of at least 1, not "${value}"`);
  return n;
}

/** One bar a phase (georeferencing and writing run side by side), each with its rate and time left. */
function progressBar(progress: typeof cliProgress) {
  const bars = new progress.MultiBar(
    { format: '{phase} {bar} {value}/{total} | {rate}/s | {eta_formatted} left', stream: process.stderr, hideCursor: true, etaBuffer: 50 },
    progress.Presets.shades_classic,
  );
  const started = new Map<BatchProgressEvent['phase'], { bar: cliProgress.SingleBar; at: number; from: number }>();
  return {
    update(event: BatchProgressEvent) {
      let phase = started.get(event.phase);
      if (!phase) {
        phase = { bar: bars.create(event.total ?? event.done, event.done, { phase: PHASE_LABELS[event.phase], rate: 0 }), at: Date.now(), from: event.done };
        started.set(event.phase, phase);
      }
      const seconds = (Date.now() - phase.at) / 1000;
      if (event.total === undefined) phase.bar.setTotal(event.done);
      phase.bar.update(event.done, { phase: PHASE_LABELS[event.phase], rate: seconds > 0 ? Math.round((event.done - phase.from) / seconds) : 0 });
    },
    stop() {
      bars.stop();
    },
  };
}

/** The method choices the job records (`whereabouts method` says what each is), so a reviewer can reproduce them. */
function describeChoices(choices: Record<string, number | string> | null): string {
  if (!choices) return '  method choices: not recorded (a job stored before jobs recorded them)\n';
  return `  method choices: ${Object.entries(choices).map(([id, value]) => `${id}=${value}`).join('; ')}\n`;
}

function describe(s: ArchiveSummary, format: ResultFormat): string {
  const statuses = Object.entries(s.byStatus).map(([status, n]) => `${n} ${status}`).join(', ');
  const lines = [
    `whereabouts: ${s.rows} rows, ${s.distinctLocalities} distinct localities (${s.archiveCore ? `the archive's core ${s.archiveCore.path}, ${s.archiveCore.encoding}` : `${s.encoding}, delimiter ${JSON.stringify(s.delimiter)}`})${s.resumed ? ', job resumed' : ''}`,
    `  ${statuses || 'no rows'}`,
    `  ${s.malformedRows} malformed rows, ${s.flaggedRows} rows with their coordinates flagged (column whereabouts_coordinateFlags)`,
    ...(!s.archiveCore ? []
      : format === 'csv' ? ['  Darwin Core Archive: every other file copied unchanged; meta.xml describes the new columns; the EML metadata has a method step']
      : [`  ${format === 'gpkg' ? 'GeoPackage' : 'GeoJSON'} of the archive's core rows only: its extensions' rows and other files are not in it`]),
    `  output: ${s.outputPath === '-' ? 'standard output' : s.outputPath}`,
  ];
  return `${lines.join('\n')}\n`;
}
