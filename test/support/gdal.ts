/** Debian's GDAL command-line programs (gdal-bin) for tests that check files against an outside reader. */
import { execFileSync } from 'node:child_process';
import { existsSync } from 'node:fs';

/** True when ogrinfo and ogr2ogr are installed; otherwise says which test file is skipped and why. */
export function gdalAvailable(testFile: string): boolean {
  const missing = ['ogrinfo', 'ogr2ogr'].filter((p) => !['/usr/bin', '/usr/local/bin'].some((dir) => existsSync(`${dir}/${p}`)));
  if (missing.length > 0) console.warn(`${testFile} skipped: ${missing.join(', ')} not installed (apt-get install gdal-bin; .ci/run does this)`);
  return missing.length === 0;
}

/** Run a GDAL program; its standard output. */
export function gdal(program: 'ogrinfo' | 'ogr2ogr', ...args: string[]): string {
  return execFileSync(program, args, { encoding: 'utf8', maxBuffer: 256 << 20, stdio: ['ignore', 'pipe', 'pipe'] });
}

export interface OgrFeature {
  fid: number;
  fields: Record<string, string | null>;
  /** The geometry as ogrinfo prints it (WKT), or undefined for a NULL geometry. */
  geometry?: string;
}

/**
 * The features of one layer as `ogrinfo -ro -al` prints them ("OGRFeature(layer):fid", then
 * "  name (Type) = value" lines, "(null)" for NULL, then the geometry as WKT when there is one).
 */
export function ogrFeatures(path: string, layer?: string, ...options: string[]): OgrFeature[] {
  const text = gdal('ogrinfo', '-ro', '-al', '-q', ...options, path, ...(layer ? [layer] : []));
  const features: OgrFeature[] = [];
  for (const line of text.split('\n')) {
    const start = /^OGRFeature\(.*\):(\d+)$/.exec(line);
    if (start) {
      features.push({ fid: Number(start[1]), fields: {} });
      continue;
    }
    const current = features[features.length - 1];
    if (!current) continue;
    const field = /^ {2}(\S+) \((\w+(?:List)?)\) = (.*)$/.exec(line);
    if (field) current.fields[field[1]] = field[3] === '(null)' ? null : field[3];
    else if (/^ {2}[A-Z]+ ?(\(|EMPTY)/.test(line)) current.geometry = line.trim();
  }
  return features;
}

/**
 * How many footprints of a batch's GeoPackage (its `footprints` layer) the join condition `on` pairs with a unit
 * of the layer `units` added to it (aliases `f` and `u`), and how many of those lie inside that unit's polygon
 * (SpatiaLite's ST_Within, read through ogrinfo's SQLite dialect; the polygon buffered by 1e-5°, about a meter,
 * for the clip's own rounding).
 * @example footprintsWithin(out, 'counties', `f.georeferenceRemarks LIKE '%"' || u.NAME || '"%'`) // { footprints: 12, inside: 12 }
 */
export function footprintsWithin(gpkg: string, units: string, on: string): { footprints: number; inside: number } {
  const sql = `SELECT count(*) AS footprints, sum(ST_Within(f.geom, ST_Buffer(u.geom, 0.00001))) AS inside FROM footprints f JOIN ${units} u ON ${on}`;
  const [row] = ogrFeatures(gpkg, undefined, '-dialect', 'SQLite', '-sql', sql);
  return { footprints: Number(row!.fields.footprints), inside: Number(row!.fields.inside) };
}
