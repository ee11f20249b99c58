/**
 * Every [CHOICE] whereabouts makes where the published method (WGH2004, BP2020) leaves the georeferencer free,
 * and the few engineering limits marked the same way, as one list a reviewer can read: the value in force, why,
 * and what changes it. Values of the method are read from METHOD_DEFAULTS, never copied; rules stated in words
 * are fixed in this version. `whereabouts method`, GET /api/v1/method, the page and every batch job show this list.
 * @example
 *   methodChoices().find((c) => c.id === 'nearMinimumMeters')!.value; // 1000
 */
import { METHOD_DEFAULTS } from './method-defaults.ts';
import { DISTANCE_LIMITS } from './generalisation.ts';
import { METER_GRID_LIMITS } from './meter-grid-generalisation.ts';

export interface MethodChoice {
  /** Stable name of the choice (the METHOD_DEFAULTS key when it has one). */
  id: string;
  /** 'method' when it changes a georeference; 'service' for limits of the program that never do. */
  kind: 'method' | 'service';
  /** What is chosen, in a few words. */
  choice: string;
  /** The value in force: a number (with `unit`) or a rule in words. */
  value: number | string;
  unit?: string;
  /** The section of docs/method.md and the published source, or "common practice, no source". */
  source: string;
  /** The CLI option, API field or batch setting that changes it, or "fixed". */
  changedBy: string;
  /** Files that hold or apply it (each carries a [CHOICE] marker). */
  where: string[];
}

const LIBRARY_ONLY = (key: string) => `fixed for the CLI, API and batch; a program calling the core may pass MethodOptions.${key}`;

/** The list, in the order of docs/method.md. Pure: no I/O. */
export function methodChoices(): MethodChoice[] {
  const d = METHOD_DEFAULTS;
  return [
    { id: 'distanceOnly', kind: 'method', choice: 'distance without heading: radius r_f + d + δ', value: 'as stated', source: 'docs/method.md §3; BP2020 describes a band around the feature, whereabouts uses the disc that holds it', changedBy: 'fixed', where: ['src/georef/offset-uncertainty.ts', 'src/georef/georeference.ts'] },
    { id: 'headingSector', kind: 'method', choice: 'heading only: point and radial of the part of the bounding unit inside the sector', value: 'as stated', source: 'docs/method.md §3; our choice, no source', changedBy: 'fixed', where: ['src/georef/georeference.ts'] },
    { id: 'between', kind: 'method', choice: 'between two places: midpoint, radius D/2 + max(r_f1, r_f2); more places: the smallest circle through them', value: 'as stated', source: 'docs/method.md §3; not in BP2020, our choice, no source', changedBy: 'fixed', where: ['src/georef/georeference.ts'] },
    { id: 'nearMinimumMeters', kind: 'method', choice: '"near X": radius r_f + max(r_f, m)', value: d.nearMinimumMeters, unit: 'm', source: 'docs/method.md §3; common practice, no source', changedBy: LIBRARY_ONLY('nearMinimumMeters'), where: ['src/georef/method-defaults.ts', 'src/georef/georeference.ts'] },
    { id: 'junctionExtentMeters', kind: 'method', choice: "a junction's own extent", value: d.junctionExtentMeters, unit: 'm', source: 'docs/method.md §3; common practice, no source', changedBy: LIBRARY_ONLY('junctionExtentMeters'), where: ['src/georef/method-defaults.ts', 'src/georef/georeference.ts'] },
    { id: 'coverReadings', kind: 'method', choice: 'several readings covered by one circle: smallest circle through their points, reaching every circle\'s far edge', value: 'as stated', source: 'docs/method.md §3; our choice, no source', changedBy: 'CLI --cover-ambiguous; API coverAmbiguous; batch --cover-ambiguous', where: ['src/georef/cover.ts'] },
    { id: 'maxCoveredReadings', kind: 'method', choice: 'most readings of an ambiguous text one circle covers', value: 50, source: 'docs/method.md §3; our choice, no source', changedBy: 'fixed', where: ['src/locate/locate.ts'] },
    { id: 'fuzzyAcceptance', kind: 'method', choice: 'how near a name must match: plausible, minimum score, lead over the next, score of a reading', value: '0.7, 0.8, 0.1, 0.95', source: 'docs/method.md §2; common practice, no source', changedBy: 'fixed', where: ['src/locate/locate.ts'] },
    { id: 'defaultRadii', kind: 'method', choice: 'radius of a point feature without one', value: 'by feature type (src/georef/default-radii.ts)', source: 'docs/method.md §4; BP2020 gives no table, so the values err large', changedBy: 'a gazetteer source may state its own', where: ['src/georef/default-radii.ts', 'src/store/dump-layout.ts'] },
    { id: 'samePlace', kind: 'method', choice: 'features of different sources taken as one place, cited from the source ranked first', value: 'same folded name, compatible feature type, centers within the smaller radius or 1 km', source: 'docs/method.md §4a; our choice, no source', changedBy: 'gazetteer priority <source> <rank> (which source is cited); the rule is fixed', where: ['src/match/same-place.ts'] },
    { id: 'outlineExactEdges', kind: 'method', choice: 'edges of an outline measured exactly near the best estimate', value: 'within a quarter and 1 km', source: 'docs/method.md §4; our choice, no source', changedBy: 'fixed', where: ['src/georef/outlines.ts'] },
    { id: 'eighths', kind: 'method', choice: 'precision of a written fraction: .5 → 1/2, .25 .75 → 1/4, eighths → 1/8', value: 'as stated', source: 'docs/method.md §5.1; BP2020 δ = precision/2, the fractions our choice', changedBy: 'fixed', where: ['src/parse/numbers.ts'] },
    { id: 'varyingUnits', kind: 'method', choice: 'leagues and other varying units: spread added to δ', value: 'as stated', source: 'docs/method.md §7', changedBy: 'fixed', where: ['src/parse/units.ts'] },
    { id: 'cercaDe', kind: 'method', choice: '"cerca de": "about" before a number, "near" before a place', value: 'decided by what follows', source: 'docs/method.md §3; our choice, no source', changedBy: 'fixed', where: ['src/parse/lexicon.ts'] },
    { id: 'unitlessDistanceUnits', kind: 'method', choice: 'a distance with no unit: read between two units like a range', value: d.unitlessDistanceUnits, source: 'docs/method.md §5.1; our choice, no source', changedBy: LIBRARY_ONLY('unitlessDistanceUnits'), where: ['src/georef/method-defaults.ts', 'src/georef/georeference.ts', 'src/georef/types.ts', 'src/parse/types.ts'] },
    { id: 'doubtfulDatum', kind: 'method', choice: 'a datum stated for a point outside its EPSG area of use counts as unknown', value: 'as stated', source: 'docs/method.md §5.4; our choice, no source', changedBy: 'fixed', where: ['src/georef/georeference.ts'] },
    { id: 'noDatumWords', kind: 'method', choice: 'datum fields that state no datum ("not recorded", "unknown" …) count as no datum', value: 'as stated', source: 'docs/method.md §5.4; common practice, no source', changedBy: 'fixed', where: ['src/geodesy/datum-option.ts'] },
    { id: 'gda94DatumTerm', kind: 'method', choice: 'GDA94 datum term (EPSG states 1 m; the plate has moved about 1.8 m since)', value: 3, unit: 'm', source: 'docs/method.md §5.4; our choice, no source', changedBy: 'fixed', where: ['src/geodesy/datums.ts'] },
    { id: 'unknownDatumMeters', kind: 'method', choice: 'unknown datum where no regional datum applies', value: d.unknownDatumMeters, unit: 'm', source: 'docs/method.md §5.4; BP2020 §Uncertainty related to unknown datum (the published worst case)', changedBy: 'CLI --geodetic-datum (states the datum); otherwise ' + LIBRARY_ONLY('unknownDatumMeters'), where: ['src/georef/method-defaults.ts'] },
    { id: 'regionalDatum', kind: 'method', choice: 'unknown datum inside regional areas of use: the largest pairwise distance at the point between the datums listed there (their transformations\' accuracy named in the remarks, not added), never above unknownDatumMeters', value: 'as stated', source: 'docs/method.md §5.4; BP2020 §Uncertainty from Unknown Datum; the table of datums and areas our choice', changedBy: 'fixed', where: ['src/georef/georeference.ts', 'src/geodesy/unknown-datum.ts'] },
    { id: 'mapStandard', kind: 'method', choice: 'map accuracy standard when only a scale is given', value: d.mapStandard, source: 'docs/method.md §5.5; 1 mm on the map, common practice, no source', changedBy: LIBRARY_ONLY('mapStandard'), where: ['src/georef/method-defaults.ts'] },
    { id: 'naturalEarthToleranceMeters', kind: 'method', choice: 'plausibility: Natural Earth 1:50m shores and borders may be off by', value: d.naturalEarthToleranceMeters, unit: 'm', source: 'docs/method.md §2; common practice, no source', changedBy: 'fixed', where: ['src/georef/method-defaults.ts', 'src/georef/plausibility.ts'] },
    { id: 'unusedFeatureMeters', kind: 'method', choice: 'a place the text names but no loaded gazetteer holds (or a later clause used for a missing first one): the radius grows by', value: d.unusedFeatureMeters, unit: 'm', source: 'docs/method.md §Every [CHOICE] in one list; measured on published records (README, "On real records"), no published rule', changedBy: LIBRARY_ONLY('unusedFeatureMeters'), where: ['src/georef/method-defaults.ts', 'src/georef/types.ts', 'src/locate/other-clauses.ts'] },
    { id: 'unusedFeatureRule', kind: 'method', choice: "what such a place does: 'widen' the radius, or 'decline' with the reason", value: d.unusedFeatureRule, source: 'docs/method.md §Every [CHOICE] in one list; our choice, no source', changedBy: LIBRARY_ONLY('unusedFeatureRule'), where: ['src/georef/method-defaults.ts', 'src/locate/other-clauses.ts'] },
    { id: 'unitWithoutPolygon', kind: 'method', choice: 'a text naming an administrative unit with no polygon loaded', value: d.unitWithoutPolygon, source: 'docs/method.md §Every [CHOICE] in one list; our choice, no source', changedBy: 'fixed', where: ['src/georef/method-defaults.ts', 'src/locate/administrative-unit.ts'] },
    { id: 'justOutsideMeters', kind: 'method', choice: 'a reference place loaded only outside the stated county or state is taken within this distance of its polygon', value: d.justOutsideMeters, unit: 'm', source: 'docs/method.md §Every [CHOICE] in one list; our choice, no source', changedBy: LIBRARY_ONLY('justOutsideMeters'), where: ['src/georef/method-defaults.ts', 'src/locate/just-outside.ts'] },
    { id: 'settlementNamedLikeFeature', kind: 'method', choice: 'a name whose generic word says river, mountain, farm… held only as a settlement of that very name ("Rio X" a town)', value: d.settlementNamedLikeFeature, source: 'docs/method.md §Every [CHOICE] in one list; measured on published records (README, "On real records"), no published rule', changedBy: LIBRARY_ONLY('settlementNamedLikeFeature'), where: ['src/georef/method-defaults.ts', 'src/locate/feature-kind.ts'] },
    { id: 'namesakesWithinMeters', kind: 'method', choice: 'a name matching several features of one type in one state or province, all this close to one another: one circle covers them', value: d.namesakesWithinMeters, unit: 'm', source: 'docs/method.md §Every [CHOICE] in one list; measured on published records (README, "On real records"), no published rule', changedBy: LIBRARY_ONLY('namesakesWithinMeters'), where: ['src/georef/method-defaults.ts', 'src/locate/locate.ts'] },
    { id: 'centerToleranceMeters', kind: 'method', choice: 'how close to a unit\'s center written coordinates count as "on" it (or the half-step of their last decimal when coarser)', value: 1000, unit: 'm', source: 'docs/method.md §2; common practice, no source', changedBy: 'fixed', where: ['src/record/coordinate-check.ts'] },
    { id: 'footprintSegments', kind: 'method', choice: 'segments of a footprint circle', value: d.footprintSegments, source: 'docs/method.md §6; our choice, no source', changedBy: LIBRARY_ONLY('footprintSegments'), where: ['src/georef/method-defaults.ts'] },
    { id: 'reportedDecimals', kind: 'method', choice: 'reported decimals: the fewest (at most 7) whose rounding moves the point no more than allowed; the shift added to the radius', value: 'as stated', source: 'docs/method.md §6; our choice, no source', changedBy: 'fixed', where: ['src/record/reported-precision.ts', 'src/record/darwin-core.ts'] },
    { id: 'generalisedRadius', kind: 'method', choice: 'a record generalised (only on request) to a grid cell: point at the cell centre, radius = farthest corner from the written centre + the original radius, rounded up; footprint the cell', value: 'as stated', source: 'docs/method.md §8; Chapman 2020 (doi:10.15468/doc-5jp4-5g10) on grid generalisation; the radius rule common practice, no source', changedBy: 'batch --sensitive-taxa, --sensitive-column with --generalise-to, --generalise-to-meters or --generalise-within; API POST /api/v1/batches sensitiveTaxa, sensitiveColumn with gridDegrees, gridMeters or distanceMeters', where: ['src/georef/grid-generalisation.ts', 'src/record/generalised-record.ts'] },
    { id: 'meterGrid', kind: 'method', choice: "a generalisation grid in meters: the UTM grid (WGS 84) of the point's 6° zone (no Norway or Svalbard exceptions, every latitude), cells on whole multiples of the side, the centre written to a hundredth of the side", value: `${METER_GRID_LIMITS.smallest} to ${METER_GRID_LIMITS.largest}`, unit: 'm', source: 'docs/method.md §8; NIMA TM 8358.2 §2 for the grid; its use for generalising our choice, no source', changedBy: 'the side: taxa list gridMeters, batch --generalise-to-meters, API gridMeters; the grid is fixed', where: ['src/georef/meter-grid-generalisation.ts'] },
    { id: 'generalisationDistance', kind: 'method', choice: 'a stated generalisation distance d: the cell of that UTM grid whose half-diagonal is d (side d·√2), so the precise point lies within d of the point shown (to 1.5 %)', value: `${DISTANCE_LIMITS.smallest} to ${DISTANCE_LIMITS.largest}`, unit: 'm', source: 'docs/method.md §8; our reading of "a stated distance", no source', changedBy: 'd: taxa list distanceMeters, batch --generalise-within, API distanceMeters; the rule is fixed', where: ['src/georef/generalisation.ts'] },
    { id: 'serverDefaults', kind: 'service', choice: 'service host, result cache, body and upload limits, rate limit', value: '127.0.0.1; 2000 results; 64 KiB; 50 MiB; 1200 a minute', source: 'common practice, no source', changedBy: 'fixed', where: ['src/server/defaults.ts'] },
    { id: 'sensitiveTaxaLimit', kind: 'service', choice: 'largest list of sensitive taxa an upload may carry', value: '1 MiB', source: 'our choice, no source (tens of thousands of names)', changedBy: 'fixed', where: ['src/server/generalisation-request.ts'] },
    { id: 'recordsLimits', kind: 'service', choice: 'most records and bytes in one request of many records', value: '1000 records; 4 MiB', source: 'our choice, no source (about a second of work a request)', changedBy: 'fixed', where: ['src/server/routes/records.ts'] },
    { id: 'defaultPort', kind: 'service', choice: 'port of `whereabouts serve`', value: 8737, source: 'our choice, no source', changedBy: 'CLI serve --port', where: ['src/cli/commands/serve.ts'] },
    { id: 'mapSimplifyDegrees', kind: 'service', choice: 'simplification of outlines drawn on the map', value: 0.0005, unit: '°', source: 'about 50 m at the equator; our choice, no source', changedBy: 'fixed', where: ['src/server/routes/layers.ts'] },
    { id: 'batchChunks', kind: 'service', choice: 'batch work units: localities a chunk, rows a commit, main-thread limit, worker heap, cached results', value: '64; 1000; 2000; 128 MB; 2000', source: 'our choice, no source (never changes a result)', changedBy: 'batch --threads (workers only)', where: ['src/batch/run.ts'] },
    { id: 'maxParts', kind: 'service', choice: 'most parts of a split batch', value: 100_000, source: 'our choice, no source', changedBy: 'fixed', where: ['src/batch/partition.ts'] },
    { id: 'mergeChunks', kind: 'service', choice: 'bytes read from a part file and gathered before a write', value: '1 MiB; 1 MiB', source: 'our choice, no source', changedBy: 'fixed', where: ['src/batch/merge.ts'] },
    { id: 'utf16Detection', kind: 'service', choice: 'input read as UTF-16 without a byte-order mark when every other byte is zero in', value: '90 % of the first 4 KB', source: 'our choice, no source', changedBy: 'fixed', where: ['src/store/input-format.ts'] },
    { id: 'inputReadChunk', kind: 'service', choice: 'bytes of the input read at a time', value: '64 KiB', source: 'our choice, no source (a chunk\'s rows are held at once)', changedBy: 'fixed', where: ['src/batch/records.ts'] },
    { id: 'proposalNamespace', kind: 'service', choice: "namespace of an output archive's columns that are not Darwin Core terms (proposed_<term>, flags)", value: 'http://whereabouts.invalid/terms/', source: 'RFC 2606 reserves .invalid; our choice, no source', changedBy: 'fixed', where: ['src/output/darwin-core-archive.ts'] },
    { id: 'gisReservedColumns', kind: 'service', choice: "column names a GeoPackage layer keeps for itself (an input column of that name is renamed with _2)", value: 'fid, geom', source: 'OGC GeoPackage 12-128 §2.1.6; our choice of names, no source', changedBy: 'fixed', where: ['src/output/result-rows.ts'] },
    { id: 'gisRowsPerTransaction', kind: 'service', choice: 'rows written to a GeoPackage a transaction', value: 5000, source: 'our choice, no source (never changes a result)', changedBy: 'fixed', where: ['src/batch/gis-output.ts'] },
    { id: 'maxRowCharacters', kind: 'service', choice: 'longest input row accepted', value: 1_000_000, unit: 'characters', source: 'our choice, no source', changedBy: 'fixed', where: ['src/batch/records.ts'] },
  ];
}

/** The values in force, by id: what a batch job records so its output can be reproduced. */
export function methodChoiceValues(): Record<string, number | string> {
  return Object.fromEntries(methodChoices().map((c) => [c.id, c.value]));
}
