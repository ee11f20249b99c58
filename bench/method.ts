/**
 * Method core benchmark: corrected center and radial (featureExtent) of seeded synthetic polygons of
 * BENCH_VERTICES vertices each (a comma list, default "50,500,5000"; wavy, concave rings a few tens of km
 * across) and of lines, then georeference() of offset-heading and named-place interpretations. Prints
 * features/s and georeferences/s, and the machine's load before and after. The importer computes featureExtent once per polygon, so thousands of
 * polygons of a few hundred vertices should take seconds. Run: `npm run bench:method`.
 */
import { performance } from 'node:perf_hooks';
import type { Geometry, Position } from 'geojson';
import { featureExtent } from '../src/georef/feature-extent.ts';
import { georeference } from '../src/georef/georeference.ts';
import type { Feature } from '../src/match/types.ts';
import type { Interpretation } from '../src/parse/types.ts';
import { machineLoad } from './machine-load.ts';
import { seededRandom } from './seeded-random.ts';

const SIZES = (process.env.BENCH_VERTICES ?? '50,500,5000').split(',').map(Number);
console.log(`load at start: ${machineLoad()}`);


function wavyRing(vertices: number, random: () => number): Position[] {
  const [lat, lon] = [-60 + 120 * random(), -180 + 360 * random()];
  const lobes = 2 + Math.floor(6 * random());
  const ring: Position[] = [];
  for (let i = 0; i < vertices; i++) {
    const a = (2 * Math.PI * i) / vertices;
    const r = 0.2 * (1 + 0.6 * Math.sin(lobes * a) + 0.05 * random());
    ring.push([lon + r * Math.cos(a), lat + 0.7 * r * Math.sin(a)]);
  }
  return [...ring, ring[0]!];
}

function measure(label: string, count: number, work: (i: number) => void): void {
  const start = performance.now();
  for (let i = 0; i < count; i++) work(i);
  const seconds = (performance.now() - start) / 1000;
  console.log(`${label}: ${count} in ${seconds.toFixed(2)} s = ${(count / seconds).toFixed(0)}/s`);
}

for (const vertices of SIZES) {
  const random = seededRandom(vertices);
  const count = Math.max(20, Math.round(200_000 / vertices));
  const polygons: Geometry[] = Array.from({ length: count }, () => ({ type: 'Polygon', coordinates: [wavyRing(vertices, random)] }));
  measure(`featureExtent, polygons of ${vertices} vertices`, count, (i) => featureExtent(polygons[i]!));
  const lines: Geometry[] = polygons.map((p) => ({ type: 'LineString', coordinates: (p as { coordinates: Position[][] }).coordinates[0]!.slice(0, -1) }));
  measure(`featureExtent, lines of ${vertices} vertices`, count, (i) => featureExtent(lines[i]!));
}

const town: Feature = {
  sourceId: 'bench', featureId: '1', name: 'Puerto Lindo', alternateNames: [], featureType: 'town', countryCode: 'QV',
  stateProvince: null, county: null, latitude: -12.5, longitude: -60.25, radiusMeters: 2000, radiusIsDefault: true, geometryType: 'Point',
};
const base: Interpretation = { verbatim: '10 km NE of Puerto Lindo', clauses: [], chosenClause: 0, type: 'offset-heading', features: ['Puerto Lindo'], offsets: [], approximate: false, administrative: {}, otherClauses: [], notes: [] };
const offsetHeading: Interpretation = {
  ...base,
  offsets: [{ distance: { written: '10 km', value: 10, unit: 'km', precision: 1, uncertainty: 0.5, meters: 10000, uncertaintyMeters: 500 }, heading: { written: 'NE', azimuth: 45, halfWidth: 22.5, kind: 'rose8' } }],
};
measure('georeference, offset-heading', 20_000, () => georeference({ interpretation: offsetHeading, features: [town] }));
measure('georeference, named-place', 20_000, () => georeference({ interpretation: { ...base, type: 'named-place' }, features: [town] }));
console.log(`load at the end: ${machineLoad()}`);
