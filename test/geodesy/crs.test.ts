/**
 * A GIS file's coordinate system (WKT) to WGS84 (src/geodesy/crs.ts), against GDAL's gdaltransform (Debian
 * gdal-bin, PROJ underneath) for the same WKT: an implementation independent of proj4.
 */
import { execFileSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import LatLon from 'geodesy/latlon-ellipsoidal-vincenty.js';
import { crsToWgs84 } from '../../src/geodesy/crs.ts';
import { gdalAvailable } from '../support/gdal.ts';

const hasGdal = gdalAvailable('test/geodesy/crs.test.ts');

/** gdaltransform's WGS84 longitude, latitude for an x, y in a WKT coordinate system. */
function gdaltransform(wkt: string, [x, y]: [number, number]): [number, number] {
  const out = execFileSync('gdaltransform', ['-s_srs', wkt, '-t_srs', '+proj=longlat +datum=WGS84', '-output_xy'], { input: `${x} ${y}\n`, encoding: 'utf8' });
  const [lon, lat] = out.trim().split(/\s+/).map(Number);
  return [lon!, lat!];
}

const meters = (a: number[], b: number[]) => new LatLon(a[1]!, a[0]!).distanceTo(new LatLon(b[1]!, b[0]!));

/** ED50 / UTM 31N with the EPSG:1133 mean shift written into the WKT (OGC WKT 1, TOWGS84). */
const ED50_UTM31_TOWGS84 =
  'PROJCS["ED50 / UTM zone 31N",GEOGCS["ED50",DATUM["European_Datum_1950",SPHEROID["International 1924",6378388,297],TOWGS84[-87,-98,-121,0,0,0,0]],' +
  'PRIMEM["Greenwich",0],UNIT["degree",0.0174532925199433]],PROJECTION["Transverse_Mercator"],PARAMETER["latitude_of_origin",0],' +
  'PARAMETER["central_meridian",3],PARAMETER["scale_factor",0.9996],PARAMETER["false_easting",500000],PARAMETER["false_northing",0],UNIT["metre",1]]';

describe.skipIf(!hasGdal)('crsToWgs84 against gdaltransform', () => {
  it("applies the WKT's own TOWGS84 (to 1 cm of GDAL)", () => {
    const crs = crsToWgs84(ED50_UTM31_TOWGS84, 'test');
    expect(crs.description).toMatch(/its own TOWGS84 -87,-98,-121/);
    for (const point of [[431_000, 4_582_000], [500_000, 5_000_000], [300_000, 4_200_000]] as [number, number][]) {
      expect(meters(crs.forward(point), gdaltransform(ED50_UTM31_TOWGS84, point))).toBeLessThan(0.01);
    }
  });

  it('takes the datum table’s shift for a datum the WKT only names (ED50 → EPSG:1133, the same 3 parameters)', () => {
    const named = ED50_UTM31_TOWGS84.replace(',TOWGS84[-87,-98,-121,0,0,0,0]', '');
    const crs = crsToWgs84(named, 'test');
    expect(crs.description).toMatch(/ED50|European/);
    expect(meters(crs.forward([431_000, 4_582_000]), gdaltransform(ED50_UTM31_TOWGS84, [431_000, 4_582_000]))).toBeLessThan(0.01);
  });
});

describe.skipIf(!hasGdal)('crsToWgs84 on a real .prj', () => {
  /**
   * test/fixtures/real/gis/sweref99-tm.prj: the .prj of data/boundaries.shp of
   * github.com/ahrberg/swedish-geoboundaries (commit e7eb03e; CC0 1.0, from Lantmäteriet's district division,
   * CC0), byte for byte: SWEREF99 TM as ESRI writes it, a datum named "D_SWEREF99" with no TOWGS84.
   * SWEREF99 to WGS 84 is the null transformation (EPSG dataset as packaged in epsg-index: EPSG:3006 carries
   * +towgs84=0,0,0,0,0,0,0, accuracy 1 m), so the file must be read, not refused for its datum.
   */
  const prj = readFileSync(new URL('../fixtures/real/gis/sweref99-tm.prj', import.meta.url), 'utf8');
  it('reads SWEREF99 TM and converts as GDAL does (to 1 cm), saying which shift it used', () => {
    const crs = crsToWgs84(prj, 'boundaries.prj');
    expect(crs.description).toMatch(/SWEREF99.*EPSG:1879/);
    // Stockholm, Uppsala, Kiruna and Malmö in SWEREF99 TM meters (rounded from their WGS84 positions)
    for (const point of [[674_032, 6_580_822], [647_000, 6_638_000], [733_000, 7_530_000], [374_000, 6_164_000]] as [number, number][]) {
      expect(meters(crs.forward(point), gdaltransform(prj, point))).toBeLessThan(0.01);
    }
  });
});

describe('crsToWgs84 at the edges', () => {
  it('keeps a vertex on the antimeridian at −180°, not a round-off past it (Web Mercator x = a·λ, so λ = −180° at x = −π·6378137 m = −20037508.342789244 m)', () => {
    const mercator = 'PROJCS["WGS_1984_Web_Mercator_Auxiliary_Sphere",GEOGCS["GCS_WGS_1984",DATUM["D_WGS_1984",SPHEROID["WGS_1984",6378137.0,298.257223563]],PRIMEM["Greenwich",0.0],UNIT["Degree",0.0174532925199433]],PROJECTION["Mercator_Auxiliary_Sphere"],PARAMETER["False_Easting",0.0],PARAMETER["False_Northing",0.0],PARAMETER["Central_Meridian",0.0],PARAMETER["Standard_Parallel_1",0.0],PARAMETER["Auxiliary_Sphere_Type",0.0],UNIT["Meter",1.0]]';
    const [lon] = crsToWgs84(mercator, 'test').forward([-20_037_508.342789244, 0]);
    expect(lon).toBe(-180);
  });

  it('refuses what proj4 cannot read, naming the file', () => {
    expect(() => crsToWgs84('LOCAL_CS["nothing"]', 'odd.prj')).toThrow(/^odd\.prj: /);
  });
});
