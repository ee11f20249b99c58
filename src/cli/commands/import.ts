import type { Command } from 'commander';
import type { GisFieldMap } from '../../store/gis-import.ts';
import type { ImportFormat, ImportSummary } from '../../store/import.ts';
import { parsePriority } from './gazetteer.ts';

/**
 * The GIS attribute options are the importer's field map, but `--type-field` for its featureTypeField and
 * `--unit-code-field` (repeatable) for its unitCodeFields.
 */
interface ImportCommandOptions extends Omit<GisFieldMap, 'featureTypeField' | 'unitCodeFields'> {
  format?: string;
  source?: string;
  citation?: string;
  sourceId?: string;
  licence?: string;
  adminCodes?: string[];
  alternateNames?: string;
  priority?: number | null;
  defaultRadius?: Record<string, number>;
  typeField?: string;
  unitCodeField?: string[];
}

const FORMATS: readonly ImportFormat[] = ['csv', 'geojson', 'geonames', 'shapefile', 'gpkg'];
/** Refused rows listed one by one in the summary; the rest are counted. */
const LISTED_REJECTIONS = 20;

/**
 * `whereabouts import <file>`: loads a gazetteer file as one source (replacing a source of the same
 * id). Progress on stderr when it is a terminal; a summary on stdout at the end.
 */
export function registerImport(program: Command, dbPath: () => string): void {
  program
    .command('import')
    .description('import a gazetteer file (CSV, GeoJSON FeatureCollection, the tab-separated world-gazetteer dump layout plain or zipped, a shapefile or a GeoPackage)')
    .argument('<file>', 'the gazetteer file')
    .option('--format <format>', `one of ${FORMATS.join(', ')} (default: from the file extension)`)
    .option('--source <citation>', 'how to cite this gazetteer, e.g. "Survey of towns, 2024, Land Office" (without it a stand-in is built from the file name, size and sha256, to be replaced)')
    .option('--citation <citation>', 'the same as --source')
    .option('--source-id <id>', 'id of the source in the store (default: the file name without extension)')
    .option('--licence <text>', 'licence of the gazetteer')
    .option('--admin-codes <file>', 'admin1 or admin2 code names for the dump layout ("CC.A1" or "CC.A1.A2", name, asciiname, id); repeatable', collectFile)
    .option('--alternate-names <file>', 'the dump layout\'s alternate-names file (10 columns, plain or zipped): names in other languages, former and colloquial names')
    .option('--priority <rank>', 'where several sources hold the same place, cite this one at this rank (1 first; see gazetteer priority)', parsePriority)
    .option('--default-radius <type=meters>', 'radius for points of a feature type that give none, for this source (repeatable)', collectRadius)
    .option('--layer <name>', 'GIS files: the GeoPackage layer, or the shapefile inside a zip holding several')
    .option('--name-field <attribute>', 'GIS files and GeoJSON: the attribute holding the name (default: name)')
    .option('--id-field <attribute>', "GIS files and GeoJSON: the attribute holding the feature id (default: the feature's number)")
    .option('--alternate-names-field <attribute>', 'GIS files and GeoJSON: an attribute holding alternate names, |-separated; repeatable (name_alt, woe_name, gn_name…). A state\'s, county\'s or municipality\'s alternate names are also names records may give it', collectFile)
    .option('--unit-code-field <attribute>', 'GIS files and GeoJSON: an attribute holding a code of a state, county or municipality (an ISO 3166-2 code such as "QV-PN", whose subdivision part "PN" counts too, a postal or statistical code); repeatable. Records and other files may give the unit by it; it is not matched against locality text (a CSV gazetteer gives codes in its unitCodes column, |-separated)', collectFile)
    .option('--type-field <attribute>', 'GIS files and GeoJSON: the attribute holding the feature type')
    .option('--feature-type <type>', 'GIS files and GeoJSON: one feature type for every feature (county, stateProvince, country, or any other type)')
    .option('--country-code-field <attribute>', 'GIS files and GeoJSON: the attribute holding the ISO 3166-1 alpha-2 country code')
    .option('--country-code <code>', 'GIS files and GeoJSON: one country code for every feature')
    .option('--state-province-field <attribute>', 'GIS files and GeoJSON: the attribute holding the state or province a feature lies in')
    .option('--county-field <attribute>', 'GIS files and GeoJSON: the attribute holding the county a feature lies in')
    .option('--encoding <name>', "shapefiles: the .dbf's encoding, over its .cpg and header (a code page such as 850, CP437 or 1252, or any name iconv-lite knows; default: the .cpg's, else the header's language driver, else windows-1252)")
    .action(async (file: string, opts: ImportCommandOptions) => {
      const [{ formatFromFileName, importGazetteer }, { openGazetteer }] = await Promise.all([import('../../store/import.ts'), import('../../store/gazetteer-store.ts')]);
      const format = (opts.format ?? formatFromFileName(file)) as ImportFormat | null;
      if (format === null) throw new Error(`cannot tell the format of ${file} from its extension: give --format ${FORMATS.join('|')}`);
      if (!FORMATS.includes(format)) throw new Error(`--format must be one of ${FORMATS.join(', ')}, not '${format}'`);
      const bar = process.stderr.isTTY ? new (await import('cli-progress')).SingleBar({ format: 'importing {value} rows read', stream: process.stderr }) : null;
      bar?.start(0, 0);
      const store = openGazetteer(dbPath());
      try {
        const summary = await importGazetteer(store, file, {
          format,
          citation: opts.source ?? opts.citation,
          sourceId: opts.sourceId,
          licence: opts.licence,
          adminCodesFile: opts.adminCodes,
          alternateNamesFile: opts.alternateNames,
          priority: opts.priority,
          radii: opts.defaultRadius,
          gis: {
            layer: opts.layer, nameField: opts.nameField, idField: opts.idField, alternateNamesField: opts.alternateNamesField,
            unitCodeFields: opts.unitCodeField,
            featureTypeField: opts.typeField, featureType: opts.featureType, countryCodeField: opts.countryCodeField, countryCode: opts.countryCode,
            stateProvinceField: opts.stateProvinceField, countyField: opts.countyField, encoding: opts.encoding,
          },
          onProgress: (rows) => bar?.update(rows),
        });
        bar?.stop();
        process.stdout.write(formatSummary(summary));
      } finally {
        bar?.stop();
        store.close();
      }
    });
}

/** Adds one value (a file, an attribute) of a repeatable option to those already given. */
function collectFile(value: string, previous: string[] | undefined): string[] {
  return [...(previous ?? []), value];
}

/**
 * Adds one `--default-radius type=meters` to those already given.
 * @example collectRadius('village=3000', {}) // { village: 3000 }
 */
export function collectRadius(value: string, previous: Record<string, number> = {}): Record<string, number> {
  const match = /^(.+)=(\d+(?:\.\d+)?)$/.exec(value);
  if (match === null) throw new Error(`--default-radius needs type=meters (e.g. village=3000), not '${value}'`);
  return { ...previous, [match[1].trim()]: Number(match[2]) };
}

/**
 * The summary printed after an import.
 * @example formatSummary({ sourceId: 'x', citation: 'Towns, 2024', citationIsStandIn: false, encoding: 'utf-8', rowsRead: 2, imported: 1, rejected: [{ row: 3, reason: 'name missing' }], seconds: 0.1 })
 */
export function formatSummary(summary: ImportSummary): string {
  const lines = [
    `source ${summary.sourceId}: ${summary.rowsRead} rows read, ${summary.imported} imported, ${summary.rejected.length} rejected, ${summary.seconds.toFixed(1)} s`,
    ...(summary.notes ?? []).map((note) => `  ${note}`),
    ...(summary.replaced === undefined
      ? []
      : [`  replaced the source ${summary.sourceId} imported ${summary.replaced.importedAt} (${summary.replaced.featureCount} features); to keep both, import with --source-id <another id>`]),
    ...(summary.encoding === 'utf-8' ? [] : [`  read as ${summary.encoding} (the file is not UTF-8)`]),
    ...(summary.citationIsStandIn
      ? [`  citation: ${summary.citation}`, `  this stand-in only names the file: replace it with a real citation by importing again with --source "<who, what, year, where from>"`]
      : []),
    ...summary.rejected.slice(0, LISTED_REJECTIONS).map(({ row, reason }) => `  row ${row}: ${reason}`),
  ];
  if (summary.rejected.length > LISTED_REJECTIONS) lines.push(`  … and ${summary.rejected.length - LISTED_REJECTIONS} more rejected rows`);
  const names = summary.alternateNames;
  if (names !== undefined) {
    lines.push(`alternate names: ${names.rowsRead} lines read, ${names.kept} names kept, ${names.rejected.length} rejected`,
      ...names.rejected.slice(0, LISTED_REJECTIONS).map(({ row, reason }) => `  line ${row}: ${reason}`));
  }
  return `${lines.join('\n')}\n`;
}
