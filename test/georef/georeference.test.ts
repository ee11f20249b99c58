import fc from 'fast-check';
import geographiclib from 'geographiclib-geodesic';
import LatLon from 'geodesy/latlon-ellipsoidal-datum.js';
import { describe, expect, it } from 'vitest';
import type { Feature } from '../../src/match/types.ts';
import type { Interpretation, Offset, WrittenDistance, WrittenHeading } from '../../src/parse/types.ts';
import { georeference, type GeoreferenceInput } from '../../src/georef/georeference.ts';
import { regionalDatumBound } from '../../src/geodesy/unknown-datum.ts';
import type { Georeference } from '../../src/georef/types.ts';
import { wktPolygonAreaSquareMeters } from './wkt-area.ts';

// Independent reference for every point: geographiclib called directly (Karney 2013), not our wrappers.
const wgs84 = geographiclib.Geodesic.WGS84;
const directRef = (lat: number, lon: number, azimuth: number, meters: number) => {
  const r = wgs84.Direct(lat, lon, azimuth, meters);
  return { latitude: r.lat2!, longitude: r.lon2! };
};
const distanceRef = (lat1: number, lon1: number, lat2: number, lon2: number) => wgs84.Inverse(lat1, lon1, lat2, lon2).s12!;

// An invented region: places of the made-up province of Valdoria.
function feature(overrides: Partial<Feature> = {}): Feature {
  return {
    sourceId: 'valdoria-gaz',
    featureId: 'f1',
    name: 'Puerto Lindo',
    alternateNames: [],
    featureType: 'town',
    countryCode: 'QV',
    stateProvince: 'Valdoria',
    county: null,
    latitude: -12.5,
    longitude: -60.25,
    radiusMeters: 1500,
    radiusIsDefault: false,
    geometryType: 'Point',
    ...overrides,
  };
}
function interpretation(type: Interpretation['type'], overrides: Partial<Interpretation> = {}): Interpretation {
  return { verbatim: 'text', clauses: [], chosenClause: 0, type, features: ['Puerto Lindo'], offsets: [], approximate: false, administrative: {}, otherClauses: [], notes: [], ...overrides };
}
function km(value: number, uncertainty: number): WrittenDistance {
  return { written: `${value} km`, value, unit: 'km', precision: 2 * uncertainty, uncertainty, meters: value * 1000, uncertaintyMeters: uncertainty * 1000 };
}
function heading(written: string, azimuth: number, halfWidth: number): WrittenHeading {
  return { written, azimuth, halfWidth, kind: halfWidth === 45 ? 'rose4' : halfWidth === 22.5 ? 'rose8' : 'rose16' };
}
function ok(input: GeoreferenceInput): Georeference {
  const outcome = georeference(input);
  if (!outcome.ok) throw new Error(`expected a georeference, got: ${outcome.reason}`);
  return outcome.georeference;
}
const sum = (g: Georeference) => Object.values(g.components).reduce((a, b) => a + b, 0);

describe('named place (docs/method.md §3: c, r_f + base)', () => {
  it('is the corrected center with radius r_f, and a default radial is named in the remarks', () => {
    const g = ok({ interpretation: interpretation('named-place'), features: [feature({ radiusIsDefault: true, radiusMeters: 5000 })] });
    expect([g.latitude, g.longitude]).toEqual([-12.5, -60.25]);
    expect(g.components).toEqual({ extent: 5000, offset: 0, coordinatePrecision: 0, datum: 0, mapScale: 0, measurement: 0 });
    expect(g.uncertaintyMeters).toBe(5000);
    expect(g.remarks.join('\n')).toMatch(/default radial 5000 m for a town point.*docs\/method\.md §4/);
    expect(g.footprintWKT.startsWith('POLYGON((')).toBe(true);
    expect(g.features).toEqual([{ sourceId: 'valdoria-gaz', featureId: 'f1', name: 'Puerto Lindo' }]);
  });
});

describe('offset at a heading (docs/method.md §3, §5.2)', () => {
  const offsets: Offset[] = [{ distance: km(10, 0.5), heading: heading('NE', 45, 22.5), byAir: true }];
  it('10 km NE, δ 0.5 km: geodesic direct from the center; offset term 4.029 km (docs/method.md §5.2 derived check)', () => {
    const g = ok({ interpretation: interpretation('offset-heading', { offsets }), features: [feature()] });
    const expected = directRef(-12.5, -60.25, 45, 10000);
    expect(g.latitude).toBeCloseTo(expected.latitude, 9);
    expect(g.longitude).toBeCloseTo(expected.longitude, 9);
    expect(g.components.offset).toBeCloseTo(4029, 0);
    expect(g.uncertaintyMeters).toBeCloseTo(1500 + 4029, 0);
    expect(g.remarks.join('\n')).toMatch(/"10 km".*"NE"/);
  });
});

describe('two orthogonal offsets (docs/method.md §3)', () => {
  it('3 km N then 2 km E: moved north then east; offset term sqrt(δx² + δy²)', () => {
    const offsets: Offset[] = [
      { distance: km(3, 0.5), heading: heading('N', 0, 45) },
      { distance: km(2, 0.5), heading: heading('E', 90, 45) },
    ];
    const g = ok({ interpretation: interpretation('offset-orthogonal', { offsets }), features: [feature()] });
    const north = directRef(-12.5, -60.25, 0, 3000);
    const expected = directRef(north.latitude, north.longitude, 90, 2000);
    expect(g.latitude).toBeCloseTo(expected.latitude, 9);
    expect(g.longitude).toBeCloseTo(expected.longitude, 9);
    expect(g.components.offset).toBeCloseTo(Math.hypot(500, 500), 6);
  });
  it('refuses two offsets that are not one N/S and one E/W', () => {
    const offsets: Offset[] = [
      { distance: km(3, 0.5), heading: heading('NE', 45, 22.5) },
      { distance: km(2, 0.5), heading: heading('E', 90, 45) },
    ];
    const outcome = georeference({ interpretation: interpretation('offset-orthogonal', { offsets }), features: [feature()] });
    expect(outcome).toMatchObject({ ok: false, reason: expect.stringMatching(/due north or south/) });
  });
});

describe('distance only (docs/method.md §3 [CHOICE])', () => {
  it('5 km from X, δ 0.5 km: point c, offset term d + δ = 5.5 km', () => {
    const g = ok({ interpretation: interpretation('distance-only', { offsets: [{ distance: km(5, 0.5) }] }), features: [feature()] });
    expect([g.latitude, g.longitude]).toEqual([-12.5, -60.25]);
    expect(g.components.offset).toBe(5500);
    expect(g.remarks.join('\n')).toMatch(/\[CHOICE\] \(docs\/method\.md §3\)/);
  });
});

describe('a distance written with no unit ([CHOICE] unitlessDistanceUnits, docs/method.md §5.1 range rule)', () => {
  // "0.5 NW of X": read between 0.5 km and 0.5 mi (international mile 1609.344 m, 1959 agreement).
  it('takes the midpoint of the km and mi readings, with δ covering both plus the written δ in miles', () => {
    const written: WrittenDistance = { written: '0.5', value: 0.5, unit: 'mi', precision: 0.5, uncertainty: 0.25, meters: 804.672, uncertaintyMeters: 402.336, unitAssumed: true };
    const g = ok({ interpretation: interpretation('offset-heading', { offsets: [{ distance: written, heading: heading('NW', 315, 22.5) }] }), features: [feature()] });
    const d = 0.5 * (1000 + 1609.344) / 2; // 652.336 m
    const delta = 0.5 * (1609.344 - 1000) / 2 + 0.25 * 1609.344; // 152.336 + 402.336 m
    const end = directRef(-12.5, -60.25, 315, d);
    expect(g.latitude).toBeCloseTo(end.latitude, 9);
    expect(g.longitude).toBeCloseTo(end.longitude, 9);
    // Offset term of docs/method.md §5.2 with d and δ as above: it reaches both the 0.5 km and the 0.5 mi reading.
    const far = d + delta;
    const term = Math.sqrt(far ** 2 + d ** 2 - 2 * d * far * Math.cos((22.5 * Math.PI) / 180));
    expect(g.components.offset).toBeCloseTo(term, 6);
    expect(d + delta).toBeGreaterThanOrEqual(804.672);
    expect(d - delta).toBeLessThanOrEqual(500);
    expect(g.remarks.join('\n')).toMatch(/no unit.*\[CHOICE unitlessDistanceUnits\]/);
  });

  it('refuses, by name, units that are not two distance units smaller first', () => {
    const written: WrittenDistance = { written: '2', value: 2, unit: 'mi', precision: 1, uncertainty: 0.5, meters: 3218.688, uncertaintyMeters: 804.672, unitAssumed: true };
    const outcome = georeference({ interpretation: interpretation('distance-only', { offsets: [{ distance: written }] }), features: [feature()], options: { unitlessDistanceUnits: 'mi km' } });
    expect(outcome).toEqual({ ok: false, reason: expect.stringMatching(/unitlessDistanceUnits must be two distance units, smaller first/) });
  });
});

describe('along a path (docs/method.md §3)', () => {
  // A road along the equator through the town, 0.5° each way.
  const town = feature({ latitude: 0, longitude: 10, radiusMeters: 1000 });
  const road = feature({ featureId: 'r7', name: 'Ruta 7', featureType: 'road', geometryType: 'LineString', geometry: { type: 'LineString', coordinates: [[9.5, 0], [9.8, 0], [10, 0], [10.2, 0], [10.5, 0]] } });
  const byRoad = (withHeading?: WrittenHeading): Offset => ({ distance: km(10, 0.5), heading: withHeading, path: { mode: 'road', lineName: 'Ruta 7', written: 'by road' } });

  it('follows the line 10 km from where it leaves the extent circle, in the direction of the heading', () => {
    const g = ok({ interpretation: interpretation('offset-path', { offsets: [byRoad(heading('E', 90, 45))] }), features: [town], pathLine: road });
    // Along the equator the geodesic is the equator: 1 km to the circle, then 10 km on (geographiclib).
    const expected = directRef(0, 10, 90, 11000);
    expect(g.latitude).toBeCloseTo(0, 9);
    expect(g.longitude).toBeCloseTo(expected.longitude, 7);
    expect(g.components).toMatchObject({ extent: 1000, offset: 500 });
    expect(g.features.map((f) => f.featureId)).toEqual(['f1', 'r7']);
  });

  it('with two ways out and no heading, falls back to c and r_f + d + δ with a remark', () => {
    const g = ok({ interpretation: interpretation('offset-path', { offsets: [byRoad()] }), features: [town], pathLine: road });
    expect([g.latitude, g.longitude]).toEqual([0, 10]);
    expect(g.components.offset).toBe(10500);
    expect(g.remarks.join('\n')).toMatch(/leaves the feature in 2 directions.*\[CHOICE\]/);
  });

  it('with no line in the gazetteer, falls back with a remark', () => {
    const g = ok({ interpretation: interpretation('offset-path', { offsets: [byRoad()] }), features: [town] });
    expect(g.components.offset).toBe(10500);
    expect(g.remarks.join('\n')).toMatch(/no line for "Ruta 7"/);
  });
});

describe('heading only (docs/method.md §3 [CHOICE])', () => {
  const unit = feature({
    featureId: 'c1',
    name: 'Condado Alto',
    featureType: 'county',
    latitude: 0,
    longitude: 0,
    radiusMeters: 78715,
    geometryType: 'Polygon',
    geometry: { type: 'Polygon', coordinates: [[[-0.5, -0.5], [0.5, -0.5], [0.5, 0.5], [-0.5, 0.5], [-0.5, -0.5]]] },
  });
  const north: Offset = { heading: heading('N', 0, 45) };
  const village = feature({ latitude: 0, longitude: 0, radiusMeters: 500 });

  it('is not georeferenced without a bounding unit', () => {
    const outcome = georeference({ interpretation: interpretation('heading-only', { offsets: [north] }), features: [village] });
    expect(outcome).toMatchObject({ ok: false, reason: expect.stringMatching(/no bounding unit/) });
  });

  it('with a unit: the center and radial of the part of the unit inside the sector', () => {
    const g = ok({ interpretation: interpretation('heading-only', { offsets: [north] }), features: [village], boundingUnit: unit });
    // The part is nearly the right triangle (0,0), (±0.5°, 0.5°): its smallest enclosing circle has the
    // hypotenuse as diameter (plane geometry), center (0, 0.5°), radius ≈ 0.5° of longitude at 0.5°N;
    // on the ellipsoid the 45° geodesics miss the corners slightly, so within 1 %.
    expect(g.latitude).toBeCloseTo(0.5, 2);
    expect(g.longitude).toBeCloseTo(0, 6);
    expect(Math.abs(g.components.extent / distanceRef(0.5, 0, 0.5, 0.5) - 1)).toBeLessThan(0.01);
    expect(g.footprintWKT.startsWith('POLYGON((')).toBe(true);
    expect(g.features.map((f) => f.featureId)).toContain('c1');
  });

  it('"due N" (Δ = 0) gives the stretch of the meridian inside the unit: center 0.25°N, radial 0.25° of latitude', () => {
    const g = ok({ interpretation: interpretation('heading-only', { offsets: [{ heading: { written: 'due N', azimuth: 0, halfWidth: 0, kind: 'due' } }] }), features: [village], boundingUnit: unit });
    expect(g.latitude).toBeCloseTo(0.25, 3);
    expect(g.components.extent / distanceRef(0, 0, 0.25, 0)).toBeCloseTo(1, 2);
  });
});

describe('between (docs/method.md §3 [CHOICE])', () => {
  it('midpoint of the geodesic joining the centers; radius D/2 + max(r_f)', () => {
    const a = feature({ latitude: -12, longitude: -60, radiusMeters: 800 });
    const b = feature({ featureId: 'f2', name: 'Santa Inés', latitude: -12.3, longitude: -60.4, radiusMeters: 2000 });
    const g = ok({ interpretation: interpretation('between', { features: ['Puerto Lindo', 'Santa Inés'] }), features: [a, b] });
    const D = distanceRef(-12, -60, -12.3, -60.4);
    expect(distanceRef(g.latitude, g.longitude, -12, -60)).toBeCloseTo(D / 2, 4);
    expect(distanceRef(g.latitude, g.longitude, -12.3, -60.4)).toBeCloseTo(D / 2, 4);
    expect(g.components).toMatchObject({ extent: 2000 });
    expect(g.components.offset).toBeCloseTo(D / 2, 6);
  });
});

describe('near (docs/method.md §3 [CHOICE])', () => {
  it('r_f + max(r_f, 1 km), and the minimum is configurable', () => {
    const small = ok({ interpretation: interpretation('near'), features: [feature({ radiusMeters: 300 })] });
    expect(small.uncertaintyMeters).toBe(1300);
    const large = ok({ interpretation: interpretation('near'), features: [feature({ radiusMeters: 2000 })] });
    expect(large.uncertaintyMeters).toBe(4000);
    const configured = ok({ interpretation: interpretation('near'), features: [feature({ radiusMeters: 300 })], options: { nearMinimumMeters: 5000 } });
    expect(configured.uncertaintyMeters).toBe(5300);
  });
});

describe('junction (docs/method.md §3 [CHOICE])', () => {
  const river = feature({ featureId: 'w1', name: 'Río Claro', featureType: 'river', geometryType: 'LineString', geometry: { type: 'LineString', coordinates: [[-60.5, -12.5], [-60, -12.5]] } });
  const road = feature({ featureId: 'r1', name: 'Ruta 3', featureType: 'road', geometryType: 'LineString', geometry: { type: 'LineString', coordinates: [[-60.2, -13], [-60.2, -12]] } });
  it('is the crossing of the two lines, with the junction extent 100 m', () => {
    const g = ok({ interpretation: interpretation('junction', { features: ['Río Claro', 'Ruta 3'] }), features: [river, road] });
    expect(g.latitude).toBeCloseTo(-12.5, 7);
    expect(g.longitude).toBeCloseTo(-60.2, 7);
    expect(g.components.extent).toBeCloseTo(100, 6);
  });
  it('finds a crossing on the antimeridian', () => {
    const east = feature({ ...river, longitude: 179.95, latitude: -17, geometry: { type: 'LineString', coordinates: [[179.9, -17], [-179.9, -17]] } });
    const meridian = feature({ ...road, geometry: { type: 'LineString', coordinates: [[-180, -17.5], [-180, -16.5]] } });
    const g = ok({ interpretation: interpretation('junction'), features: [east, meridian] });
    expect(Math.abs(g.longitude)).toBeCloseTo(180, 7);
    expect(g.latitude).toBeCloseTo(-17, 7);
  });
  it('refuses lines that do not meet', () => {
    const far = feature({ ...road, geometry: { type: 'LineString', coordinates: [[-59, -13], [-59, -12]] } });
    expect(georeference({ interpretation: interpretation('junction'), features: [river, far] })).toMatchObject({ ok: false, reason: expect.stringMatching(/do not meet/) });
  });
});

describe('coordinates (docs/method.md §3, §5.3, §5.4)', () => {
  const written = (datumWritten?: string, datum?: string) =>
    interpretation('coordinates', {
      features: [],
      coordinates: { written: '10.27, -123.6', latitude: 10.27, longitude: -123.6, format: 'decimal', precisionDegrees: 0.01, datum, datumWritten, problems: [] },
    });
  it('WGS84 stated: no shift, datum term 0, precision term 1556.8 m (docs/method.md §5.3 worked example)', () => {
    const g = ok({ interpretation: written('WGS84'), features: [] });
    expect([g.latitude, g.longitude]).toEqual([10.27, -123.6]);
    expect(g.components.datum).toBe(0);
    expect(g.components.coordinatePrecision).toBeCloseTo(1556.8, 0);
  });
  const inTheOpenPacific = (datumWritten?: string, datum?: string) => {
    const i = written(datumWritten, datum);
    i.coordinates = { ...i.coordinates!, latitude: -45.2, longitude: -131.4 };
    return i;
  };
  it('datum not recorded where only world-wide datums apply: 5359 m (docs/method.md §5.4) and a remark', () => {
    const g = ok({ interpretation: inTheOpenPacific(), features: [] });
    expect(g.components.datum).toBe(5359);
    expect(g.remarks.join('\n')).toMatch(/datum not recorded.*5359 m, no regional datum applies here.*§5\.4/);
  });
  it('datum not recorded inside NAD27\'s area of use: the regional bound, the datums compared named (Chapman & Wieczorek 2020, §Uncertainty from Unknown Datum)', () => {
    const g = ok({ interpretation: written(), features: [] });
    const bound = regionalDatumBound({ latitude: 10.27, longitude: -123.6 })!;
    expect(bound.datums).toEqual(['EPSG:4326', 'EPSG:4267', 'EPSG:4322']);
    expect(g.components.datum).toBe(bound.meters);
    expect(g.components.datum).toBeLessThan(5359);
    expect(g.remarks.join('\n')).toMatch(/datum not recorded.*EPSG:4326, EPSG:4267, EPSG:4322\) \[CHOICE\]; their transformations' stated accuracies \(at most 10 m\) are not added \(docs\/method\.md §5\.4\)/);
  });
  it('the regional bound never exceeds the unknown-datum figure in force: above it, that figure is used', () => {
    const bound = regionalDatumBound({ latitude: 10.27, longitude: -123.6 })!;
    const capped = ok({ interpretation: written(), features: [], options: { unknownDatumMeters: Math.floor(bound.meters / 2) } });
    expect(capped.components.datum).toBe(Math.floor(bound.meters / 2));
  });
  it('NAD27 written: shifted to WGS84 by EPSG:1173, the transformation accuracy as datum term', () => {
    const g = ok({ interpretation: written('NAD 27'), features: [] });
    // Expected point from a second implementation: the geodesy package's Helmert shift (Veness, MIT) with the
    // translations of EPSG:1173 "NAD27 to WGS 84 (4)" (−8, +160, +176 m; geodesy stores them WGS84 → NAD27,
    // hence the reversed signs). Within 1 mm: both convert through geocentric coordinates exactly.
    const expected = new LatLon(10.27, -123.6, 0, { ...LatLon.datums.NAD27!, transform: [8, -160, -176, 0, 0, 0, 0] }).convertDatum(LatLon.datums.WGS84!);
    expect(distanceRef(expected.lat, expected.lon, g.latitude, g.longitude)).toBeLessThan(0.001);
    expect(g.components.datum).toBe(10);
    expect(g.remarks.join('\n')).toMatch(/EPSG:4267.*EPSG:1173/);
  });
  it('a datum stated outside its EPSG area of use is doubtful: the unknown-datum term, with a remark', () => {
    const inBrazil = written('NAD27');
    inBrazil.coordinates = { ...inBrazil.coordinates!, latitude: -15.8, longitude: -47.9 };
    const g = ok({ interpretation: inBrazil, features: [] });
    expect(g.components.datum).toBe(5359);
    expect(g.remarks.join('\n')).toMatch(/outside its EPSG area of use/);
  });
  it('a datum code we cannot convert counts as not recorded, named in the remarks', () => {
    const g = ok({ interpretation: inTheOpenPacific(undefined, 'EPSG:4019'), features: [] });
    expect(g.components.datum).toBe(5359);
    expect(g.remarks.join('\n')).toMatch(/"EPSG:4019" is not one we can convert/);
  });
  it('the record\'s datum option is used when the text states none', () => {
    expect(ok({ interpretation: written(), features: [], options: { datum: 'EPSG:4326' } }).components.datum).toBe(0);
  });
  it('flagged coordinates are not georeferenced', () => {
    const flagged = written('WGS84');
    flagged.coordinates!.problems = ['latitude and longitude look swapped'];
    expect(georeference({ interpretation: flagged, features: [] })).toMatchObject({ ok: false, reason: expect.stringMatching(/swapped/) });
  });
  it('map scale and measurement error are separate components (docs/method.md §5.5)', () => {
    const g = ok({ interpretation: written('WGS84'), features: [], options: { mapScale: 24000, mapStandard: 'us-nmas', measurementErrorMeters: 20 } });
    expect(g.components.mapScale).toBeCloseTo(36.192, 6);
    expect(g.components.measurement).toBe(20);
    // The total from the published terms, not the answer's own re-added: precision 1556.8 m (§5.3 worked
    // example, 0.01° at 10.27° N), datum 0 (WGS84 stated), map 36.192 m (US NMAS 1947 + 1 mm), measurement 20 m.
    const total = 1556.8 + 0 + 36.192 + 20;
    expect(Math.abs(g.uncertaintyMeters - total)).toBeLessThanOrEqual(0.005 * total);
    expect(g.uncertaintyMeters).toBeCloseTo(sum(g), 9);
  });
});

describe('no georeference', () => {
  it('no locality: refused with the interpretation\'s reason', () => {
    expect(georeference({ interpretation: interpretation('no-locality', { reason: 'locality unknown' }), features: [] })).toEqual({ ok: false, reason: 'locality unknown' });
  });
  it('an unusable offset is refused, not thrown', () => {
    const bad: Offset[] = [{ distance: { ...km(10, 0.5), meters: Number.NaN }, heading: heading('NE', 45, 22.5) }];
    expect(georeference({ interpretation: interpretation('offset-heading', { offsets: bad }), features: [feature()] })).toMatchObject({ ok: false, reason: expect.stringMatching(/cannot be used/) });
  });
  it('a bad option is refused by name', () => {
    expect(georeference({ interpretation: interpretation('near'), features: [feature()], options: { nearMinimumMeters: -5 } })).toMatchObject({ ok: false, reason: expect.stringMatching(/nearMinimumMeters/) });
    expect(georeference({ interpretation: interpretation('near'), features: [feature()], options: { mapScale: 0.5 } })).toMatchObject({ ok: false, reason: expect.stringMatching(/mapScale/) });
  });
  it('a feature missing for the rule is a clear refusal', () => {
    expect(georeference({ interpretation: interpretation('named-place'), features: [] })).toMatchObject({ ok: false, reason: expect.stringMatching(/needs feature 1/) });
  });
});

describe('bounding unit clips the footprint (docs/method.md §6)', () => {
  const unit = feature({ featureId: 'c2', name: 'Condado Bajo', featureType: 'county', geometryType: 'Polygon', geometry: { type: 'Polygon', coordinates: [[[-60.25, -13], [-59.5, -13], [-59.5, -12], [-60.25, -12], [-60.25, -13]]] } });
  it('a circle on the unit edge keeps about half its area', () => {
    const g = ok({ interpretation: interpretation('named-place'), features: [feature({ radiusMeters: 3000 })], boundingUnit: unit });
    expect(wktPolygonAreaSquareMeters(g.footprintWKT) / (Math.PI * 3000 ** 2)).toBeCloseTo(0.5, 2);
  });
  it('a circle wholly outside the unit is a contradiction: refused', () => {
    const outcome = georeference({ interpretation: interpretation('named-place'), features: [feature({ longitude: -61, radiusMeters: 3000 })], boundingUnit: unit });
    expect(outcome).toMatchObject({ ok: false, reason: expect.stringMatching(/outside the bounding unit/) });
  });
});

describe('properties (fast-check)', () => {
  const anyOffset = fc.record({
    d: fc.double({ min: 0, max: 200_000, noNaN: true }),
    delta: fc.double({ min: 0, max: 5_000, noNaN: true }),
    halfWidth: fc.constantFrom(0, 0.5, 5.625, 11.25, 22.5, 45),
    azimuth: fc.double({ min: 0, max: 359.99, noNaN: true }),
    radius: fc.double({ min: 0, max: 50_000, noNaN: true }),
    type: fc.constantFrom('offset-heading' as const, 'distance-only' as const, 'offset-path' as const, 'near' as const, 'named-place' as const),
  });
  const run = (o: { d: number; delta: number; halfWidth: number; azimuth: number; radius: number; type: Interpretation['type'] }) => {
    const distance: WrittenDistance = { written: `${o.d} m`, value: o.d, unit: 'm', precision: 2 * o.delta, uncertainty: o.delta, meters: o.d, uncertaintyMeters: o.delta };
    const offsets: Offset[] = [{ distance, heading: o.type === 'offset-heading' ? heading('x', o.azimuth, o.halfWidth) : undefined }];
    return ok({ interpretation: interpretation(o.type, { offsets }), features: [feature({ radiusMeters: o.radius })] });
  };
  it('the radius is never smaller than any single component, and is their sum (docs/method.md §5.6)', () => {
    fc.assert(
      fc.property(anyOffset, (o) => {
        const g = run(o);
        for (const value of Object.values(g.components)) expect(g.uncertaintyMeters).toBeGreaterThanOrEqual(value);
        expect(g.uncertaintyMeters).toBeCloseTo(sum(g), 6);
      }),
      { numRuns: 200 },
    );
  });
  it('growing the stated distance never shrinks the radius', () => {
    fc.assert(
      fc.property(anyOffset, fc.double({ min: 0, max: 100_000, noNaN: true }), (o, more) => {
        expect(run({ ...o, d: o.d + more }).uncertaintyMeters).toBeGreaterThanOrEqual(run(o).uncertaintyMeters - 1e-6);
      }),
      { numRuns: 200 },
    );
  });
  it('never throws: every input comes back as a georeference or a reason', () => {
    const types: Interpretation['type'][] = ['coordinates', 'named-place', 'offset-heading', 'offset-orthogonal', 'distance-only', 'offset-path', 'heading-only', 'between', 'near', 'junction', 'no-locality', 'unparseable'];
    fc.assert(
      fc.property(
        fc.constantFrom(...types),
        fc.array(fc.record({ latitude: fc.double({ min: -90, max: 90, noNaN: true }), longitude: fc.double({ min: -180, max: 180, noNaN: true }), radiusMeters: fc.double({ min: 0, max: 1e6, noNaN: true }) }), { maxLength: 3 }),
        fc.array(fc.record({ d: fc.double({ min: 0, max: 1e6, noNaN: true }), azimuth: fc.constantFrom(0, 45, 90, 180, 270, 333.3), halfWidth: fc.constantFrom(0, 11.25, 45) }), { maxLength: 2 }),
        (type, places, offsets) => {
          const outcome = georeference({
            interpretation: interpretation(type, {
              offsets: offsets.map((o) => ({ distance: { ...km(o.d / 1000, 0.5), meters: o.d }, heading: heading('h', o.azimuth, o.halfWidth) })),
              coordinates: { written: 'c', latitude: places[0]?.latitude ?? 0, longitude: places[0]?.longitude ?? 0, format: 'decimal', precisionDegrees: 0.001, problems: [] },
            }),
            features: places.map((p, i) => feature({ ...p, featureId: `p${i}` })),
          });
          expect(typeof outcome.ok).toBe('boolean');
          if (outcome.ok) expect(outcome.georeference.uncertaintyMeters).toBeGreaterThanOrEqual(0);
          else expect(outcome.reason.length).toBeGreaterThan(0);
        },
      ),
      { numRuns: 300 },
    );
  });
});
