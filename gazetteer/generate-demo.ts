/**
 * Writes the bundled demo data: an entirely invented island country ("Isla Verdemar", code QV) in the open
 * South Pacific, with its coastline, provinces, counties, places, rivers and roads, plus a batch of invented
 * label-style localities.
 *
 * Run: `npx tsx gazetteer/generate-demo.ts` (or `npm run demo:generate`). Deterministic: a seeded generator and hand-written names and
 * anchor positions, so the same script always writes the same bytes.
 *
 * Geometry is built in a flat local plane in kilometres (x east, y north) around the island's center and
 * converted to longitude/latitude by an equirectangular scaling; the island is invented, so the projection
 * only has to be consistent, not exact. The provinces and counties are made by cutting the coastline ring
 * with polylines whose ends are existing vertices, so neighbouring units share identical edges.
 */
import { writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { stringify } from 'csv-stringify/sync';
import * as turf from '@turf/turf';
import geographiclib from 'geographiclib-geodesic';
import type { Feature, FeatureCollection, Geometry, Polygon, Position } from 'geojson';
import { seededRandom } from '../bench/seeded-random.ts';

type Pt = [number, number];
type Ring = Pt[]; // open ring, counter-clockwise in the local plane

// DEMO_OUT_DIR lets a test regenerate into a scratch folder and compare with the committed files.
const OUT_DIR = process.env.DEMO_OUT_DIR ?? dirname(fileURLToPath(import.meta.url));
const CENTER_LON = -131.0;
const CENTER_LAT = -45.5;
const KM_PER_DEG_LAT = 110.574;
const KM_PER_DEG_LON = 111.32 * Math.cos((CENTER_LAT * Math.PI) / 180);
const COAST_VERTICES = 288;
const COUNTRY_CODE = 'QV';
const COUNTRY_NAME = 'Isla Verdemar';

const random = seededRandom(20261201);
// Rivers and roads draw from their own stream, so adding a place never moves a line (or a bridge).
const lineRandom = seededRandom(7461);

// ---------------------------------------------------------------------------------------------- coastline
const BAY_ANGLE = (135 * Math.PI) / 180;
const BAY_HALF_WIDTH = 0.14;
const BAY_DEPTH = 0.24;
// Broad lobes from low harmonics, a ragged shore from high ones.
const harmonics = Array.from({ length: 22 }, (_, i) => ({
  k: i + 2,
  amplitude: i < 7 ? (0.07 / (i + 1) ** 0.8) * (0.5 + random()) : 0.006 * random(),
  phase: random() * 2 * Math.PI,
}));

function wrapAngle(a: number): number {
  return Math.atan2(Math.sin(a), Math.cos(a));
}

/** Distance from the island center to the coast at polar angle `theta` (km). */
function coastRadius(theta: number): number {
  const a = 75;
  const b = 50;
  const ellipse = (a * b) / Math.hypot(b * Math.cos(theta), a * Math.sin(theta));
  const wobble = harmonics.reduce((s, h) => s + h.amplitude * Math.cos(h.k * theta + h.phase), 0);
  const bay = BAY_DEPTH * Math.exp(-((wrapAngle(theta - BAY_ANGLE) / BAY_HALF_WIDTH) ** 2));
  return ellipse * (1 + wobble) * (1 - bay);
}

/** The point `inset` km inland of the coast at polar angle `degrees`. */
function coastPoint(degrees: number, inset: number): Pt {
  const t = (degrees * Math.PI) / 180;
  const r = coastRadius(t) - inset;
  return [r * Math.cos(t), r * Math.sin(t)];
}

const coast: Ring = Array.from({ length: COAST_VERTICES }, (_, i) => {
  const t = (2 * Math.PI * i) / COAST_VERTICES;
  const r = coastRadius(t);
  return [round3(r * Math.cos(t)), round3(r * Math.sin(t))] as Pt;
});

/** The coast vertex in the direction of `toward` (by polar angle). */
function coastVertexToward(toward: Pt): Pt {
  const t = Math.atan2(toward[1], toward[0]);
  const i = Math.round((t / (2 * Math.PI)) * COAST_VERTICES);
  return coast[((i % COAST_VERTICES) + COAST_VERTICES) % COAST_VERTICES]!;
}

function round3(v: number): number {
  return Math.round(v * 1000) / 1000;
}

// ------------------------------------------------------------------------------------------ plane helpers
function distance(a: Pt, b: Pt): number {
  return Math.hypot(a[0] - b[0], a[1] - b[1]);
}

function distanceToSegment(p: Pt, a: Pt, b: Pt): number {
  const dx = b[0] - a[0];
  const dy = b[1] - a[1];
  const len2 = dx * dx + dy * dy;
  const t = len2 === 0 ? 0 : Math.max(0, Math.min(1, ((p[0] - a[0]) * dx + (p[1] - a[1]) * dy) / len2));
  return distance(p, [a[0] + t * dx, a[1] + t * dy]);
}

function distanceToRing(p: Pt, ring: Ring): number {
  let best = Infinity;
  for (let i = 0; i < ring.length; i++) best = Math.min(best, distanceToSegment(p, ring[i]!, ring[(i + 1) % ring.length]!));
  return best;
}

function insideRing(p: Pt, ring: Ring): boolean {
  let inside = false;
  for (let i = 0, j = ring.length - 1; i < ring.length; j = i++) {
    const [xi, yi] = ring[i]!;
    const [xj, yj] = ring[j]!;
    if (yi > p[1] !== yj > p[1] && p[0] < ((xj - xi) * (p[1] - yi)) / (yj - yi) + xi) inside = !inside;
  }
  return inside;
}

function signedArea(ring: Ring): number {
  let s = 0;
  for (let i = 0; i < ring.length; i++) {
    const [x1, y1] = ring[i]!;
    const [x2, y2] = ring[(i + 1) % ring.length]!;
    s += x1 * y2 - x2 * y1;
  }
  return s / 2;
}

/** Control points joined by segments of about `step` km whose inner vertices wander sideways by up to `jitter` km. */
function wanderingLine(controls: Pt[], step: number, jitter: number, rng = random): Pt[] {
  const line: Pt[] = [controls[0]!];
  for (let c = 1; c < controls.length; c++) {
    const a = controls[c - 1]!;
    const b = controls[c]!;
    const n = Math.max(1, Math.ceil(distance(a, b) / step));
    const nx = -(b[1] - a[1]) / distance(a, b);
    const ny = (b[0] - a[0]) / distance(a, b);
    for (let i = 1; i < n; i++) {
      const f = i / n;
      const off = (rng() * 2 - 1) * jitter;
      line.push([round3(a[0] + f * (b[0] - a[0]) + off * nx), round3(a[1] + f * (b[1] - a[1]) + off * ny)]);
    }
    line.push(b);
  }
  return line;
}

/** The vertex of `line` nearest to `p` (so a cut or a tributary can end exactly on it). */
function nearestVertex(line: Pt[], p: Pt): Pt {
  return line.reduce((best, v) => (distance(v, p) < distance(best, p) ? v : best));
}

function segmentIntersection(a: Pt, b: Pt, c: Pt, d: Pt): Pt | null {
  const den = (b[0] - a[0]) * (d[1] - c[1]) - (b[1] - a[1]) * (d[0] - c[0]);
  if (den === 0) return null;
  const t = ((c[0] - a[0]) * (d[1] - c[1]) - (c[1] - a[1]) * (d[0] - c[0])) / den;
  const u = ((c[0] - a[0]) * (b[1] - a[1]) - (c[1] - a[1]) * (b[0] - a[0])) / den;
  return t >= 0 && t <= 1 && u >= 0 && u <= 1 ? [a[0] + t * (b[0] - a[0]), a[1] + t * (b[1] - a[1])] : null;
}

function lineCrossings(p: Pt[], q: Pt[]): Pt[] {
  const out: Pt[] = [];
  for (let i = 1; i < p.length; i++)
    for (let j = 1; j < q.length; j++) {
      const x = segmentIntersection(p[i - 1]!, p[i]!, q[j - 1]!, q[j]!);
      if (x) out.push(x);
    }
  return out;
}

/**
 * The point `meters` along a polyline from its start, measured on the WGS84 ellipsoid along the
 * polyline's vertices as they are written out (geographiclib; exact to well under a metre here).
 */
function geodesicPointAlong(line: Pt[], meters: number): Pt {
  const wgs84 = geographiclib.Geodesic.WGS84;
  const lonLat = line.map(toLonLat) as [number, number][];
  let left = meters;
  for (let i = 1; i < lonLat.length; i++) {
    const [lon1, lat1] = lonLat[i - 1]!;
    const [lon2, lat2] = lonLat[i]!;
    const segment = wgs84.Inverse(lat1, lon1, lat2, lon2);
    if (left <= segment.s12!) {
      const p = wgs84.Direct(lat1, lon1, segment.azi1!, left);
      return fromLonLat([p.lon2!, p.lat2!]);
    }
    left -= segment.s12!;
  }
  throw new Error(`line is shorter than ${meters} m`);
}

/**
 * Splits a ring along a cut whose two ends are vertices of the ring; both pieces keep the ring's
 * orientation and share the cut's vertices exactly.
 */
function splitRing(ring: Ring, cut: Pt[], keepSideOf: Pt): { side: Ring; rest: Ring } {
  const ia = ring.indexOf(cut[0]!);
  const ib = ring.indexOf(cut[cut.length - 1]!);
  if (ia < 0 || ib < 0) throw new Error('cut does not end on vertices of the ring');
  const inner = cut.slice(1, -1);
  const walk = (from: number, to: number): Pt[] => {
    const out: Pt[] = [];
    for (let i = from; ; i = (i + 1) % ring.length) {
      out.push(ring[i]!);
      if (i === to) return out;
    }
  };
  const first = [...walk(ia, ib), ...[...inner].reverse()];
  const second = [...walk(ib, ia), ...inner];
  return insideRing(keepSideOf, first) ? { side: first, rest: second } : { side: second, rest: first };
}

/** A small irregular star-shaped ring (lakes, the islet), counter-clockwise. */
function blob(center: Pt, radius: number, vertices: number): Ring {
  return Array.from({ length: vertices }, (_, i) => {
    const t = (2 * Math.PI * i) / vertices;
    const r = radius * (0.75 + 0.35 * random());
    return [round3(center[0] + r * Math.cos(t)), round3(center[1] + r * Math.sin(t))] as Pt;
  });
}

// ------------------------------------------------------------------------ provinces and counties (partition)
const cutA = wanderingLine([coastVertexToward([-15, 50]), [-18, 25], [-25, 0], [-22, -25], coastVertexToward([-28, -50])], 2.5, 0.5);
const cutB = wanderingLine([coastVertexToward([22, 50]), [25, 20], [20, 0], [28, -25], coastVertexToward([25, -50])], 2.5, 0.5);
const cutW1 = wanderingLine([coastVertexToward([-75, 5]), [-55, 3], [-40, 0], nearestVertex(cutA, [-25, 0])], 2.5, 0.5);
const cutW2 = wanderingLine([coastVertexToward([-45, -50]), [-48, -25], nearestVertex(cutW1, [-48, 2])], 2.5, 0.5);
const cutC1 = wanderingLine([nearestVertex(cutA, [-23, 8]), [-5, 6], [8, 2], nearestVertex(cutB, [21, 3])], 2.5, 0.5);
const cutE1 = wanderingLine([nearestVertex(cutB, [22, 8]), [40, 8], [58, 4], coastVertexToward([75, 3])], 2.5, 0.5);
const cutE2 = wanderingLine([coastVertexToward([50, -45]), [50, -25], [52, -8], nearestVertex(cutE1, [52, 6])], 2.5, 0.5);

const poniente = splitRing(coast, cutA, [-60, 0]);
const serraAndLevant = splitRing(poniente.rest, cutB, [0, 0]);
const alisos = splitRing(poniente.side, cutW1, [-50, 25]);
const tresCruces = splitRing(alisos.rest, cutW2, [-65, -15]);
const serrana = splitRing(serraAndLevant.side, cutC1, [0, 25]);
const hautLevant = splitRing(serraAndLevant.rest, cutE1, [45, 25]);
const basseCote = splitRing(hautLevant.rest, cutE2, [35, -20]);

interface AdminUnit {
  name: string;
  alternateNames: string[];
  ring: Ring;
  province?: string;
}
const provinces: AdminUnit[] = [
  { name: 'Poniente', alternateNames: ['Provincia de Poniente', 'Western Province', 'Prov. Poniente'], ring: poniente.side },
  { name: 'Serra Alta', alternateNames: ['Província da Serra Alta', 'Sierra Alta', 'Highland Province'], ring: serraAndLevant.side },
  { name: 'Côte-du-Levant', alternateNames: ['Cote du Levant', 'Levante', 'Eastern Province'], ring: serraAndLevant.rest },
];
const counties: AdminUnit[] = [
  { name: 'Alisos', alternateNames: ['Partido de Alisos', 'Los Alisos'], ring: alisos.side, province: 'Poniente' },
  { name: 'Tres Cruces', alternateNames: ['Partido de Tres Cruces', '3 Cruces'], ring: tresCruces.side, province: 'Poniente' },
  { name: 'Cerrillos', alternateNames: ['Partido de Cerrillos'], ring: tresCruces.rest, province: 'Poniente' },
  { name: 'Serrana', alternateNames: ['Município de Serrana', 'Serrana County'], ring: serrana.side, province: 'Serra Alta' },
  { name: 'Rio Fundo', alternateNames: ['Município de Rio Fundo', 'Río Fundo'], ring: serrana.rest, province: 'Serra Alta' },
  { name: 'Haut-Levant', alternateNames: ['Canton du Haut-Levant', 'Haut Levant'], ring: hautLevant.side, province: 'Côte-du-Levant' },
  { name: 'Basse-Côte', alternateNames: ['Canton de la Basse-Côte', 'Basse Cote'], ring: basseCote.side, province: 'Côte-du-Levant' },
  { name: 'Eastmoor', alternateNames: ['Eastmoor District'], ring: basseCote.rest, province: 'Côte-du-Levant' },
];

function countyAt(p: Pt): AdminUnit | undefined {
  return counties.find((c) => insideRing(p, c.ring));
}

// ------------------------------------------------------------------------------------------------- places
type Placement =
  | { at: Pt } // explicit position (km)
  | { coast: number; inset: number } // polar angle (degrees) and distance inland (km)
  | { random: true }; // anywhere suitable in the county

interface PlaceSpec {
  name: string;
  featureType: string;
  county: string;
  placement: Placement;
  alternateNames?: string[];
  radiusMeters?: number;
}

const c = (coastDegrees: number, inset = 1.2): Placement => ({ coast: coastDegrees, inset });
const at = (x: number, y: number): Placement => ({ at: [x, y] });
const anywhere: Placement = { random: true };

// Settlements. Positions given for the ones that roads, rivers or demo queries rely on; the rest are
// scattered by the seeded generator within their county.
const places: PlaceSpec[] = [
  // Alisos (Poniente)
  { name: 'Puerto Lindo', featureType: 'city', county: 'Alisos', placement: c(135, 1.5), radiusMeters: 3500, alternateNames: ['Pto. Lindo', 'Pto Lindo', 'Puerto Lindo de Poniente', 'Port Lindo'] },
  { name: 'Villa Alisos', featureType: 'town', county: 'Alisos', placement: at(-42, 14), radiusMeters: 1800, alternateNames: ['Va. Alisos'] },
  { name: 'Santa Rosa', featureType: 'town', county: 'Alisos', placement: at(-60, 18), alternateNames: ['Sta. Rosa', 'Santa Rosa de Poniente'] },
  { name: 'Los Pinos', featureType: 'village', county: 'Alisos', placement: anywhere },
  { name: 'La Caleta', featureType: 'village', county: 'Alisos', placement: c(155), radiusMeters: 900 },
  { name: 'El Mirador', featureType: 'hamlet', county: 'Alisos', placement: anywhere }, // moved onto Ruta 12 below
  { name: 'Aldea Vieja', featureType: 'hamlet', county: 'Alisos', placement: anywhere, alternateNames: ['Aldea de los Alisos'] },
  { name: 'Las Tunas', featureType: 'village', county: 'Alisos', placement: anywhere },
  { name: 'Colonia Nueva', featureType: 'village', county: 'Alisos', placement: anywhere, radiusMeters: 1200 },
  { name: 'Los Arrayanes', featureType: 'village', county: 'Alisos', placement: anywhere },
  { name: 'Punta Gaviota', featureType: 'locality', county: 'Alisos', placement: c(165, 0.6) },
  { name: 'Estancia La Esperanza', featureType: 'estate', county: 'Alisos', placement: anywhere, radiusMeters: 2500 },
  { name: 'Chacra Los Olmos', featureType: 'farm', county: 'Alisos', placement: anywhere },
  // Cerrillos (Poniente)
  { name: 'Valle Hondo', featureType: 'town', county: 'Cerrillos', placement: at(-33, -12), radiusMeters: 1600 },
  { name: 'San Telmo', featureType: 'town', county: 'Cerrillos', placement: at(-30, -28), radiusMeters: 1500, alternateNames: ['S. Telmo', 'San Telmo de Poniente'] },
  { name: 'Las Flores', featureType: 'village', county: 'Cerrillos', placement: anywhere },
  { name: 'El Molino', featureType: 'village', county: 'Cerrillos', placement: anywhere, alternateNames: ['Molino'] },
  { name: 'Cruz Alta', featureType: 'hamlet', county: 'Cerrillos', placement: anywhere },
  { name: 'Piedra Negra', featureType: 'locality', county: 'Cerrillos', placement: anywhere },
  { name: 'Rincón del Sauce', featureType: 'village', county: 'Cerrillos', placement: anywhere, alternateNames: ['Rincon del Sauce'] },
  { name: 'La Candelaria', featureType: 'village', county: 'Cerrillos', placement: anywhere },
  { name: 'Tierra Blanca', featureType: 'hamlet', county: 'Cerrillos', placement: anywhere },
  { name: 'Corralito', featureType: 'hamlet', county: 'Cerrillos', placement: anywhere },
  { name: 'Estación Valle Hondo', featureType: 'station', county: 'Cerrillos', placement: at(-31, -15), alternateNames: ['Estacion Valle Hondo'] },
  { name: 'Estancia San Isidro', featureType: 'estate', county: 'Cerrillos', placement: anywhere, radiusMeters: 3000 },
  // Tres Cruces (Poniente)
  { name: 'Marisma', featureType: 'town', county: 'Tres Cruces', placement: at(-60, -14), radiusMeters: 1400, alternateNames: ['La Marisma'] },
  { name: 'Los Pinos', featureType: 'village', county: 'Tres Cruces', placement: anywhere },
  { name: 'Puerto Arenas', featureType: 'village', county: 'Tres Cruces', placement: c(196), alternateNames: ['Pto. Arenas'] },
  { name: 'Salinas del Sur', featureType: 'village', county: 'Tres Cruces', placement: c(217) },
  { name: 'Tres Lagunas', featureType: 'hamlet', county: 'Tres Cruces', placement: anywhere, alternateNames: ['3 Lagunas'] },
  { name: 'Las Garzas', featureType: 'village', county: 'Tres Cruces', placement: anywhere },
  { name: 'Médanos', featureType: 'locality', county: 'Tres Cruces', placement: anywhere, alternateNames: ['Medanos', 'Los Médanos'] },
  { name: 'Punta Brava', featureType: 'village', county: 'Tres Cruces', placement: c(185) },
  { name: 'El Junco', featureType: 'hamlet', county: 'Tres Cruces', placement: anywhere },
  { name: 'Granja El Ombú', featureType: 'farm', county: 'Tres Cruces', placement: anywhere, alternateNames: ['Granja El Ombu'] },
  // Serrana (Serra Alta)
  { name: 'Vila Serena', featureType: 'town', county: 'Serrana', placement: at(0, 22), radiusMeters: 2000, alternateNames: ['V. Serena', 'Vila Serena do Norte', 'Serena'] },
  { name: 'Porto Novo', featureType: 'town', county: 'Serrana', placement: c(95), radiusMeters: 1700, alternateNames: ['Enseada Velha', 'Pto. Novo'] },
  { name: 'Pedra Branca', featureType: 'village', county: 'Serrana', placement: anywhere },
  { name: 'São Jorge', featureType: 'village', county: 'Serrana', placement: anywhere, alternateNames: ['Sao Jorge', 'S. Jorge'] },
  { name: 'Bellevue', featureType: 'hamlet', county: 'Serrana', placement: anywhere },
  { name: 'Santa Rosa', featureType: 'village', county: 'Serrana', placement: anywhere },
  { name: 'Alto da Serra', featureType: 'hamlet', county: 'Serrana', placement: anywhere },
  { name: 'Campo Alegre', featureType: 'village', county: 'Serrana', placement: anywhere, radiusMeters: 1000 },
  { name: 'Lajeado Grande', featureType: 'village', county: 'Serrana', placement: anywhere },
  { name: 'Morro Azul', featureType: 'hamlet', county: 'Serrana', placement: anywhere },
  { name: 'Vargem Bonita', featureType: 'village', county: 'Serrana', placement: anywhere },
  { name: 'Fazenda Boa Vista', featureType: 'farm', county: 'Serrana', placement: anywhere, radiusMeters: 2000 },
  { name: 'Quinta das Águias', featureType: 'estate', county: 'Serrana', placement: anywhere, alternateNames: ['Quinta das Aguias'] },
  // Rio Fundo (Serra Alta)
  { name: 'Rio Fundo', featureType: 'town', county: 'Rio Fundo', placement: at(4, -18), radiusMeters: 1800, alternateNames: ['Río Fundo', 'Vila do Rio Fundo'] },
  { name: 'San Telmo', featureType: 'village', county: 'Rio Fundo', placement: at(-10, -30), alternateNames: ['São Telmo'] },
  { name: 'Barra do Sul', featureType: 'town', county: 'Rio Fundo', placement: c(266), radiusMeters: 1500, alternateNames: ['Barra'] },
  { name: 'Lagoa Seca', featureType: 'village', county: 'Rio Fundo', placement: anywhere },
  { name: 'Três Pontes', featureType: 'village', county: 'Rio Fundo', placement: anywhere, alternateNames: ['Tres Pontes', '3 Pontes'] },
  { name: 'Vila Nova da Serra', featureType: 'village', county: 'Rio Fundo', placement: anywhere, alternateNames: ['V. Nova da Serra'] },
  { name: 'Cachoeirinha', featureType: 'hamlet', county: 'Rio Fundo', placement: anywhere },
  { name: 'Capela Velha', featureType: 'hamlet', county: 'Rio Fundo', placement: anywhere },
  { name: 'Ponte Alta', featureType: 'village', county: 'Rio Fundo', placement: anywhere },
  { name: 'Areia Branca', featureType: 'village', county: 'Rio Fundo', placement: anywhere },
  { name: 'Sítio do Meio', featureType: 'farm', county: 'Rio Fundo', placement: anywhere, alternateNames: ['Sitio do Meio'] },
  { name: 'Estação Rio Fundo', featureType: 'station', county: 'Rio Fundo', placement: at(6, -16), alternateNames: ['Estacao Rio Fundo'] },
  // Haut-Levant (Côte-du-Levant)
  { name: 'Saint-Aubrac', featureType: 'town', county: 'Haut-Levant', placement: at(40, 24), radiusMeters: 2500, alternateNames: ['St-Aubrac', 'St. Aubrac', 'Saint Aubrac', 'Port-Aubrac'] },
  { name: 'Beaulieu', featureType: 'village', county: 'Haut-Levant', placement: anywhere, radiusMeters: 1100 },
  { name: 'Bellevue', featureType: 'village', county: 'Haut-Levant', placement: anywhere },
  { name: 'Les Saules', featureType: 'village', county: 'Haut-Levant', placement: anywhere },
  { name: 'Roche-Claire', featureType: 'hamlet', county: 'Haut-Levant', placement: anywhere, alternateNames: ['Roche Claire'] },
  { name: 'Pré-Fleuri', featureType: 'hamlet', county: 'Haut-Levant', placement: anywhere, alternateNames: ['Pre Fleuri', 'Pré Fleuri'] },
  { name: 'Port-Joie', featureType: 'village', county: 'Haut-Levant', placement: c(50) },
  { name: 'Les Genêts', featureType: 'hamlet', county: 'Haut-Levant', placement: anywhere, alternateNames: ['Les Genets'] },
  { name: 'Saint-Firmin-des-Landes', featureType: 'village', county: 'Haut-Levant', placement: anywhere, alternateNames: ['St-Firmin-des-Landes', 'Saint-Firmin'] },
  { name: 'Domaine des Brumes', featureType: 'estate', county: 'Haut-Levant', placement: anywhere, radiusMeters: 1500 },
  { name: 'Ferme Lacoste', featureType: 'farm', county: 'Haut-Levant', placement: anywhere },
  // Basse-Côte (Côte-du-Levant)
  { name: 'Val-Marin', featureType: 'town', county: 'Basse-Côte', placement: at(36, -22), radiusMeters: 1600, alternateNames: ['Val Marin'] },
  { name: 'Sainte-Odile-des-Dunes', featureType: 'village', county: 'Basse-Côte', placement: c(305), alternateNames: ['Ste-Odile-des-Dunes', 'Sainte-Odile'] },
  { name: 'Les Pins', featureType: 'village', county: 'Basse-Côte', placement: anywhere },
  { name: 'Le Gué', featureType: 'hamlet', county: 'Basse-Côte', placement: anywhere, alternateNames: ['Le Gue'] },
  { name: 'Fontbelle', featureType: 'village', county: 'Basse-Côte', placement: anywhere },
  { name: 'La Brèche', featureType: 'hamlet', county: 'Basse-Côte', placement: anywhere, alternateNames: ['La Breche'] },
  { name: "Bourg-l'Étang", featureType: 'village', county: 'Basse-Côte', placement: anywhere, alternateNames: ["Bourg l'Etang", 'Bourg-Létang'] },
  { name: 'Le Moulin-Neuf', featureType: 'village', county: 'Basse-Côte', placement: anywhere },
  { name: 'Mas des Cigales', featureType: 'farm', county: 'Basse-Côte', placement: anywhere },
  { name: 'Gare de Val-Marin', featureType: 'station', county: 'Basse-Côte', placement: at(38, -20) },
  // Eastmoor (Côte-du-Levant)
  { name: 'Millbrook', featureType: 'town', county: 'Eastmoor', placement: at(62, -14), radiusMeters: 1800, alternateNames: ['Mill Brook', 'Millbrooke'] },
  { name: 'Fairhaven', featureType: 'town', county: 'Eastmoor', placement: c(-25), alternateNames: ['Fair Haven'] },
  { name: 'Ashcombe', featureType: 'village', county: 'Eastmoor', placement: anywhere },
  { name: 'Kingsferry', featureType: 'village', county: 'Eastmoor', placement: anywhere, alternateNames: ["King's Ferry"] },
  { name: 'Hollow Oak', featureType: 'hamlet', county: 'Eastmoor', placement: anywhere },
  { name: 'Pennywell', featureType: 'village', county: 'Eastmoor', placement: anywhere, radiusMeters: 800 },
  { name: 'Cressly', featureType: 'village', county: 'Eastmoor', placement: anywhere },
  { name: 'Brambleford', featureType: 'village', county: 'Eastmoor', placement: anywhere },
  { name: 'Otterby', featureType: 'hamlet', county: 'Eastmoor', placement: anywhere },
  { name: 'Windle End', featureType: 'hamlet', county: 'Eastmoor', placement: anywhere },
  { name: 'Eastpoint', featureType: 'locality', county: 'Eastmoor', placement: anywhere },
  { name: 'Greystone Farm', featureType: 'farm', county: 'Eastmoor', placement: anywhere },
  { name: 'Harrowgate Estate', featureType: 'estate', county: 'Eastmoor', placement: anywhere, radiusMeters: 1200 },
  // Natural features (points)
  { name: 'Monte Verdemar', featureType: 'mountain', county: 'Serrana', placement: at(-6, 30), radiusMeters: 6000, alternateNames: ['Mont Verdemar', 'Mount Verdemar'] },
  { name: 'Pico do Vento', featureType: 'peak', county: 'Serrana', placement: at(-8, 33), alternateNames: ['Pico del Viento'] },
  { name: 'Cerro Centinela', featureType: 'peak', county: 'Cerrillos', placement: anywhere },
  { name: "Pic de l'Aigle", featureType: 'peak', county: 'Haut-Levant', placement: at(34, 10.5), alternateNames: ['Pic de lAigle', 'Eagle Peak'] },
  { name: 'Colina Redonda', featureType: 'hill', county: 'Alisos', placement: anywhere },
  { name: 'Morro do Sino', featureType: 'hill', county: 'Rio Fundo', placement: anywhere },
  { name: 'Beacon Hill', featureType: 'hill', county: 'Eastmoor', placement: anywhere },
  { name: 'Paso de los Vientos', featureType: 'pass', county: 'Serrana', placement: at(-14, 20), alternateNames: ['Passo dos Ventos'] },
  { name: 'Cabo Tormento', featureType: 'cape', county: 'Tres Cruces', placement: c(203, 0.4), alternateNames: ['Cape Tormento'] },
  { name: 'East Cape', featureType: 'cape', county: 'Eastmoor', placement: c(-12, 0.4), alternateNames: ["Cap de l'Est", 'Cabo del Este'] },
  { name: 'Playa Larga', featureType: 'beach', county: 'Tres Cruces', placement: c(210, 0.4) },
  { name: 'Praia Branca', featureType: 'beach', county: 'Rio Fundo', placement: c(258, 0.4) },
  { name: 'Plage des Dunes', featureType: 'beach', county: 'Basse-Côte', placement: c(312, 0.4) },
  // More settlements, listed last so that adding them did not move the places above.
  { name: 'San Bernardo del Monte', featureType: 'village', county: 'Alisos', placement: anywhere, alternateNames: ['S. Bernardo del Monte'] },
  { name: 'La Quebrada', featureType: 'hamlet', county: 'Alisos', placement: anywhere },
  { name: 'Villa Clara del Norte', featureType: 'village', county: 'Alisos', placement: anywhere },
  { name: 'Las Acacias', featureType: 'village', county: 'Cerrillos', placement: anywhere },
  { name: 'Paso Ancho', featureType: 'hamlet', county: 'Cerrillos', placement: anywhere },
  { name: 'Los Sauces', featureType: 'village', county: 'Cerrillos', placement: anywhere, radiusMeters: 700 },
  { name: 'Las Dunas', featureType: 'village', county: 'Tres Cruces', placement: anywhere },
  { name: 'Bañado Grande', featureType: 'hamlet', county: 'Tres Cruces', placement: anywhere, alternateNames: ['Banado Grande'] },
  { name: 'Serrinha do Norte', featureType: 'village', county: 'Serrana', placement: anywhere },
  { name: 'Águas Claras', featureType: 'village', county: 'Serrana', placement: anywhere, alternateNames: ['Aguas Claras'] },
  { name: 'Boa Esperança', featureType: 'hamlet', county: 'Serrana', placement: anywhere, alternateNames: ['Boa Esperanca'] },
  { name: 'Santa Luzia do Sul', featureType: 'village', county: 'Rio Fundo', placement: anywhere, alternateNames: ['Sta. Luzia do Sul'] },
  { name: 'Pinhal', featureType: 'hamlet', county: 'Rio Fundo', placement: anywhere },
  { name: 'Cruzeiro Velho', featureType: 'village', county: 'Rio Fundo', placement: anywhere, alternateNames: ['Cruzeiro'] },
  { name: 'La Vallée-aux-Loups', featureType: 'village', county: 'Haut-Levant', placement: anywhere, alternateNames: ['La Vallee aux Loups'] },
  { name: 'Sainte-Brigitte', featureType: 'village', county: 'Haut-Levant', placement: anywhere, alternateNames: ['Ste-Brigitte'] },
  { name: 'Les Hauts-Prés', featureType: 'hamlet', county: 'Haut-Levant', placement: anywhere, alternateNames: ['Les Hauts Pres'] },
  { name: 'Port-Sablon', featureType: 'village', county: 'Basse-Côte', placement: anywhere },
  { name: 'Saint-Cyrille', featureType: 'village', county: 'Basse-Côte', placement: anywhere, alternateNames: ['St-Cyrille'] },
  { name: 'La Garenne', featureType: 'hamlet', county: 'Basse-Côte', placement: anywhere },
  { name: 'Little Ashcombe', featureType: 'hamlet', county: 'Eastmoor', placement: anywhere },
  { name: 'Stonebridge', featureType: 'village', county: 'Eastmoor', placement: anywhere },
  { name: 'Elmstead', featureType: 'village', county: 'Eastmoor', placement: anywhere, radiusMeters: 900 },
  { name: 'Foxley Green', featureType: 'hamlet', county: 'Eastmoor', placement: anywhere },
];

const SETTLEMENT_SPACING_KM = 2.5; // kept between scattered settlements
const placed = new Map<PlaceSpec, Pt>();
for (const p of places) {
  if ('at' in p.placement) placed.set(p, p.placement.at);
  else if ('coast' in p.placement) placed.set(p, coastPoint(p.placement.coast, p.placement.inset));
}

const lakes = [
  { name: 'Laguna Azul', county: 'Tres Cruces', center: [-55, -16] as Pt, radius: 1.8, alternateNames: ['Lag. Azul'] },
  { name: 'Lagoa Dourada', county: 'Rio Fundo', center: [-8, -8] as Pt, radius: 1.5, alternateNames: ['Laguna Dorada'] },
  { name: 'Lac des Saules', county: 'Haut-Levant', center: [52, 18] as Pt, radius: 1.2, alternateNames: ['Lake of the Willows'] },
].map((l) => ({ ...l, ring: blob(l.center, l.radius, 16) }));

for (const p of places) {
  if (placed.has(p)) continue;
  const county = counties.find((u) => u.name === p.county)!;
  const xs = county.ring.map((v) => v[0]);
  const ys = county.ring.map((v) => v[1]);
  for (let attempt = 0; ; attempt++) {
    if (attempt > 5000) throw new Error(`no room for ${p.name} in ${p.county}`);
    const q: Pt = [round3(Math.min(...xs) + random() * (Math.max(...xs) - Math.min(...xs))), round3(Math.min(...ys) + random() * (Math.max(...ys) - Math.min(...ys)))];
    if (!insideRing(q, county.ring) || distanceToRing(q, county.ring) < 1.5) continue;
    if (lakes.some((l) => distance(q, l.center) < l.radius + 1.5)) continue;
    if ([...placed.values()].some((o) => distance(o, q) < SETTLEMENT_SPACING_KM)) continue;
    placed.set(p, q);
    break;
  }
}
const placeAt = (name: string, county?: string): Pt => {
  const spec = places.find((p) => p.name === name && (!county || p.county === county));
  if (!spec) throw new Error(`unknown place ${name}`);
  return placed.get(spec)!;
};

// --------------------------------------------------------------------------------------- rivers and roads
const rioClaro = wanderingLine([[-30, 22], [-34, 8], [-38, -10], [-40, -30], coastPoint(236, 0.3)], 1.5, 0.4, lineRandom);
const arroyoNegro = wanderingLine([[-62, 8], [-52, -4], nearestVertex(rioClaro, [-38, -10])], 1.5, 0.4, lineRandom);
const rioFundo = wanderingLine([[-4, 28], [2, 10], [6, -14], [2, -32], coastPoint(262, 0.3)], 1.5, 0.4, lineRandom);
const ribeiraoDasPedras = wanderingLine([[14, 12], [10, 0], nearestVertex(rioFundo, [5, -8])], 1.5, 0.4, lineRandom);
const riviereBlanche = wanderingLine([[30, 14], [42, 6], [55, -3], coastPoint(-5, 0.3)], 1.5, 0.4, lineRandom);
const ruisseauDesSaules = wanderingLine([[52, 16.6], [56, 8], nearestVertex(riviereBlanche, [55, -3])], 1.5, 0.3, lineRandom);
const millBrook = wanderingLine([[68, -3], [63.5, -13], [66, -24], coastPoint(-38, 0.3)], 1.5, 0.3, lineRandom);

const ruta12 = wanderingLine([placeAt('Puerto Lindo'), [-44, 22], placeAt('Villa Alisos'), [-36, 0], placeAt('Valle Hondo'), placeAt('San Telmo', 'Cerrillos'), [-36, -40], placeAt('Salinas del Sur')], 2, 0.3, lineRandom);
const ruta1West = wanderingLine([placeAt('Villa Alisos'), [-24, 16], [-12, 19], placeAt('Vila Serena')], 2, 0.3, lineRandom);
const ruta1East = wanderingLine([placeAt('Vila Serena'), [14, 20], [28, 22], placeAt('Saint-Aubrac'), [54, 2], placeAt('Millbrook')], 2, 0.3, lineRandom);
const routeDeLaCote = wanderingLine([placeAt('Saint-Aubrac'), [36, 4], placeAt('Val-Marin'), placeAt('Sainte-Odile-des-Dunes')], 2, 0.3, lineRandom);
const estradaDoSul = wanderingLine([placeAt('San Telmo', 'Cerrillos'), placeAt('San Telmo', 'Rio Fundo'), placeAt('Rio Fundo'), [20, -16], placeAt('Val-Marin')], 2, 0.3, lineRandom);
const trilhaDoPico = wanderingLine([placeAt('Vila Serena'), [-4, 26], placeAt('Paso de los Vientos'), placeAt('Pico do Vento')], 1, 0.2, lineRandom);
const sentierDesCretesA = wanderingLine([placeAt("Pic de l'Aigle"), placeAt('Saint-Aubrac')], 1, 0.2, lineRandom);
const sentierDesCretesB = wanderingLine([placeAt("Pic de l'Aigle"), placeAt('Port-Joie')], 1, 0.2, lineRandom);

// The hamlet on Ruta 12 twelve kilometres from Puerto Lindo ("12 km by road from Puerto Lindo on Ruta 12").
placed.set(places.find((p) => p.name === 'El Mirador')!, geodesicPointAlong(ruta12, 12_000));

interface LineSpec {
  name: string;
  featureType: string;
  parts: Pt[][];
  alternateNames?: string[];
}
const lines: LineSpec[] = [
  { name: 'Río Claro', featureType: 'river', parts: [rioClaro], alternateNames: ['Rio Claro', 'R. Claro'] },
  { name: 'Arroyo Negro', featureType: 'stream', parts: [arroyoNegro], alternateNames: ['Aº Negro', 'Arroyo Prieto'] },
  { name: 'Rio Fundo', featureType: 'river', parts: [rioFundo], alternateNames: ['Río Fundo', 'Rio Fundo River'] },
  { name: 'Ribeirão das Pedras', featureType: 'stream', parts: [ribeiraoDasPedras], alternateNames: ['Ribeirao das Pedras'] },
  { name: 'Rivière Blanche', featureType: 'river', parts: [riviereBlanche], alternateNames: ['Riviere Blanche', 'White River'] },
  { name: 'Ruisseau des Saules', featureType: 'stream', parts: [ruisseauDesSaules] },
  { name: 'Mill Brook', featureType: 'stream', parts: [millBrook], alternateNames: ['Millbrook Stream'] },
  { name: 'Ruta 12', featureType: 'road', parts: [ruta12], alternateNames: ['Ruta Provincial 12', 'RP 12', 'R12'] },
  { name: 'Ruta 1', featureType: 'road', parts: [ruta1West, ruta1East], alternateNames: ['Estrada 1', 'Route 1', 'RN 1'] },
  { name: 'Route de la Côte', featureType: 'road', parts: [routeDeLaCote], alternateNames: ['Route de la Cote', 'Coast Road'] },
  { name: 'Estrada do Sul', featureType: 'road', parts: [estradaDoSul], alternateNames: ['Camino del Sur'] },
  { name: 'Trilha do Pico', featureType: 'trail', parts: [trilhaDoPico], alternateNames: ['Sendero del Pico'] },
  { name: 'Sentier des Crêtes', featureType: 'trail', parts: [sentierDesCretesA, sentierDesCretesB], alternateNames: ['Sentier des Cretes'] },
];

// Features made from the lines: river mouths, a waterfall, bridges where roads cross rivers.
const derived: { name: string; featureType: string; at: Pt; alternateNames?: string[]; radiusMeters?: number }[] = [
  { name: 'Boca del Río Claro', featureType: 'river mouth', at: rioClaro[rioClaro.length - 1]!, alternateNames: ['Boca del Rio Claro'] },
  { name: 'Foz do Rio Fundo', featureType: 'river mouth', at: rioFundo[rioFundo.length - 1]! },
  { name: 'Embouchure de la Rivière Blanche', featureType: 'river mouth', at: riviereBlanche[riviereBlanche.length - 1]!, alternateNames: ['Embouchure de la Riviere Blanche'] },
  { name: 'Cachoeira do Véu', featureType: 'waterfall', at: rioFundo[4]!, alternateNames: ['Cachoeira do Veu', 'Salto del Velo'] },
];
const bridgeNames: Record<string, string[]> = {
  'Ruta 12|Río Claro': ['Puente Río Claro', 'Puente Viejo'],
  'Ruta 1|Río Claro': ['Puente de las Nacientes'],
  'Ruta 1|Rio Fundo': ['Ponte Serena'],
  'Ruta 1|Rivière Blanche': ['Pont Blanc'],
  'Ruta 1|Ruisseau des Saules': ['Pont des Saules'],
  'Route de la Côte|Rivière Blanche': ['Pont de la Côte'],
  'Estrada do Sul|Rio Fundo': ['Ponte do Sul'],
  'Sentier des Crêtes|Rivière Blanche': ['Passerelle des Crêtes', 'Passerelle du Nord'],
  'Trilha do Pico|Rio Fundo': ['Pinguela do Pico'],
};
for (const road of lines.filter((l) => l.featureType === 'road' || l.featureType === 'trail'))
  for (const river of lines.filter((l) => l.featureType === 'river' || l.featureType === 'stream')) {
    const crossings = road.parts.flatMap((rp) => river.parts.flatMap((wp) => lineCrossings(rp, wp)));
    const key = `${road.name}|${river.name}`;
    const names = bridgeNames[key] ?? [];
    if (crossings.length !== names.length) throw new Error(`${key}: ${crossings.length} crossings, ${names.length} bridge names`);
    crossings.forEach((x, i) => derived.push({ name: names[i]!, featureType: 'bridge', at: x, radiusMeters: 50 }));
  }

// --------------------------------------------------------------------------------------- output features
function toLonLat([x, y]: Pt): Position {
  return [Math.round((CENTER_LON + x / KM_PER_DEG_LON) * 1e6) / 1e6, Math.round((CENTER_LAT + y / KM_PER_DEG_LAT) * 1e6) / 1e6];
}
/** Inverse of toLonLat (before its rounding). */
function fromLonLat([lon, lat]: [number, number]): Pt {
  return [(lon - CENTER_LON) * KM_PER_DEG_LON, (lat - CENTER_LAT) * KM_PER_DEG_LAT];
}
function polygon(ring: Ring): Polygon {
  const ccw = signedArea(ring) > 0 ? ring : [...ring].reverse();
  const coords = ccw.map(toLonLat);
  return { type: 'Polygon', coordinates: [[...coords, coords[0]!]] };
}

let nextId = 1;
const features: Feature[] = [];
function add(name: string, featureType: string, geometry: Geometry, extra: { alternateNames?: string[]; stateProvince?: string; county?: string; radiusMeters?: number }): void {
  const properties: Record<string, string | number> = { id: `qv-${String(nextId++).padStart(4, '0')}`, name };
  if (extra.alternateNames?.length) properties.alternateNames = extra.alternateNames.join('|');
  properties.featureType = featureType;
  properties.countryCode = COUNTRY_CODE;
  if (extra.stateProvince) properties.stateProvince = extra.stateProvince;
  if (extra.county) properties.county = extra.county;
  if (extra.radiusMeters !== undefined) properties.radiusMeters = extra.radiusMeters;
  features.push({ type: 'Feature', properties, geometry });
}

/** The one county (and its province) holding every given point, or just the province, or nothing. */
function adminOf(points: Pt[]): { stateProvince?: string; county?: string } {
  const found = new Set(points.map((p) => countyAt(p)?.name ?? '(sea)'));
  const provinceNames = new Set([...found].map((n) => counties.find((u) => u.name === n)?.province ?? '(sea)'));
  if (found.size === 1 && !found.has('(sea)')) {
    const county = [...found][0]!;
    return { stateProvince: counties.find((u) => u.name === county)!.province!, county };
  }
  return provinceNames.size === 1 && !provinceNames.has('(sea)') ? { stateProvince: [...provinceNames][0]! } : {};
}

add(COUNTRY_NAME, 'country', polygon(coast), { alternateNames: ['Verdemar', 'República de Verdemar', 'Ilha Verdemar', 'Île Verdemar', 'Verdemar Island'] });
for (const p of provinces) add(p.name, 'stateProvince', polygon(p.ring), { alternateNames: p.alternateNames, stateProvince: p.name });
for (const u of counties) add(u.name, 'county', polygon(u.ring), { alternateNames: u.alternateNames, stateProvince: u.province!, county: u.name });

const pointFeatures = [
  ...places.map((p) => ({ ...p, at: placed.get(p)! })),
  ...derived.map((d) => ({ ...d, county: countyAt(d.at)?.name ?? '(sea)' })),
];
for (const p of pointFeatures) {
  const admin = adminOf([p.at]);
  if (admin.county !== p.county) throw new Error(`${p.name} meant for ${p.county} lies in ${admin.county ?? 'the sea'}`);
  add(p.name, p.featureType, { type: 'Point', coordinates: toLonLat(p.at) }, { ...p, ...admin });
}
for (const l of lines) {
  const geometry: Geometry = l.parts.length === 1 ? { type: 'LineString', coordinates: l.parts[0]!.map(toLonLat) } : { type: 'MultiLineString', coordinates: l.parts.map((part) => part.map(toLonLat)) };
  add(l.name, l.featureType, geometry, { ...l, ...adminOf(l.parts.flat()) });
}
for (const l of lakes) {
  if (!l.ring.every((v) => countyAt(v)?.name === l.county)) throw new Error(`${l.name} spills out of ${l.county}`);
  add(l.name, 'lake', polygon(l.ring), { ...l, ...adminOf(l.ring) });
}

// The bay: the water between the coast and the convex hull of the bay's shore.
const bayShore = coast.filter((v) => Math.abs(wrapAngle(Math.atan2(v[1], v[0]) - BAY_ANGLE)) <= 1.3 * BAY_HALF_WIDTH);
const bayWater = turf.difference(turf.featureCollection([turf.convex(turf.multiPoint(bayShore.map(toLonLat)))!, turf.feature(polygon(coast))]))!;
const bayGeometry = bayWater.geometry.type === 'Polygon' ? bayWater.geometry : { type: 'Polygon' as const, coordinates: bayWater.geometry.coordinates.reduce((a, b) => (turf.area(turf.polygon(a)) > turf.area(turf.polygon(b)) ? a : b)) };
add('Bahía Linda', 'bay', turf.rewind(bayGeometry) as Polygon, { alternateNames: ['Bahia Linda', 'Baía Linda', 'Lindo Bay'], stateProvince: 'Poniente', county: 'Alisos' });

const islet = blob(coastPoint(195, -9), 1.6, 14);
if (islet.some((v) => insideRing(v, coast) || distanceToRing(v, coast) < 3)) throw new Error('the islet touches the island');
add('Isla Gaviota', 'island', polygon(islet), { alternateNames: ['Ilhéu da Gaivota', 'Gull Island', 'Île aux Mouettes'], stateProvince: 'Poniente', county: 'Tres Cruces' });

const collection: FeatureCollection = { type: 'FeatureCollection', features };
writeFileSync(join(OUT_DIR, 'demo.geojson'), JSON.stringify(collection, null, 0).replace(/\{"type":"Feature"/g, '\n{"type":"Feature"') + '\n');

const CSV_COLUMNS = ['id', 'name', 'alternateNames', 'latitude', 'longitude', 'featureType', 'countryCode', 'stateProvince', 'county', 'radiusMeters'];
const csvRows = features
  .filter((f) => f.geometry.type === 'Point')
  .map((f) => {
    const [lon, lat] = (f.geometry as { coordinates: Position }).coordinates;
    const p = f.properties!;
    return [p.id, p.name, p.alternateNames ?? '', lat, lon, p.featureType, p.countryCode, p.stateProvince ?? '', p.county ?? '', p.radiusMeters ?? ''];
  });
writeFileSync(join(OUT_DIR, 'demo-places.csv'), stringify(csvRows, { header: true, columns: CSV_COLUMNS }));

// --------------------------------------------------------------------------------- demo batch of localities
/** Where a named point feature lies, [latitude, longitude]; `county` picks between places sharing a name. */
function latLonOf(name: string, county?: string): [number, number] {
  const f = features.find((x) => x.properties!.name === name && x.geometry.type === 'Point' && (!county || x.properties!.county === county));
  if (!f) throw new Error(`no point feature ${name}`);
  const [lon, lat] = (f.geometry as { coordinates: Position }).coordinates as [number, number];
  return [lat, lon];
}

/** Degrees, minutes and whole seconds with a hemisphere letter, as a label would write them. */
function dms(value: number, positive: string, negative: string): string {
  const abs = Math.abs(value);
  const totalSeconds = Math.round(abs * 3600);
  const d = Math.floor(totalSeconds / 3600);
  const m = Math.floor((totalSeconds % 3600) / 60);
  const s = totalSeconds % 60;
  return `${d}°${String(m).padStart(2, '0')}'${String(s).padStart(2, '0')}"${value >= 0 ? positive : negative}`;
}
/** Whole degrees and minutes with a hemisphere letter ("45°16'S"). */
function degreesMinutes(value: number, positive: string, negative: string): string {
  const totalMinutes = Math.round(Math.abs(value) * 60);
  return `${Math.floor(totalMinutes / 60)}°${String(totalMinutes % 60).padStart(2, '0')}'${value >= 0 ? positive : negative}`;
}
const dmsPair = ([lat, lon]: [number, number]): string => `${dms(lat, 'N', 'S')} ${dms(lon, 'E', 'W')}`;
const decimalPair = ([lat, lon]: [number, number], decimals: number): string => `${Math.abs(lat).toFixed(decimals)} S, ${Math.abs(lon).toFixed(decimals)} W`;

interface LocalitySpec {
  locality: string;
  /** What kind of locality text this is, for people reading the demo. */
  form: string;
  /** Names the text refers to that the demo gazetteer holds (as name or alternate name). */
  places: string[];
  /** Names the text uses that the gazetteer deliberately lacks (absent places, misspellings). */
  absent?: string[];
  countryCode?: string;
  country?: string;
  stateProvince?: string;
  county?: string;
  decimalLatitude?: number;
  decimalLongitude?: number;
  geodeticDatum?: string;
  verbatimCoordinates?: string;
  note?: string;
}

const QV = { countryCode: COUNTRY_CODE, country: COUNTRY_NAME };
const marismaTown = latLonOf('Marisma');
const valMarinTown = latLonOf('Val-Marin');
const rioFundoTown = latLonOf('Rio Fundo', 'Rio Fundo');
const porto = latLonOf('Porto Novo');
const pico = latLonOf('Pico do Vento');
const lagoaSeca = latLonOf('Lagoa Seca');
const pedra = latLonOf('Pedra Branca', 'Serrana');
const localities: LocalitySpec[] = [
  { locality: 'Puerto Lindo', form: 'named place', places: ['Puerto Lindo'], ...QV, stateProvince: 'Poniente' },
  { locality: 'Vila Serena', form: 'named place', places: ['Vila Serena'], ...QV },
  { locality: '10 km NE of Vila Serena', form: 'distance and heading', places: ['Vila Serena'], ...QV, stateProvince: 'Serra Alta' },
  { locality: 'Millbrook, 5 km S', form: 'distance and heading, place first', places: ['Millbrook'], ...QV },
  { locality: '3 km N and 2 km E of Valle Hondo', form: 'two orthogonal offsets', places: ['Valle Hondo'], ...QV, stateProvince: 'Poniente', county: 'Cerrillos' },
  { locality: '5 km from Saint-Aubrac', form: 'distance only', places: ['Saint-Aubrac'], ...QV },
  { locality: '12 km by road from Puerto Lindo on Ruta 12', form: 'path offset', places: ['Puerto Lindo', 'Ruta 12'], ...QV, note: 'El Mirador lies 12 km along Ruta 12 from Puerto Lindo' },
  { locality: 'between Val-Marin and Millbrook', form: 'between two places', places: ['Val-Marin', 'Millbrook'], ...QV },
  { locality: 'near Fairhaven', form: 'near', places: ['Fairhaven'], ...QV },
  { locality: 'junction of Río Claro and Arroyo Negro', form: 'junction of two lines', places: ['Río Claro', 'Arroyo Negro'], ...QV },
  { locality: 'confluence of Rio Fundo and Ribeirão das Pedras', form: 'junction of two lines', places: ['Rio Fundo', 'Ribeirão das Pedras'], ...QV, stateProvince: 'Serra Alta' },
  { locality: '8 km al S de Puerto Lindo, camino a Villa Alisos', form: 'distance and heading (Spanish)', places: ['Puerto Lindo', 'Villa Alisos'], ...QV },
  { locality: '3 km ao N de Vila Serena', form: 'distance and heading (Portuguese)', places: ['Vila Serena'], ...QV },
  { locality: 'à 5 km au sud-ouest de Saint-Aubrac', form: 'distance and heading (French)', places: ['Saint-Aubrac'], ...QV },
  { locality: '2 km al sur de Pto. Lindo', form: 'distance and heading (Spanish), abbreviated name', places: ['Pto. Lindo'], ...QV },
  { locality: 'San Telmo', form: 'ambiguous: two places of this name in different provinces', places: ['San Telmo'], ...QV },
  { locality: 'San Telmo', form: 'named place narrowed by province', places: ['San Telmo'], ...QV, stateProvince: 'Serra Alta' },
  { locality: 'Santa Rosa', form: 'ambiguous: two places of this name in different provinces', places: ['Santa Rosa'], countryCode: COUNTRY_CODE },
  { locality: 'Bellevue, 2 km W', form: 'ambiguous offset: Bellevue in Serra Alta and in Côte-du-Levant', places: ['Bellevue'], ...QV },
  { locality: 'Los Pinos', form: 'named place narrowed by county (two Los Pinos in Poniente)', places: ['Los Pinos'], ...QV, stateProvince: 'Poniente', county: 'Tres Cruces' },
  { locality: 'Rio Fundo', form: 'ambiguous by type: a town, a river and a county share the name', places: ['Rio Fundo'], ...QV, stateProvince: 'Serra Alta' },
  { locality: 'Kingsfery', form: 'misspelt name (one letter missing from Kingsferry)', places: ['Kingsferry'], absent: ['Kingsfery'], ...QV },
  { locality: 'Villa Quimera', form: 'name absent from the gazetteer', places: [], absent: ['Villa Quimera'], ...QV },
  { locality: 'locality unknown', form: 'names no place', places: [], ...QV },
  { locality: 'sin localidad', form: 'names no place (Spanish)', places: [], ...QV, stateProvince: 'Poniente' },
  { locality: '', form: 'empty locality', places: [], ...QV },
  { locality: 'Puerto Lindo', form: 'named place (duplicate of an earlier row)', places: ['Puerto Lindo'], ...QV, stateProvince: 'Poniente' },
  { locality: 'Millbrook, 5 km S', form: 'distance and heading, place first (duplicate)', places: ['Millbrook'], ...QV },
  { locality: 'Millbrook, 5 km S', form: 'distance and heading, place first (duplicate)', places: ['Millbrook'], ...QV },
  { locality: `Pedra Branca, ${decimalPair(pedra, 4)}`, form: 'decimal coordinates in the text, no datum', places: ['Pedra Branca'], ...QV },
  { locality: `Track above Porto Novo, ${dmsPair(porto)} (WGS84)`, form: 'degrees-minutes-seconds in the text with datum', places: ['Porto Novo'], ...QV },
  { locality: `Ridge below Pico do Vento, ${degreesMinutes(pico[0] - 0.01, 'N', 'S')} ${degreesMinutes(pico[1], 'E', 'W')}`, form: 'degrees and minutes in the text, no datum', places: ['Pico do Vento'], ...QV },
  { locality: 'Lagoa Seca, margem da estrada', form: 'named place with coordinates in verbatimCoordinates and a datum', places: ['Lagoa Seca'], ...QV, verbatimCoordinates: dmsPair(lagoaSeca), geodeticDatum: 'WGS84' },
  { locality: 'Campo Alegre', form: 'named place with decimal verbatimCoordinates and no datum', places: ['Campo Alegre'], ...QV, verbatimCoordinates: `${latLonOf('Campo Alegre')[0].toFixed(3)}, ${latLonOf('Campo Alegre')[1].toFixed(3)}` },
  { locality: 'Marisma', form: 'existing coordinates, correct', places: ['Marisma'], ...QV, decimalLatitude: marismaTown[0], decimalLongitude: marismaTown[1], geodeticDatum: 'WGS84' },
  { locality: 'Val-Marin', form: 'existing coordinates with the longitude sign inverted', places: ['Val-Marin'], ...QV, decimalLatitude: valMarinTown[0], decimalLongitude: -valMarinTown[1], geodeticDatum: 'WGS84' },
  { locality: 'Rio Fundo, town square', form: 'existing coordinates with latitude and longitude swapped', places: ['Rio Fundo'], ...QV, decimalLatitude: rioFundoTown[1], decimalLongitude: rioFundoTown[0] },
  { locality: 'Saint-Aubrac, harbour', form: 'existing coordinates 0, 0', places: ['Saint-Aubrac'], ...QV, decimalLatitude: 0, decimalLongitude: 0 },
  { locality: 'Playa Larga', form: 'named place (beach)', places: ['Playa Larga'], ...QV },
  { locality: 'Cabo Tormento, cliffs', form: 'named place (cape)', places: ['Cabo Tormento'], ...QV },
  { locality: 'Isla Gaviota', form: 'named place (offshore islet, a polygon)', places: ['Isla Gaviota'], ...QV },
  { locality: 'Monte Verdemar, summit area', form: 'named place (mountain)', places: ['Monte Verdemar'], ...QV },
  { locality: 'Paso de los Vientos', form: 'named place (pass)', places: ['Paso de los Vientos'], ...QV },
  { locality: 'Laguna Azul, shore', form: 'named place (lake, a polygon)', places: ['Laguna Azul'], ...QV, stateProvince: 'Poniente' },
  { locality: 'Bahía Linda', form: 'named place (bay, a polygon in the sea)', places: ['Bahía Linda'], ...QV },
  { locality: 'Cachoeira do Véu', form: 'named place (waterfall)', places: ['Cachoeira do Véu'], ...QV },
  { locality: 'Puente Río Claro, Ruta 12', form: 'named place (bridge) with its road', places: ['Puente Río Claro', 'Ruta 12'], ...QV },
  { locality: '6 mi. W of Millbrook', form: 'distance and heading in miles', places: ['Millbrook'], ...QV },
  { locality: 'Sao Jorge', form: 'named place written without its accent', places: ['Sao Jorge'], ...QV },
  { locality: 'St-Aubrac, 4 km N', form: 'distance and heading, abbreviated name', places: ['St-Aubrac'], ...QV },
  { locality: 'Estancia San Isidro, 1.5 km E', form: 'distance and heading with a decimal distance', places: ['Estancia San Isidro'], ...QV },
  { locality: 'Route de la Côte, 3 km N of Val-Marin', form: 'distance and heading with a road named', places: ['Route de la Côte', 'Val-Marin'], ...QV },
  { locality: 'Lac des Saules, Haut-Levant', form: 'named place with its county in the text', places: ['Lac des Saules', 'Haut-Levant'], ...QV },
];

const TAXA = ['Verdemaria lindoensis', 'Serenella alticola', 'Aubracia marina', 'Millbrookia minor', 'Telmoa ambigua', 'Nebulosa verdemarensis', 'Gaviotella insularis', 'Quimeria fundensis'];
const BATCH_COLUMNS = ['occurrenceID', 'catalogNumber', 'scientificName', 'locality', 'countryCode', 'country', 'stateProvince', 'county', 'decimalLatitude', 'decimalLongitude', 'geodeticDatum', 'verbatimCoordinates'];
const batchRows = localities.map((l, i) => ({
  occurrenceID: `qvh-occ-${String(i + 1).padStart(4, '0')}`,
  catalogNumber: `QVH ${String(10421 + i * 7)}`,
  scientificName: TAXA[i % TAXA.length]!,
  locality: l.locality,
  countryCode: l.countryCode ?? '',
  country: l.country ?? '',
  stateProvince: l.stateProvince ?? '',
  county: l.county ?? '',
  decimalLatitude: l.decimalLatitude ?? '',
  decimalLongitude: l.decimalLongitude ?? '',
  geodeticDatum: l.geodeticDatum ?? '',
  verbatimCoordinates: l.verbatimCoordinates ?? '',
}));
writeFileSync(join(OUT_DIR, 'demo-localities.csv'), stringify(batchRows, { header: true, columns: BATCH_COLUMNS }));
const intent = localities.map((l, i) => ({ occurrenceID: batchRows[i]!.occurrenceID, locality: l.locality, form: l.form, places: l.places, absent: l.absent ?? [], ...(l.note ? { note: l.note } : {}) }));
writeFileSync(join(OUT_DIR, 'demo-localities.intent.json'), JSON.stringify(intent, null, 1) + '\n');
