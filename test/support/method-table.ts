/**
 * The end-to-end table shared by the CLI and HTTP runs (test/e2e/method-table.test.ts) and the batch run
 * (test/e2e/languages.test.ts): labels of every locality type the demo gazetteer answers (all but
 * "administrative-unit", which it declines for want of a polygon, and the refusals), in the four languages,
 * each with the answer computed here, independently of the code under test:
 * - points by Vincenty's direct and inverse solutions on WGS84 (Vincenty 1975, Survey Review 23:88), from the
 *   registry package geodesy (C. Veness, MIT), starting from the features as gazetteer/demo.geojson gives them;
 * - datum shifts by the Helmert transformation with the EPSG dataset's parameters (epsg-index), geocentric
 *   coordinates by geodesy;
 * - corrected centers and radials of areas by an independent minimax (test/support/independent-minimax.ts);
 * - every uncertainty term on its own, from the published formulas restated below with their sections
 *   (Wieczorek, Guo & Hijmans 2004 = WGH2004; Chapman & Wieczorek 2020 = BP2020; docs/method.md restates them).
 * `expectAnswer` holds the tolerances: point within 1 m, each term within 0.5 %, the reported decimals and
 * total as docs/method.md §5.6 and §6 say.
 */
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import LatLonDatum from 'geodesy/latlon-ellipsoidal-datum.js';
import LatLon from 'geodesy/latlon-ellipsoidal-vincenty.js';
import { expect } from 'vitest';
import { centerMinimax, edgeMinimax, type Minimax } from './independent-minimax.ts';

type Position = number[];
interface DemoFeature {
  properties: Record<string, string | number>;
  geometry: { type: string; coordinates: Position | Position[] | Position[][] };
}
const features = (JSON.parse(readFileSync(new URL('../../gazetteer/demo.geojson', import.meta.url), 'utf8')) as { features: DemoFeature[] }).features;

/** A point feature of the demo gazetteer: its coordinates and its recorded radius (its extent, BP2020 §Uncertainty Due to the Extent of the Feature). */
function feature(name: string): { at: LatLon; radius: number } {
  const found = features.find((f) => f.properties.name === name && f.geometry.type === 'Point' && f.properties.radiusMeters !== undefined);
  if (!found) throw new Error(`${name}: no point with a radius in demo.geojson`);
  const [longitude, latitude] = found.geometry.coordinates as Position;
  return { at: new LatLon(latitude!, longitude!), radius: Number(found.properties.radiusMeters) };
}

/** The vertices ([longitude, latitude]) of a single-part line of the demo gazetteer. */
function line(name: string): Position[] {
  const found = features.find((f) => f.properties.name === name && f.geometry.type === 'LineString');
  if (!found) throw new Error(`${name}: no LineString in demo.geojson`);
  return found.geometry.coordinates as Position[];
}

/** The outer ring ([longitude, latitude], closed) of a single-polygon county of the demo gazetteer. */
function county(name: string): Position[] {
  const found = features.find((f) => f.properties.name === name && f.properties.featureType === 'county' && f.geometry.type === 'Polygon');
  if (!found) throw new Error(`${name}: no county Polygon in demo.geojson`);
  return (found.geometry.coordinates as Position[][])[0]!;
}

/**
 * Distance precision of a whole number of km: half of max(1, 10^(⌊log10 d⌋ − 1)) of the unit written
 * (BP2020 §Uncertainty Related to Offset Precision, its table: 15 km → 0.5 km; the rule is docs/method.md §5.1).
 */
function deltaMeters(km: number): number {
  return (Math.max(1, 10 ** (Math.floor(Math.log10(km)) - 1)) / 2) * 1000;
}

/** Half-width of a compass point: 45° for N, E, S, W, 22.5° for NE and the like (BP2020 §Uncertainty Related to Heading). */
const halfWidth = { N: 45, E: 45, S: 45, W: 45, NE: 22.5, SW: 22.5 } as const;
/** Azimuth of a compass point, degrees from true north. */
const azimuthOf = { N: 0, E: 90, S: 180, W: 270, NE: 45, SW: 225 } as const;

/** The offset term at a heading: √((d+δ)² + d² − 2d(d+δ)cos Δ) (WGH2004, direction and distance precision combined; docs/method.md §5.2). */
function offsetAtHeading(d: number, delta: number, halfWidthDegrees: number): number {
  const far = d + delta;
  return Math.sqrt(far * far + d * d - 2 * d * far * Math.cos((halfWidthDegrees * Math.PI) / 180));
}

/** The uncertainty terms a georeference reports (docs/method.md §5.6); absent ones are expected to be 0. */
type Term = 'extent' | 'offset' | 'coordinatePrecision' | 'datum' | 'mapScale' | 'measurement';
const TERMS: Term[] = ['extent', 'offset', 'coordinatePrecision', 'datum', 'mapScale', 'measurement'];

export interface Computed {
  point: LatLon;
  terms: Partial<Record<Term, number>>;
}

/** Named place: the feature's point, radius r_f (WGH2004, named places; BP2020 §Georeferencing a Named Place). */
const named = (place: string) => (): Computed => {
  const f = feature(place);
  return { point: f.at, terms: { extent: f.radius } };
};
/** d km at a compass heading: geodesic from the feature, r_f + offset term (BP2020 §Offset at a Heading). */
const atHeading = (km: number, heading: keyof typeof halfWidth, place: string) => (): Computed => {
  const f = feature(place);
  return { point: f.at.destinationPoint(km * 1000, azimuthOf[heading]), terms: { extent: f.radius, offset: offsetAtHeading(km * 1000, deltaMeters(km), halfWidth[heading]) } };
};
/** North/south then east/west, geodesically; r_f + √(δx² + δy²) (WGH2004, orthogonal offsets; BP2020 §Offset – Distance along Orthogonal Directions). */
const orthogonal = (northKm: number, eastKm: number, place: string) => (): Computed => {
  const f = feature(place);
  const point = f.at.destinationPoint(northKm * 1000, 0).destinationPoint(eastKm * 1000, 90);
  return { point, terms: { extent: f.radius, offset: Math.hypot(deltaMeters(northKm), deltaMeters(eastKm)) } };
};
/** Distance only: the feature's point, r_f + d + δ (BP2020 §Offset – Distance only; the disc form is docs/method.md §3 [CHOICE]). */
const distanceOnly = (km: number, place: string) => (): Computed => {
  const f = feature(place);
  return { point: f.at, terms: { extent: f.radius, offset: km * 1000 + deltaMeters(km) } };
};
/** Between: midpoint of the geodesic, D/2 + max(r_f1, r_f2) (docs/method.md §3 [CHOICE], not in BP2020). */
const between = (first: string, second: string) => (): Computed => {
  const a = feature(first);
  const b = feature(second);
  const D = a.at.distanceTo(b.at);
  return { point: a.at.destinationPoint(D / 2, a.at.initialBearingTo(b.at)), terms: { extent: Math.max(a.radius, b.radius), offset: D / 2 } };
};
/** Near: the feature's point, r_f + max(r_f, 1 km) (docs/method.md §3 [CHOICE]; BP2020 gives no rule). */
const near = (place: string) => (): Computed => {
  const f = feature(place);
  return { point: f.at, terms: { extent: f.radius, offset: Math.max(f.radius, 1000) } };
};

/**
 * Along a path: follow the line from where it leaves the feature's extent circle for d, along the geodesics
 * joining its vertices; r_f + δ, no heading term (BP2020 §Offset – Distance along a Path; docs/method.md §3).
 * The crossing of the circle is found by bisection on Vincenty's distances (60 halvings of a segment of a
 * few km: well under a millimetre).
 */
const alongPath = (km: number, lineName: string, place: string) => (): Computed => {
  const f = feature(place);
  const at = (p: Position) => new LatLon(p[1]!, p[0]!);
  const inside = (p: LatLon) => f.at.distanceTo(p) <= f.radius;
  let vertices = line(lineName).map(at);
  if (!inside(vertices[0]!)) vertices = vertices.reverse();
  if (!inside(vertices[0]!)) throw new Error(`${lineName} does not start within ${place}'s extent circle`);
  const out = vertices.findIndex((v) => !inside(v));
  const [a, b] = [vertices[out - 1]!, vertices[out]!];
  const [length, bearing] = [a.distanceTo(b), a.initialBearingTo(b)];
  let [low, high] = [0, length];
  for (let step = 0; step < 60; step++) {
    const middle = (low + high) / 2;
    if (inside(a.destinationPoint(middle, bearing))) low = middle;
    else high = middle;
  }
  let from = a.destinationPoint(high, bearing);
  let left = km * 1000;
  for (const next of vertices.slice(out)) {
    const segment = from.distanceTo(next);
    if (segment >= left) return { point: from.destinationPoint(left, from.initialBearingTo(next)), terms: { extent: f.radius, offset: deltaMeters(km) } };
    left -= segment;
    from = next;
  }
  throw new Error(`${lineName} ends before ${km} km`);
};

/**
 * Along a road that the text does not name ("8 km by road from X"), so no line to follow: the feature's point,
 * r_f + d + δ, as a distance alone (docs/method.md §3 [CHOICE], the rule's fallback).
 */
const pathWithoutLine = distanceOnly;

/**
 * Junction: where the two lines meet, each segment a straight line in longitude and latitude (RFC 7946
 * §3.1.1, the GeoJSON the demo gazetteer is written in), found by Cramer's rule for two segments; the
 * junction's own extent of 100 m (docs/method.md §3 [CHOICE]; BP2020 gives no figure). The lines must meet
 * exactly once.
 */
const junction = (first: string, second: string) => (): Computed => {
  const meetings = new Map<string, LatLon>();
  const [p, q] = [line(first), line(second)];
  for (let i = 1; i < p.length; i++) {
    for (let j = 1; j < q.length; j++) {
      const [[x1, y1], [x2, y2], [x3, y3], [x4, y4]] = [p[i - 1]!, p[i]!, q[j - 1]!, q[j]!] as [number, number][];
      const denominator = (x2 - x1) * (y4 - y3) - (y2 - y1) * (x4 - x3);
      if (denominator === 0) continue;
      const t = ((x3 - x1) * (y4 - y3) - (y3 - y1) * (x4 - x3)) / denominator;
      const u = ((x3 - x1) * (y2 - y1) - (y3 - y1) * (x2 - x1)) / denominator;
      if (t < 0 || t > 1 || u < 0 || u > 1) continue;
      const [longitude, latitude] = [x1 + t * (x2 - x1), y1 + t * (y2 - y1)];
      meetings.set(`${longitude.toFixed(9)} ${latitude.toFixed(9)}`, new LatLon(latitude, longitude));
    }
  }
  if (meetings.size !== 1) throw new Error(`${first} and ${second} meet ${meetings.size} times`);
  return { point: [...meetings.values()][0]!, terms: { extent: 100 } };
};

/**
 * Heading only, bounded by the record's county: the part of the county whose azimuth from the feature's
 * point lies within θ ± Δ, and that part's corrected center and radial (docs/method.md §3 [CHOICE]: BP2020
 * georeferences a heading alone only within a bounding feature; §4 for the center and radial). The part's
 * boundary is walked along the county ring (edges straight in longitude and latitude, RFC 7946 §3.1.1):
 * the county's vertices inside the sector (Vincenty azimuths), the points where an edge crosses a side of
 * the sector (bisection, 60 halvings), and between an exit on one side and the next entry on the other the
 * sector's apex, the feature's point, which the county then surrounds; between an exit and an entry on the
 * same side the part runs along that side (a geodesic, as edgeMinimax takes every edge). The part's center:
 * the unconstrained minimax of its vertices when that lies inside the part, else the minimax along its
 * edges (test/support/independent-minimax.ts).
 */
const headingOnly = (heading: keyof typeof halfWidth, place: string, countyName: string) => (): Computed => {
  const f = feature(place);
  const [θ, Δ] = [azimuthOf[heading], halfWidth[heading]];
  const turn = (degrees: number) => ((((degrees + 180) % 360) + 360) % 360) - 180; // into [−180, 180)
  const azimuth = (p: Position) => f.at.initialBearingTo(new LatLon(p[1]!, p[0]!));
  const inSector = (p: Position) => Math.abs(turn(azimuth(p) - θ)) <= Δ;
  const sideOf = (p: Position) => (turn(azimuth(p) - θ) < 0 ? 'left' : 'right');
  const crossing = (a: Position, b: Position): Position => {
    const along = (t: number): Position => [a[0]! + t * (b[0]! - a[0]!), a[1]! + t * (b[1]! - a[1]!)];
    let [low, high] = [0, 1];
    for (let step = 0; step < 60; step++) {
      const middle = (low + high) / 2;
      if (inSector(along(middle)) === inSector(a)) low = middle;
      else high = middle;
    }
    return along((low + high) / 2);
  };
  const countyRing = county(countyName);
  const open = countyRing.slice(0, -1);
  const first = open.findIndex(inSector);
  if (first < 0) throw new Error(`no vertex of ${countyName} lies ${heading} of ${place}`);
  const walk = [...open.slice(first), ...open.slice(0, first), open[first]!];
  const apex: Position = [f.at.lon, f.at.lat];
  const ring: Position[] = [walk[0]!];
  let exit: 'left' | 'right' | undefined;
  for (let i = 1; i < walk.length; i++) {
    const [previous, current] = [walk[i - 1]!, walk[i]!];
    if (inSector(previous) && !inSector(current)) {
      const point = crossing(previous, current);
      ring.push(point);
      exit = sideOf(point);
    } else if (!inSector(previous) && inSector(current)) {
      const point = crossing(previous, current);
      if (sideOf(point) !== exit) ring.push(apex);
      ring.push(point);
    }
    if (inSector(current)) ring.push(current);
  }
  const center = correctedCenter(ring, (p) => inSector(p) && inPolygon(p, countyRing));
  return { point: new LatLon(center.latitude, center.longitude), terms: { extent: center.radiusMeters } };
};

/**
 * The corrected center and geographic radial of an area (BP2020 glossary; docs/method.md §4): the smallest
 * circle holding its vertices when its center lies in the area (`within`), else the point of its boundary
 * that minimises the largest distance to them (test/support/independent-minimax.ts).
 */
function correctedCenter(ring: Position[], within: (p: Position) => boolean): Minimax {
  const area = { type: 'Polygon' as const, coordinates: [ring] };
  const free = centerMinimax(area);
  return within([free.longitude, free.latitude]) ? free : edgeMinimax(area, area.coordinates);
}

/** A named county: its polygon's corrected center and radial (BP2020 §Georeferencing a Named Place; docs/method.md §4). */
const namedArea = (countyName: string) => (): Computed => {
  const ring = county(countyName);
  const center = correctedCenter(ring, (p) => inPolygon(p, ring));
  return { point: new LatLon(center.latitude, center.longitude), terms: { extent: center.radiusMeters } };
};

/** Point in polygon by the even-odd rule on a ray toward +longitude (edges straight in longitude and latitude). */
function inPolygon([x, y]: Position, ring: Position[]): boolean {
  let inside = false;
  for (let i = 1; i < ring.length; i++) {
    const [[x1, y1], [x2, y2]] = [ring[i - 1]!, ring[i]!] as [number, number][];
    if (y1 > y! !== y2 > y! && x! < x1 + ((y! - y1) * (x2 - x1)) / (y2 - y1)) inside = !inside;
  }
  return inside;
}

/**
 * Coordinate precision: one step p of the last digit written on each axis, as the geodesic lengths of a step
 * of latitude and of longitude at that latitude (Vincenty), combined as the diagonal √(ylat² + ylon²)
 * (BP2020 §Uncertainty Related to Coordinate Precision, whose table this reproduces; docs/method.md §5.3).
 */
function coordinatePrecisionMeters(point: LatLon, p: number): number {
  const [φ, λ] = [point.lat, point.lon];
  const alongMeridian = new LatLon(φ - p / 2, λ).distanceTo(new LatLon(φ + p / 2, λ));
  const alongParallel = new LatLon(φ, λ - p / 2).distanceTo(new LatLon(φ, λ + p / 2));
  return Math.hypot(alongMeridian, alongParallel);
}

/**
 * WGS 72 to WGS 84 by EPSG transformation 1238 ("WGS 72 to WGS 84 (2)", position vector, method 9606), its
 * parameters as the EPSG dataset exports them in the TOWGS84 of the WGS 72 UTM zones (epsg-index 2.0.0,
 * EPSG:32201); stated accuracy 2 m (the EPSG record's figure, from memory). Geocentric coordinates and the
 * Helmert step by geodesy, on its WGS 72 ellipsoid (a 6378135 m, 1/f 298.26); its own WGS 72 shift is not
 * used (its rotation has the other sign).
 */
const WGS72_TO_WGS84 = ((): { transform: number[]; accuracyMeters: number } => {
  const epsg = createRequire(import.meta.url)('epsg-index/all.json') as Record<string, { proj4: string }>;
  const [tx, ty, tz, rx, ry, rz, ds] = /\+towgs84=(\S+)/.exec(epsg['32201']!.proj4)![1]!.split(',').map(Number) as number[];
  // geodesy holds the shift from WGS 84 and negates it for the way back; give it the negated EPSG values.
  return { transform: [tx!, ty!, tz!, ds!, rx!, ry!, rz!].map((v) => -v), accuracyMeters: 2 };
})();

/** A written datum: no datum at all, WGS 84, or WGS 72. */
type WrittenDatum = 'none' | 'WGS84' | 'WGS72';

/**
 * Written coordinates: the point as written, shifted to WGS84 when written in WGS 72; terms the coordinate
 * precision of the step written, at the point, and the datum: 0 for WGS 84, the transformation's stated
 * accuracy for WGS 72 (BP2020 §Uncertainty Related to Geodetic Datum; docs/method.md §5.4), and for no datum
 * the published worst case 5359 m (BP2020 §Uncertainty from Unknown Datum; no regional datum of the table
 * covers Isla Verdemar, docs/method.md §5.4).
 */
const coordinates = (latitude: number, longitude: number, step: number, datum: WrittenDatum) => (): Computed => {
  let point = new LatLon(latitude, longitude);
  if (datum === 'WGS72') {
    const wgs72 = { ellipsoid: LatLonDatum.datums.WGS72!.ellipsoid, transform: WGS72_TO_WGS84.transform };
    const shifted = new LatLonDatum(latitude, longitude, 0, wgs72).convertDatum(LatLonDatum.datums.WGS84);
    point = new LatLon(shifted.lat, shifted.lon);
  }
  const datumMeters = { none: 5359, WGS84: 0, WGS72: WGS72_TO_WGS84.accuracyMeters }[datum];
  return { point, terms: { coordinatePrecision: coordinatePrecisionMeters(point, step), datum: datumMeters } };
};
const [second, minute] = [1 / 3600, 1 / 60];
/** Degrees, minutes and seconds south or west as a negative decimal. */
const southWest = (degrees: number, minutes: number, seconds = 0) => -(degrees + minutes / 60 + seconds / 3600);

/** One label of the table: what is asked, and the answer computed here. */
export interface TableRow {
  language: 'en' | 'es' | 'pt' | 'fr';
  type: string;
  label: string;
  /** The record's county, when the rule needs a bounding unit. */
  county?: string;
  compute: () => Computed;
}

/** A row whose computation runs once, however many edges ask for it. */
function row(language: TableRow['language'], type: string, label: string, compute: () => Computed, county?: string): TableRow {
  let computed: Computed | undefined;
  const once = () => (computed ??= compute());
  return county ? { language, type, label, compute: once, county } : { language, type, label, compute: once };
}

export const METHOD_TABLE: TableRow[] = [
  row('en', 'named-place', 'Val-Marin', named('Val-Marin')),
  row('en', 'named-place', 'Eastmoor County', namedArea('Eastmoor')),
  row('en', 'offset-heading', '10 km NE of Vila Serena', atHeading(10, 'NE', 'Vila Serena')),
  row('en', 'offset-orthogonal', '3 km N and 2 km E of Valle Hondo', orthogonal(3, 2, 'Valle Hondo')),
  row('en', 'distance-only', '5 km from Saint-Aubrac', distanceOnly(5, 'Saint-Aubrac')),
  row('en', 'between', 'between Val-Marin and Millbrook', between('Val-Marin', 'Millbrook')),
  row('en', 'near', 'near Millbrook', near('Millbrook')),
  row('en', 'offset-path', '12 km along Ruta 12 from Puerto Lindo', alongPath(12, 'Ruta 12', 'Puerto Lindo')),
  // The line named after the place: "by road from X on L" follows L as "along L from X" does.
  row('en', 'offset-path', '12 km by road from Puerto Lindo on Ruta 12', alongPath(12, 'Ruta 12', 'Puerto Lindo')),
  row('en', 'junction', 'junction of Río Claro and Arroyo Negro', junction('Río Claro', 'Arroyo Negro')),
  row('en', 'heading-only', 'N of Puerto Lindo', headingOnly('N', 'Puerto Lindo', 'Alisos'), 'Alisos'),
  row('en', 'coordinates', '-45.2662, -131.0643 (WGS84)', coordinates(-45.2662, -131.0643, 0.0001, 'WGS84')),
  row('en', 'coordinates', '45.2662 S, 131.0643 W', coordinates(-45.2662, -131.0643, 0.0001, 'none')),
  row('en', 'coordinates', "45°13.5'S 131°06.2'W WGS 72", coordinates(southWest(45, 13.5), southWest(131, 6.2), 0.1 * minute, 'WGS72')),
  row('es', 'named-place', 'Valle Hondo', named('Valle Hondo')),
  row('es', 'named-place', 'Partido de Alisos', namedArea('Alisos')),
  row('es', 'offset-heading', 'ca. 10 km al NE de Valle Hondo', atHeading(10, 'NE', 'Valle Hondo')),
  row('es', 'offset-orthogonal', '3 km al N y 2 km al E de Valle Hondo', orthogonal(3, 2, 'Valle Hondo')),
  row('es', 'distance-only', 'a 5 km de Valle Hondo', distanceOnly(5, 'Valle Hondo')),
  row('es', 'between', 'entre Valle Hondo y Villa Alisos', between('Valle Hondo', 'Villa Alisos')),
  row('es', 'near', 'cerca de Valle Hondo', near('Valle Hondo')),
  row('es', 'offset-path', '12 km por la Ruta 12 desde Puerto Lindo', alongPath(12, 'Ruta 12', 'Puerto Lindo')),
  row('es', 'offset-path', 'a 12 km por carretera de Puerto Lindo por la Ruta 12', alongPath(12, 'Ruta 12', 'Puerto Lindo')),
  row('es', 'junction', 'confluencia del Río Claro y Arroyo Negro', junction('Río Claro', 'Arroyo Negro')),
  row('es', 'heading-only', 'al N de Valle Hondo', headingOnly('N', 'Valle Hondo', 'Cerrillos'), 'Cerrillos'),
  row('es', 'coordinates', "45°36'S 131°25'O", coordinates(southWest(45, 36), southWest(131, 25), minute, 'none')),
  row('es', 'coordinates', 'Cerca de Valle Hondo, 45°36\'31" S, 131°25\'22" O, WGS84', coordinates(southWest(45, 36, 31), southWest(131, 25, 22), second, 'WGS84')),
  row('pt', 'named-place', 'Vila Serena', named('Vila Serena')),
  row('pt', 'named-place', 'Município de Rio Fundo', namedArea('Rio Fundo')),
  row('pt', 'offset-heading', '3 km ao N de Vila Serena', atHeading(3, 'N', 'Vila Serena')),
  row('pt', 'offset-orthogonal', '3 km ao N e 2 km a L de Vila Serena', orthogonal(3, 2, 'Vila Serena')),
  row('pt', 'distance-only', 'a 5 km de Vila Serena', distanceOnly(5, 'Vila Serena')),
  row('pt', 'between', 'entre Vila Serena e Porto Novo', between('Vila Serena', 'Porto Novo')),
  row('pt', 'near', 'perto de Vila Serena', near('Vila Serena')),
  row('pt', 'offset-path', '10 km ao longo da Trilha do Pico desde Vila Serena', alongPath(10, 'Trilha do Pico', 'Vila Serena')),
  row('pt', 'offset-path', '10 km pela trilha de Vila Serena na Trilha do Pico', alongPath(10, 'Trilha do Pico', 'Vila Serena')),
  row('pt', 'junction', 'confluência do Rio Fundo e Ribeirão das Pedras', junction('Rio Fundo', 'Ribeirão das Pedras')),
  row('pt', 'heading-only', 'ao N de Vila Serena', headingOnly('N', 'Vila Serena', 'Serrana'), 'Serrana'),
  row('pt', 'offset-heading', '10 km a NE de Vila Serena', atHeading(10, 'NE', 'Vila Serena')),
  row('pt', 'offset-path', '8 km pela estrada de Vila Serena', pathWithoutLine(8, 'Vila Serena')),
  row('pt', 'coordinates', "45°18'S 131°00'O", coordinates(southWest(45, 18), southWest(131, 0), minute, 'none')),
  row('pt', 'coordinates', 'Vila Serena, 45°18\'04"S 131°00\'00"O (WGS84)', coordinates(southWest(45, 18, 4), southWest(131, 0, 0), second, 'WGS84')),
  row('fr', 'named-place', 'Saint-Aubrac', named('Saint-Aubrac')),
  row('fr', 'named-place', 'canton de Haut-Levant', namedArea('Haut-Levant')),
  row('fr', 'offset-heading', 'à 5 km au sud-ouest de Saint-Aubrac', atHeading(5, 'SW', 'Saint-Aubrac')),
  row('fr', 'offset-orthogonal', "3 km au N et 2 km à l'E de Saint-Aubrac", orthogonal(3, 2, 'Saint-Aubrac')),
  row('fr', 'distance-only', 'à 5 km de Saint-Aubrac', distanceOnly(5, 'Saint-Aubrac')),
  row('fr', 'between', 'entre Saint-Aubrac et Beaulieu', between('Saint-Aubrac', 'Beaulieu')),
  row('fr', 'near', 'près de Saint-Aubrac', near('Saint-Aubrac')),
  row('fr', 'offset-path', '10 km par la Route de la Côte depuis Saint-Aubrac', alongPath(10, 'Route de la Côte', 'Saint-Aubrac')),
  row('fr', 'offset-path', 'à 10 km par la route de Saint-Aubrac sur la Route de la Côte', alongPath(10, 'Route de la Côte', 'Saint-Aubrac')),
  row('fr', 'junction', 'confluent de la Rivière Blanche et du Ruisseau des Saules', junction('Rivière Blanche', 'Ruisseau des Saules')),
  row('fr', 'heading-only', 'au N de Saint-Aubrac', headingOnly('N', 'Saint-Aubrac', 'Haut-Levant'), 'Haut-Levant'),
  row('fr', 'offset-heading', 'à 10 km au NE de Saint-Aubrac', atHeading(10, 'NE', 'Saint-Aubrac')),
  row('fr', 'offset-path', '8 km par la route de Saint-Aubrac', pathWithoutLine(8, 'Saint-Aubrac')),
  row('fr', 'coordinates', "45°40'S 130°30'O", coordinates(southWest(45, 40), southWest(130, 30), minute, 'none')),
  row('fr', 'coordinates', "près de Saint-Aubrac, 45°16,97' S 130°29,24' O, WGS 72", coordinates(southWest(45, 16.97), southWest(130, 29.24), 0.01 * minute, 'WGS72')),
];

/** Within 0.5 % of the expected term (the tolerance the issue asks of each term); a zero term must be zero. */
function expectTerm(name: string, got: number | undefined, expected: number) {
  if (expected === 0) expect(got, name).toBe(0);
  else expect(Math.abs(got! - expected) / expected, `${name}: ${got} against ${expected}`).toBeLessThanOrEqual(0.005);
}

/**
 * Checks one answer (the body of POST /api/v1/georeference, which `locate --json` prints too) against the
 * row's independent computation: the unrounded point, every term on its own, then what is reported.
 */
export function expectAnswer(body: any, row: TableRow): void {
  expect(body.status, JSON.stringify(body.georeference?.remarks ?? body.reason)).toBe('georeferenced');
  expect(body.interpretation.type).toBe(row.type);
  const expected = row.compute();

  // The point, unrounded, within 1 m of the independent one.
  const got = new LatLon(body.georeference.latitude, body.georeference.longitude);
  expect(got.distanceTo(expected.point), 'point, meters from the independent one').toBeLessThan(1);

  // Each term on its own (docs/method.md §5.6 reports them separately).
  const terms = body.components as Record<string, number>;
  expect(Object.keys(terms).sort()).toEqual([...TERMS].sort());
  for (const term of TERMS) expectTerm(term, terms[term], expected.terms[term] ?? 0);

  expectReported(body.darwinCore, expected, got);
}

/**
 * Checks one row of a batch's output (its appended Darwin Core columns) against the row's independent
 * computation: the type named in the remarks, the reported point and the reported total.
 */
export function expectBatchRow(record: Record<string, string>, row: TableRow): void {
  expect(record.georeferenceVerificationStatus, record.georeferenceRemarks).toBe('requires verification');
  expect(record.georeferenceRemarks).toContain(`locality type "${row.type}"`);
  expectReported(record, row.compute());
}

/**
 * The reported decimals and total (docs/method.md §6): the rounding moves the point by at most 1 % of the
 * radius, that shift is added to the total, and the total is rounded up to a whole meter (§5.6). With the
 * unrounded point at hand the shift is measured; without it (a batch's columns) it is the reported point's
 * distance from the independent one, within the 1 m the unrounded point may stand from that.
 */
function expectReported(record: Record<string, string>, expected: Computed, unrounded?: LatLon): void {
  const sum = TERMS.reduce((total, term) => total + (expected.terms[term] ?? 0), 0);
  const reportedPoint = new LatLon(Number(record.decimalLatitude), Number(record.decimalLongitude));
  const [shift, slack] = unrounded ? [reportedPoint.distanceTo(unrounded), 0] : [reportedPoint.distanceTo(expected.point), 1];
  expect(shift).toBeLessThanOrEqual(0.01 * sum * 1.005 + slack);
  if (unrounded) expect(reportedPoint.distanceTo(expected.point)).toBeLessThan(1 + shift);
  const reported = Number(record.coordinateUncertaintyInMeters);
  expect(Number.isInteger(reported)).toBe(true);
  expect(reported).toBeGreaterThanOrEqual((sum + shift - slack) * 0.995);
  expect(reported).toBeLessThanOrEqual((sum + shift + slack) * 1.005 + 1);
}
