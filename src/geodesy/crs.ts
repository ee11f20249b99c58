/**
 * Coordinates of a GIS file's coordinate system (its WKT: a shapefile's .prj, a GeoPackage's srs
 * definition) converted to WGS84 longitude, latitude. proj4 reads the WKT (OGC or ESRI flavour) and
 * projects; the datum shift is the WKT's own TOWGS84 when it has one, otherwise the explicit +towgs84 of
 * our table (datums.ts), since proj4 applies no shift for a datum it merely names. A datum with neither
 * is refused by name rather than silently taken as WGS84. Accuracy: proj4's projection inverses are
 * exact to well under a millimetre; the datum shift is as good as its transformation (datums.ts).
 */
import proj4, { type ProjectionDefinition } from 'proj4';
import type { Position } from 'geojson';
import { DATUMS, datumDefinition, datumFromName } from './datums.ts';

export interface CrsToWgs84 {
  /** [x, y] in the file's coordinate system → [longitude, latitude] in WGS84. */
  forward: (position: Position) => Position;
  /** The coordinate system and the datum shift used, in words, for the import's notes. */
  description: string;
}

interface ParsedWkt {
  name?: string;
  srsCode?: string;
  datumCode?: string;
  datum_params?: number[];
  datum?: { datum_type?: number };
  GEOGCS?: { name?: string; AUTHORITY?: Record<string, string>; DATUM?: { name?: string; TOWGS84?: number[] } };
  AUTHORITY?: Record<string, string>;
  DATUM?: { name?: string; TOWGS84?: number[] };
}

const WGS84 = '+proj=longlat +datum=WGS84 +no_defs';
let registered = 0;

/**
 * The conversion for a WKT coordinate system, or a clear error when proj4 cannot read it or its datum
 * has no known shift to WGS84.
 * @example crsToWgs84(prjText).forward([441_000, 4_986_000]) // [-141.74…, -45.01…]
 */
export function crsToWgs84(wkt: string, where: string): CrsToWgs84 {
  let parsed: ParsedWkt;
  const name = `whereabouts-import-${++registered}`;
  try {
    proj4.defs(name, wkt);
    parsed = proj4.defs(name) as unknown as ParsedWkt;
    if (!parsed) throw new Error('not a coordinate system');
  } catch (error) {
    throw new Error(`${where}: proj4 cannot read the coordinate system (${error instanceof Error ? error.message : String(error)}): ${wkt.slice(0, 120)}`);
  }
  const geographic = parsed.GEOGCS ?? (parsed as ParsedWkt);
  const datumName = geographic.DATUM?.name ?? '';
  const label = parsed.name ?? parsed.srsCode ?? 'the coordinate system';
  let shift: string;
  if (parsed.datum_params?.some((p) => p !== 0) || geographic.DATUM?.TOWGS84) {
    shift = `its own TOWGS84 ${(parsed.datum_params ?? geographic.DATUM?.TOWGS84 ?? []).join(',')}`;
  } else {
    const datumEpsg = tableDatum(geographic, datumName);
    if (datumEpsg === undefined) {
      throw new Error(
        `${where}: the datum "${datumName || '(none named)'}" of ${label} has no shift to WGS84 in the file and is not one whereabouts knows ` +
          `(${DATUMS.map((d) => d.name).join(', ')}); give the file a coordinate system with TOWGS84, or reproject it to WGS84 first`,
      );
    }
    const datum = datumDefinition(datumEpsg);
    (parsed as ParsedWkt & Record<string, unknown>).datum_params = datum.towgs84.split(',').map(Number);
    delete parsed.datumCode;
    proj4.defs(name, parsed as unknown as ProjectionDefinition);
    shift = datum.epsg === 'EPSG:4326' ? 'no datum shift (WGS 84)' : `${datum.transformation}, ±${datum.accuracyMeters} m`;
  }
  const converter = proj4(name, WGS84);
  return {
    forward: (position) => snapToBounds(converter.forward([position[0]!, position[1]!])),
    description: `${label}, datum ${datumName || 'unnamed'} → WGS 84 by ${shift}`,
  };
}

/** The table's datum for a WKT's geographic CRS: by its EPSG code, else by the datum's or the CRS's name. */
function tableDatum(geographic: ParsedWkt | NonNullable<ParsedWkt['GEOGCS']>, datumName: string): string | undefined {
  const code = geographic.AUTHORITY?.EPSG ?? geographic.AUTHORITY?.epsg;
  const byCode = code ? datumFromName(`EPSG:${code}`) : undefined;
  if (byCode) return byCode;
  const readable = (text: string | undefined) => (text ?? '').replace(/^(D|GCS)_/i, '').replace(/_/g, ' ');
  return datumFromName(readable(datumName)) ?? datumFromName(readable(geographic.name));
}

/** Round-off of a projection's inverse (about 1e-14°) kept from pushing a vertex on ±180° or ±90° past it. */
const BOUND_TOLERANCE_DEGREES = 1e-9;

function snapToBounds([longitude, latitude]: Position): Position {
  const snap = (value: number, bound: number) => (Math.abs(value) > bound && Math.abs(value) - bound < BOUND_TOLERANCE_DEGREES ? Math.sign(value) * bound : value);
  return [snap(longitude!, 180), snap(latitude!, 90)];
}
