import { existsSync } from 'node:fs';
import { InvalidArgumentError, type Command } from 'commander';
import type { RouteKilometrePostRule } from '../../georef/types.ts';
import { routeKilometrePostOption } from '../method-options.ts';
import { readDatumOption } from '../../geodesy/datum-option.ts';
import type { LocateResult } from '../../locate/locate.ts';
import { ANSWER_FORMATS } from '../../output/formats.ts';
import { LocalityCommand } from '../locality-command.ts';
import { footprintSummary } from '../../geodesy/wkt.ts';
import { footprintGeometry } from '../../output/footprint-geometry.ts';
import { VERSION } from '../../version.ts';

/**
 * `whereabouts locate "<text>"`: one locality, printed for a person, with --json as the HTTP body, or
 * with --format as a file in one of src/output's formats.
 * Exit code 0 whenever the text was processed, whatever the status (the status says what happened).
 */
export function registerLocate(program: Command, dbPath: () => string): void {
  const locate = new LocalityCommand('locate');
  program.addCommand(locate);
  locate
    .description('georeference one locality text')
    .argument('<text>', 'the locality as written')
    .option('--country-code <XX>', 'ISO 3166-1 alpha-2 country code of the record')
    .option('--country <name>', 'country of the record')
    .option('--state-province <name>', 'state or province of the record')
    .option('--county <name>', 'county of the record')
    .option('--municipality <name>', 'municipality of the record')
    .option('--verbatim-coordinates <text>', 'coordinates as written in the record')
    .option('--geodetic-datum <datum>', 'datum of written coordinates that name none (in the text or --verbatim-coordinates): an EPSG code or a name, e.g. EPSG:4267 or NAD27', datumArgument)
    .option('--map-scale <denominator>', 'scale of the map the coordinates were read from, e.g. 24000', Number)
    .option('--cover-ambiguous', 'for an ambiguous name, one circle covering every candidate')
    .option('--administrative-fallback', 'for text naming no place, georeference to the record\'s smallest administrative unit')
    .addOption(routeKilometrePostOption())
    .option('--json', 'print the HTTP API body as JSON')
    .option('--format <name>', `print the answer as a file instead: ${ANSWER_FORMATS.map((f) => f.extension).join(' or ')} (as POST /api/v1/georeference.<name> writes it)`)
    .action(async (text: string, opts: LocateCommandOptions) => {
      const format = opts.format === undefined ? undefined : ANSWER_FORMATS.find((f) => f.extension === opts.format);
      if (opts.format !== undefined && !format) {
        throw new Error(`--format ${opts.format} is not a format of the answer: use ${ANSWER_FORMATS.map((f) => f.extension).join(' or ')}`);
      }
      if (!existsSync(dbPath())) {
        throw new Error(`no gazetteer at ${dbPath()}: import one first (whereabouts import <file>) or name another with --db`);
      }
      const [{ openGazetteer }, { georeferenceRecord }, { answerJson }] = await Promise.all([
        import('../../store/gazetteer-store.ts'),
        import('../../locate/georeference-record.ts'),
        import('../../output/json.ts'),
      ]);
      const store = openGazetteer(dbPath(), { readonly: true });
      try {
        // The sources cited and the rows the answer is found in are of one store, whatever an import commits meanwhile.
        const answer = store.asOfOneMoment(() => georeferenceRecord(store, {
          locality: text,
          countryCode: opts.countryCode,
          country: opts.country,
          stateProvince: opts.stateProvince,
          county: opts.county,
          municipality: opts.municipality,
          verbatimCoordinates: opts.verbatimCoordinates,
          geodeticDatum: opts.geodeticDatum,
          options: { mapScale: opts.mapScale, coverAmbiguous: opts.coverAmbiguous, administrativeFallback: opts.administrativeFallback, routeKilometrePost: opts.routeKilometrePost },
          attribution: { georeferencedBy: `whereabouts ${VERSION}`, georeferencedDate: new Date().toISOString(), sources: store.sources() },
        }));
        process.stdout.write(format ? format.write(answer, text) : opts.json ? answerJson(answer) : describe(answer.result, answer.darwinCore));
      } finally {
        store.close();
      }
    });
}

/** Refuses an unknown datum at once, saying how to name one; the value itself goes on to locate. */
function datumArgument(value: string): string {
  const datum = readDatumOption(value, '--geodetic-datum');
  if ('problem' in datum) throw new InvalidArgumentError(datum.problem);
  return value;
}

interface LocateCommandOptions {
  countryCode?: string;
  country?: string;
  stateProvince?: string;
  county?: string;
  municipality?: string;
  verbatimCoordinates?: string;
  geodeticDatum?: string;
  mapScale?: number;
  coverAmbiguous?: boolean;
  administrativeFallback?: boolean;
  routeKilometrePost?: RouteKilometrePostRule;
  json?: boolean;
  format?: string;
}

/** A short reading for a person at a terminal: the outcome, then the Darwin Core fields. */
function describe(result: LocateResult, darwinCore: Record<string, string>): string {
  const lines = [`status: ${result.status}`, `locality type: ${result.interpretation.type}`];
  if (result.reason) lines.push(`reason: ${result.reason}`);
  if (result.flags?.length) lines.push(`flags: ${result.flags.join(' | ')} (see georeferenceRemarks)`);
  if (result.components) {
    lines.push('uncertainty budget (m):');
    for (const [source, meters] of Object.entries(result.components)) lines.push(`  ${source.padEnd(20)} ${meters.toFixed(1)}`);
  }
  if (result.status === 'ambiguous' || result.status === 'not-found') {
    for (const c of result.candidates.slice(0, 10)) {
      lines.push(`  candidate: ${c.feature.name} [${c.feature.sourceId}:${c.feature.featureId}] ${c.why} (score ${c.score.toFixed(2)})`);
    }
  }
  lines.push('Darwin Core:');
  for (const [term, value] of Object.entries(darwinCore)) if (value) lines.push(`  ${term}: ${term === 'footprintWKT' ? describeFootprint(value) : value}`);
  lines.push('A georeference is an estimate: verify it before use.');
  return `${lines.join('\n')}\n`;
}

/** A footprint in words (its coordinates would fill the terminal): "Polygon, 64 vertices, 113.1 km²". */
function describeFootprint(wkt: string): string {
  const geometry = footprintGeometry(wkt);
  if (!geometry) return wkt;
  const { type, parts, vertices, areaSquareMeters } = footprintSummary(geometry);
  const area = areaSquareMeters >= 1e6 ? `${(areaSquareMeters / 1e6).toFixed(1)} km²` : `${Math.round(areaSquareMeters)} m²`;
  return `${type}${parts > 1 ? ` of ${parts} parts` : ''}, ${vertices} vertices, ${area} (the WKT itself: --json)`;
}
