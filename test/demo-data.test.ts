/**
 * Checks the bundled demo data (gazetteer/) against open standards and reference libraries: GeoJSON per
 * RFC 7946, the gazetteer and batch CSV contracts, topology with @turf/turf, and its distance from every
 * real coast against Natural Earth land (world-atlas).
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import * as turf from '@turf/turf';
import { parse } from 'csv-parse/sync';
import geographiclib from 'geographiclib-geodesic';
import type { Feature, FeatureCollection, Geometry, MultiPolygon, Point, Polygon, Position } from 'geojson';
import { feature as topoFeature } from 'topojson-client';
import type { Topology } from 'topojson-specification';
import { describe, expect, it } from 'vitest';

const GAZETTEER_DIR = fileURLToPath(new URL('../gazetteer/', import.meta.url));
const read = (name: string): string => readFileSync(join(GAZETTEER_DIR, name), 'utf8');
const collection = JSON.parse(read('demo.geojson')) as FeatureCollection<Geometry>;
const features = collection.features;
const props = (f: Feature) => f.properties as Record<string, string | number | undefined>;
const ofType = (type: string) => features.filter((f) => props(f).featureType === type);

// The feature-type vocabulary the demo data may use (the project's own list, from the task brief).
const VOCABULARY = new Set(['city', 'town', 'village', 'hamlet', 'locality', 'farm', 'estate', 'station', 'bridge', 'island', 'mountain', 'peak', 'hill', 'pass', 'lake', 'bay', 'cape', 'beach', 'waterfall', 'river', 'stream', 'river mouth', 'road', 'trail', 'country', 'stateProvince', 'county']);
const SETTLEMENT_TYPES = new Set(['city', 'town', 'village', 'hamlet', 'locality']);

const allPositions = (g: Geometry): Position[] => turf.coordAll(g);

describe('demo.geojson follows RFC 7946', () => {
  it('is a FeatureCollection of Features with geometry and properties (RFC 7946 §3.2, §3.3)', () => {
    expect(collection.type).toBe('FeatureCollection');
    for (const f of features) {
      expect(f.type).toBe('Feature');
      expect(f.geometry).toBeTruthy();
      expect(typeof f.properties).toBe('object');
    }
  });

  it('gives every position as [longitude, latitude] in range (RFC 7946 §3.1.1, §4)', () => {
    for (const f of features)
      for (const p of allPositions(f.geometry)) {
        expect(p).toHaveLength(2);
        const [lon, lat] = p as [number, number];
        expect(Number.isFinite(lon) && Number.isFinite(lat)).toBe(true);
        expect(Math.abs(lon)).toBeLessThanOrEqual(180);
        expect(Math.abs(lat)).toBeLessThanOrEqual(90);
        // The island sits near 45.5° S 131° W: a swapped pair would put the latitude far outside this band.
        expect(lat).toBeGreaterThan(-47);
        expect(lat).toBeLessThan(-44);
        expect(lon).toBeGreaterThan(-133);
        expect(lon).toBeLessThan(-129);
      }
  });

  it('closes every ring, with at least four positions, exterior rings counter-clockwise (RFC 7946 §3.1.6)', () => {
    for (const f of features.filter((x) => x.geometry.type === 'Polygon')) {
      for (const [i, ring] of (f.geometry as Polygon).coordinates.entries()) {
        expect(ring.length).toBeGreaterThanOrEqual(4);
        expect(ring[0]).toEqual(ring[ring.length - 1]);
        // Right-hand rule: exterior counter-clockwise, holes clockwise (RFC 7946 §3.1.6).
        expect(turf.booleanClockwise(ring), `${props(f).name} ring ${i}`).toBe(i > 0);
      }
    }
  });

  it('has no self-intersecting polygon rings (OGC Simple Features 06-103r4 §6.1.11.1, from memory)', () => {
    for (const f of features.filter((x) => x.geometry.type === 'Polygon'))
      expect(turf.kinks(f as Feature<Polygon>).features, String(props(f).name)).toHaveLength(0);
  });

  it('gives every line at least two positions (RFC 7946 §3.1.4)', () => {
    for (const f of features) {
      const g = f.geometry;
      const parts = g.type === 'LineString' ? [g.coordinates] : g.type === 'MultiLineString' ? g.coordinates : [];
      for (const part of parts) expect(part.length).toBeGreaterThanOrEqual(2);
    }
  });
});

describe('demo.geojson properties follow the gazetteer contract', () => {
  it('has unique, stable-looking ids and a name for every feature', () => {
    const ids = features.map((f) => props(f).id);
    expect(new Set(ids).size).toBe(ids.length);
    for (const f of features) {
      expect(String(props(f).id)).toMatch(/^qv-\d{4}$/);
      expect(String(props(f).name).trim()).not.toBe('');
    }
  });

  it('uses only the feature-type vocabulary', () => {
    for (const f of features) expect(VOCABULARY.has(String(props(f).featureType)), String(props(f).featureType)).toBe(true);
  });

  it('uses QV, a user-assigned ISO 3166-1 alpha-2 code (QM to QZ are user-assigned; ISO 3166-1:2020 §8.1.3, from memory)', () => {
    for (const f of features) expect(props(f).countryCode).toBe('QV');
  });

  it('gives alternateNames as a |-separated string without empty parts, and radiusMeters as a positive number', () => {
    for (const f of features) {
      const alt = props(f).alternateNames;
      if (alt !== undefined) {
        expect(typeof alt).toBe('string');
        for (const part of String(alt).split('|')) expect(part.trim()).not.toBe('');
      }
      const r = props(f).radiusMeters;
      if (r !== undefined) expect(typeof r === 'number' && r > 0).toBe(true);
    }
  });

  it('holds what the demo needs: 2–3 provinces, 6–9 counties, about a hundred settlements, lines of both kinds', () => {
    expect(ofType('country')).toHaveLength(1);
    expect(ofType('stateProvince').length).toBeGreaterThanOrEqual(2);
    expect(ofType('stateProvince').length).toBeLessThanOrEqual(3);
    expect(ofType('county').length).toBeGreaterThanOrEqual(6);
    expect(ofType('county').length).toBeLessThanOrEqual(9);
    expect(features.filter((f) => SETTLEMENT_TYPES.has(String(props(f).featureType))).length).toBeGreaterThanOrEqual(95);
    expect(features.some((f) => f.geometry.type === 'LineString')).toBe(true);
    expect(features.some((f) => f.geometry.type === 'MultiLineString')).toBe(true);
    expect(ofType('lake').every((f) => f.geometry.type === 'Polygon')).toBe(true);
    expect(ofType('island').every((f) => f.geometry.type === 'Polygon')).toBe(true);
  });

  it('shares some names between provinces, so ambiguity can be shown', () => {
    const provincesByName = new Map<string, Set<string>>();
    for (const f of features.filter((x) => x.geometry.type === 'Point')) {
      const set = provincesByName.get(String(props(f).name)) ?? new Set();
      set.add(String(props(f).stateProvince));
      provincesByName.set(String(props(f).name), set);
    }
    const shared = [...provincesByName].filter(([, set]) => set.size > 1).map(([name]) => name);
    expect(shared).toEqual(expect.arrayContaining(['San Telmo', 'Santa Rosa', 'Bellevue']));
  });

  it('gives counties and provinces names no other feature has, except Rio Fundo (town, river and county, on purpose)', () => {
    const units = features.filter((f) => ['county', 'stateProvince'].includes(String(props(f).featureType)));
    for (const unit of units) {
      const others = features.filter((f) => f !== unit && props(f).name === props(unit).name && !['county', 'stateProvince'].includes(String(props(f).featureType)));
      expect(others.length, String(props(unit).name)).toBe(props(unit).name === 'Rio Fundo' ? 2 : 0);
    }
  });
});

describe('demo.geojson topology', () => {
  const island = ofType('country')[0] as Feature<Polygon>;
  const counties = ofType('county') as Feature<Polygon>[];
  const provinces = ofType('stateProvince') as Feature<Polygon>[];

  it('puts every point inside the island and inside the county and province its properties name', () => {
    for (const f of features.filter((x) => x.geometry.type === 'Point')) {
      const p = (f.geometry as Point).coordinates;
      const name = String(props(f).name);
      expect(turf.booleanPointInPolygon(p, island), name).toBe(true);
      const county = counties.find((c) => props(c).name === props(f).county);
      expect(county, `${name}: county ${props(f).county}`).toBeDefined();
      expect(turf.booleanPointInPolygon(p, county!), `${name} in ${props(f).county}`).toBe(true);
      expect(props(county!).stateProvince, name).toBe(props(f).stateProvince);
      const province = provinces.find((c) => props(c).name === props(f).stateProvince)!;
      expect(turf.booleanPointInPolygon(p, province), `${name} in ${props(f).stateProvince}`).toBe(true);
    }
  });

  // Tiling: the union's area equals the sum of the parts (no overlap) and the island's area (no gap).
  // Areas with turf.area (spherical, Chamberlain & Duquette 2007, from memory); a 0.1 % tolerance is common practice, no source.
  function expectTiling(parts: Feature<Polygon>[], label: string): void {
    const sum = parts.reduce((s, p) => s + turf.area(p), 0);
    const union = turf.union(turf.featureCollection(parts)) as Feature<Polygon | MultiPolygon>;
    expect(union.geometry.type, label).toBe('Polygon');
    const islandArea = turf.area(island);
    expect(Math.abs(turf.area(union) - sum) / sum, `${label}: overlap`).toBeLessThan(0.001);
    expect(Math.abs(turf.area(union) - islandArea) / islandArea, `${label}: gap`).toBeLessThan(0.001);
  }
  it('tiles the island with the counties, without gaps or overlaps', () => expectTiling(counties, 'counties'));
  it('tiles the island with the provinces, without gaps or overlaps', () => expectTiling(provinces, 'provinces'));

  it('measures about 150 × 100 km (geodesic, geographiclib)', () => {
    const [west, south, east, north] = turf.bbox(island);
    const wgs84 = geographiclib.Geodesic.WGS84;
    const mid = (south + north) / 2;
    const width = wgs84.Inverse(mid, west, mid, east).s12! / 1000;
    const height = wgs84.Inverse(south, -131, north, -131).s12! / 1000;
    expect(width).toBeGreaterThan(120);
    expect(width).toBeLessThan(180);
    expect(height).toBeGreaterThan(80);
    expect(height).toBeLessThan(120);
  });

  it('has a river confluence (a tributary ends on a vertex of another river) and roads crossing rivers', () => {
    const waters = features.filter((f) => ['river', 'stream'].includes(String(props(f).featureType)));
    const vertexKeys = (f: Feature) => new Set(allPositions(f.geometry).map((p) => p.join(',')));
    const confluences = waters.filter((t) => {
      const end = allPositions(t.geometry).at(-1)!.join(',');
      return waters.some((o) => o !== t && vertexKeys(o).has(end));
    });
    expect(confluences.length).toBeGreaterThanOrEqual(1);
    const roads = ofType('road');
    const crossings = roads.flatMap((r) => waters.flatMap((w) => turf.lineIntersect(r as Feature<never>, w as Feature<never>).features));
    expect(crossings.length).toBeGreaterThanOrEqual(1);
  });

  it('lies more than 1000 km from any real land (Natural Earth 1:10m land, via world-atlas 2.0.2; geodesic, geographiclib)', () => {
    const topology = JSON.parse(readFileSync(fileURLToPath(import.meta.resolve('world-atlas/land-10m.json')), 'utf8')) as Topology;
    const land = topoFeature(topology, topology.objects.land!) as unknown as FeatureCollection<Polygon | MultiPolygon>;
    const coast = island.geometry.coordinates[0]!;
    const wgs84 = geographiclib.Geodesic.WGS84;
    let nearest = Infinity;
    for (const f of land.features)
      for (const [lon, lat] of allPositions(f.geometry) as [number, number][]) {
        // One degree of latitude is more than 110 km everywhere, so a point 9.1° of latitude away is over 1000 km off.
        if (Math.abs(lat - -45.5) > 9.1) continue;
        for (const [clon, clat] of coast.filter((_, i) => i % 8 === 0) as [number, number][])
          nearest = Math.min(nearest, wgs84.Inverse(clat, clon, lat, lon).s12!);
      }
    expect(nearest).toBeGreaterThan(1_000_000);
  });
});

describe('demo-places.csv', () => {
  const rows = parse(read('demo-places.csv'), { columns: true }) as Record<string, string>[];
  it('has the gazetteer CSV header and one row per point feature, matching demo.geojson', () => {
    expect(read('demo-places.csv').split('\n')[0]).toBe('id,name,alternateNames,latitude,longitude,featureType,countryCode,stateProvince,county,radiusMeters');
    const points = features.filter((f) => f.geometry.type === 'Point');
    expect(rows).toHaveLength(points.length);
    for (const [i, f] of points.entries()) {
      const row = rows[i]!;
      const [lon, lat] = (f.geometry as Point).coordinates as [number, number];
      expect(row.id).toBe(props(f).id);
      expect(row.name).toBe(props(f).name);
      expect(Number(row.latitude)).toBe(lat);
      expect(Number(row.longitude)).toBe(lon);
      expect(row.county).toBe(props(f).county);
      expect(row.radiusMeters).toBe(props(f).radiusMeters === undefined ? '' : String(props(f).radiusMeters));
    }
  });
});

describe('demo-localities.csv', () => {
  const text = read('demo-localities.csv');
  const rows = parse(text, { columns: true }) as Record<string, string>[];
  const intent = JSON.parse(read('demo-localities.intent.json')) as { occurrenceID: string; locality: string; form: string; places: string[]; absent: string[] }[];
  const known = new Set(features.flatMap((f) => [String(props(f).name), ...String(props(f).alternateNames ?? '').split('|').filter(Boolean)]));

  it('has a header of Darwin Core term names (TDWG Darwin Core terms list, CC BY 4.0)', () => {
    const terms = new Set(
      readFileSync(new URL('./fixtures/darwin-core-terms.txt', import.meta.url), 'utf8')
        .split('\n')
        .map((l) => l.trim())
        .filter((l) => l && !l.startsWith('#')),
    );
    for (const column of Object.keys(rows[0]!)) expect(terms.has(column), column).toBe(true);
    expect(Object.keys(rows[0]!)).toContain('locality');
  });

  it('has about fifty rows, each with its intent, in the same order', () => {
    expect(rows.length).toBeGreaterThanOrEqual(45);
    expect(rows.map((r) => r.occurrenceID)).toEqual(intent.map((i) => i.occurrenceID));
    expect(rows.map((r) => r.locality)).toEqual(intent.map((i) => i.locality));
  });

  it('names only places that exist, except those meant to be absent', () => {
    for (const row of intent) {
      for (const name of row.places) expect(known.has(name), `${row.occurrenceID}: ${name}`).toBe(true);
      for (const name of row.absent) expect(known.has(name), `${row.occurrenceID}: ${name} should be absent`).toBe(false);
    }
  });

  it('spells the misspelt name one edit away from a real one (Levenshtein 1966 distance)', () => {
    const editDistance = (a: string, b: string): number => {
      const d = Array.from({ length: a.length + 1 }, (_, i) => [i, ...Array<number>(b.length).fill(0)]);
      for (let j = 1; j <= b.length; j++) d[0]![j] = j;
      for (let i = 1; i <= a.length; i++)
        for (let j = 1; j <= b.length; j++) d[i]![j] = Math.min(d[i - 1]![j]! + 1, d[i]![j - 1]! + 1, d[i - 1]![j - 1]! + (a[i - 1] === b[j - 1] ? 0 : 1));
      return d[a.length]![b.length]!;
    };
    const typo = intent.find((i) => i.form.startsWith('misspelt'))!;
    expect(editDistance(typo.absent[0]!, typo.places[0]!)).toBe(1);
  });

  it('covers the cases the demo shows: duplicates, an empty locality, quoted commas, bad existing coordinates', () => {
    const localities = rows.map((r) => r.locality);
    expect(localities.length - new Set(localities).size).toBeGreaterThanOrEqual(2);
    expect(localities).toContain('');
    expect(text).toContain('"Millbrook, 5 km S"');
    const withCoordinates = rows.filter((r) => r.decimalLatitude !== '');
    expect(withCoordinates.some((r) => Number(r.decimalLatitude) === 0 && Number(r.decimalLongitude) === 0)).toBe(true);
    expect(withCoordinates.some((r) => Math.abs(Number(r.decimalLatitude)) > 90)).toBe(true); // swapped
    expect(withCoordinates.some((r) => Number(r.decimalLongitude) > 0)).toBe(true); // sign inverted
  });
});

describe('the demo files', () => {
  it('are regenerated byte for byte by gazetteer/generate-demo.ts', () => {
    const scratch = mkdtempSync(join(tmpdir(), 'qv-demo-'));
    execFileSync(process.execPath, ['--import', 'tsx', join(GAZETTEER_DIR, 'generate-demo.ts')], { env: { ...process.env, DEMO_OUT_DIR: scratch } });
    for (const name of ['demo.geojson', 'demo-places.csv', 'demo-localities.csv', 'demo-localities.intent.json'])
      expect(readFileSync(join(scratch, name), 'utf8'), name).toBe(read(name));
  }, 60_000);

  it('stay under 1 MB together', () => {
    const total = ['demo.geojson', 'demo-places.csv', 'demo-localities.csv', 'demo-localities.intent.json'].reduce((s, n) => s + statSync(join(GAZETTEER_DIR, n)).size, 0);
    expect(total).toBeLessThan(1_000_000);
  });
});
