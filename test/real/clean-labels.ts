/**
 * The clean-label measure, shared by test/real/clean-labels.test.ts and bench/clean-labels.ts: specimen
 * labels written the way a careful collector writes them, each for a TRUE point that is drawn first, so
 * the truth lies outside the code under test.
 *
 * How a label is made (seeded, bench/seeded-random.ts, so every run makes the same labels):
 * 1. A true point on the invented island of gazetteer/demo.geojson (CC0), placed from the gazetteer's own
 *    features with Vincenty's direct solution on WGS84 (Vincenty 1975, Survey Review 23:88; the registry
 *    package geodesy 2.4.0, C. Veness, MIT, not the code's geographiclib), and kept only when it lies on
 *    the island's land polygon.
 * 2. The record's stateProvince and county: the demo units that contain the true point, as a collector
 *    records the units where the specimen was taken.
 * 3. The label, in English, Spanish, Portuguese or French, with the phrases of the parser's corpus
 *    (test/fixtures/parse): distances written with the precision they state (to 0.5 km below 5 km, whole
 *    km from there on, so "25 km" is within 0.5 km of the true distance, as the published method reads it:
 *    Chapman & Wieczorek 2020, §Uncertainty Related to Offset Precision; see `Rounding` for the 5 km steps
 *    people also write, measured apart), headings rounded to the nearest of 8 or
 *    16 compass points (Chapman & Wieczorek 2020, §Uncertainty Related to Heading), decimals written
 *    with a comma in es, pt and fr, written coordinates rounded to the places they are written with.
 * Where the collector measures from: a random spot inside the place's stated extent (its radiusMeters,
 * Chapman & Wieczorek 2020, §Uncertainty Due to the Extent of the Feature), or the place's point when the
 * gazetteer states no extent. Forms and their truth:
 * - offset-heading: 3–40 km at any azimuth; "12 km NE of X".
 * - offset-orthogonal: 1–15 km north or south, then 1–15 km east or west; "3 km N and 2 km E of X".
 * - distance-only: 3–40 km at any azimuth; "12 km from X".
 * - near: up to max(extent, 1 km) beyond the place's extent (beyond its point when it has none), the
 *   meaning docs/method.md §3 gives "near" ([CHOICE] nearMinimumMeters; the published method gives no
 *   rule, so the truth follows the documented reading, not a wider guess); "near X".
 * - named-place: inside a place's stated extent (places with a stated radius only); the bare name.
 * - between: two places 5–30 km apart, the point 20–80 % of the way along the geodesic joining them and
 *   up to a tenth of their distance to either side; "between X and Y".
 * - offset-path: 3–40 km along a demo road or trail from the town at one of its ends (the line's own
 *   vertices, joined by geodesics); "12 km along Ruta 12 from X".
 * - coordinates: anywhere on the island, written in decimal degrees (2–5 places, signed or with
 *   hemisphere letters), degrees and minutes (0.1′) or degrees, minutes and seconds (1″), with and
 *   without "WGS84".
 * - unknown-place: a form above with a name the demo gazetteer lacks ("Villa Quimera" is its README's
 *   example of one); these cannot be georeferenced.
 *
 * Definitions (ours, after Wieczorek, Guo & Hijmans 2004 and Chapman & Wieczorek 2020, whose point-radius
 * circle must contain the place the specimen was taken):
 * - can be georeferenced: every place the label names is in the demo gazetteer (all forms but
 *   unknown-place; coordinates name none).
 * - answered: status "georeferenced".
 * - covered: geodesic distance (Vincenty inverse) from the true point to the answer's point ≤ the
 *   answer's radius (uncertaintyMeters).
 * - false: answered and not covered; for a label that cannot be georeferenced, answered at all.
 * Rates: answered % of the labels that can be georeferenced; false % of all labels; covered % of the
 * answered.
 */
import { readFileSync } from 'node:fs';
import LatLon from 'geodesy/latlon-ellipsoidal-vincenty.js';
import { booleanPointInPolygon } from '@turf/boolean-point-in-polygon';
import type { Feature as GeoJsonFeature, MultiPolygon, Polygon, Position } from 'geojson';
import { seededRandom } from '../../bench/seeded-random.ts';
import type { GazetteerStore } from '../../src/store/gazetteer-store.ts';
import { georeferenceRecord } from '../../src/locate/georeference-record.ts';
import type { LocateResult } from '../../src/locate/locate.ts';

export type Language = 'en' | 'es' | 'pt' | 'fr';
export const LANGUAGES: Language[] = ['en', 'es', 'pt', 'fr'];

export const FORMS = ['offset-heading', 'offset-orthogonal', 'distance-only', 'near', 'named-place', 'between', 'offset-path', 'coordinates', 'unknown-place'] as const;
export type Form = (typeof FORMS)[number];

export interface CleanLabel {
  form: Form;
  /** For coordinates, which way they are written ("decimal", "DMS with datum" …). */
  variant: string;
  language: Language;
  locality: string;
  countryCode: 'QV';
  stateProvince?: string;
  county?: string;
  latitude: number;
  longitude: number;
  georeferenceable: boolean;
}

export interface CleanOutcome {
  label: CleanLabel;
  result: LocateResult;
  answered: boolean;
  errorMeters?: number;
  covered?: boolean;
  falseGeoreference: boolean;
}

export interface CleanRates {
  labels: number;
  georeferenceable: number;
  answered: number;
  covered: number;
  falseGeoreferences: number;
  answeredPercent: number;
  falsePercent: number;
  coveredPercentOfAnswered: number;
}

interface DemoFeature extends GeoJsonFeature {
  properties: { name: string; featureType: string; radiusMeters?: number; stateProvince?: string; county?: string };
}
const FEATURES = (JSON.parse(readFileSync(new URL('../../gazetteer/demo.geojson', import.meta.url), 'utf8')) as { features: DemoFeature[] }).features;

interface Place {
  name: string;
  at: LatLon;
  /** The stated extent in meters; 0 when the gazetteer states none. */
  extent: number;
}

const SETTLEMENT_TYPES = new Set(['city', 'town', 'village', 'hamlet']);
const PLACES: Place[] = FEATURES.filter((f) => f.geometry.type === 'Point' && SETTLEMENT_TYPES.has(f.properties.featureType)).map((f) => {
  const [longitude, latitude] = (f.geometry as { coordinates: Position }).coordinates;
  return { name: f.properties.name, at: new LatLon(latitude!, longitude!), extent: f.properties.radiusMeters ?? 0 };
});
const PLACES_WITH_EXTENT = PLACES.filter((p) => p.extent > 0);

const units = (type: string) => FEATURES.filter((f) => f.properties.featureType === type) as (DemoFeature & { geometry: Polygon | MultiPolygon })[];
const ISLAND = units('country')[0]!;
const PROVINCES = units('stateProvince');
const COUNTIES = units('county');
const inside = (p: LatLon, unit: GeoJsonFeature<Polygon | MultiPolygon>) => booleanPointInPolygon([p.lon, p.lat], unit);

/** Names the demo gazetteer lacks: its README's example, and names made up here. */
const UNKNOWN_NAMES = ['Villa Quimera', 'Cañada del Olvido', 'Sítio Inexistente', 'Hameau-Perdu', 'Nowhere Cross'];

/** A line the text names and the town at one of its ends; the vertices run from the town outward. */
interface PathFrom {
  line: string;
  town: string;
  vertices: LatLon[];
}

/** Roads and trails with a town at an end (both checked to lie on the line's end vertex; a line through a town is left out: "along" would not say which way). */
const PATHS: PathFrom[] = [
  ['Ruta 12', 0, 'Puerto Lindo'],
  ['Ruta 12', 0, 'Salinas del Sur'],
  ['Ruta 1', 0, 'Villa Alisos'],
  ['Ruta 1', 1, 'Millbrook'],
  ['Route de la Côte', 0, 'Saint-Aubrac'],
  ['Route de la Côte', 0, 'Sainte-Odile-des-Dunes'],
  ['Estrada do Sul', 0, 'San Telmo'],
  ['Estrada do Sul', 0, 'Val-Marin'],
  ['Trilha do Pico', 0, 'Vila Serena'],
  ['Sentier des Crêtes', 1, 'Port-Joie'],
].map(([line, part, town]) => {
  const feature = FEATURES.find((f) => f.properties.name === line && (f.geometry.type === 'LineString' || f.geometry.type === 'MultiLineString'))!;
  const parts = feature.geometry.type === 'LineString' ? [feature.geometry.coordinates] : (feature.geometry as { coordinates: Position[][] }).coordinates;
  const vertices = parts[part as number]!.map(([lon, lat]) => new LatLon(lat!, lon!));
  const place = PLACES.find((p) => p.name === town)!;
  const oriented = place.at.distanceTo(vertices[0]!) < place.at.distanceTo(vertices.at(-1)!) ? vertices : vertices.reverse();
  if (place.at.distanceTo(oriented[0]!) > 1) throw new Error(`${line} does not end at ${town}`);
  return { line: line as string, town: town as string, vertices: oriented };
});

/** The point `meters` along a line of vertices joined by geodesics; undefined past its end. */
function alongLine(vertices: LatLon[], meters: number): LatLon | undefined {
  let left = meters;
  for (let i = 1; i < vertices.length; i++) {
    const { distance, initialBearing } = vertices[i - 1]!.inverse(vertices[i]!);
    if (distance >= left) return vertices[i - 1]!.destinationPoint(left, initialBearing);
    left -= distance;
  }
  return undefined;
}

const ROSE16: Record<Language, string[]> = {
  en: ['N', 'NNE', 'NE', 'ENE', 'E', 'ESE', 'SE', 'SSE', 'S', 'SSW', 'SW', 'WSW', 'W', 'WNW', 'NW', 'NNW'],
  es: ['N', 'NNE', 'NE', 'ENE', 'E', 'ESE', 'SE', 'SSE', 'S', 'SSO', 'SO', 'OSO', 'O', 'ONO', 'NO', 'NNO'],
  pt: ['N', 'NNE', 'NE', 'ENE', 'L', 'ESE', 'SE', 'SSE', 'S', 'SSO', 'SO', 'OSO', 'O', 'ONO', 'NO', 'NNO'],
  fr: ['N', 'NNE', 'NE', 'ENE', 'E', 'ESE', 'SE', 'SSE', 'S', 'SSO', 'SO', 'OSO', 'O', 'ONO', 'NO', 'NNO'],
};

/** The compass point nearest to an azimuth, of 8 or of 16 (Chapman & Wieczorek 2020, §Uncertainty Related to Heading). */
function headingOf(azimuth: number, points: 8 | 16, language: Language): string {
  const step = 360 / points;
  const index = Math.round((((azimuth % 360) + 360) % 360) / step) % points;
  return ROSE16[language][index * (16 / points)]!;
}

/**
 * How distances are rounded when written. 'as stated': to 0.5 km below 5 km and whole km above, so every
 * distance is as precise as the published method reads it ("25 km" ± 0.5 km, "3,5 km" ± 0.25 km:
 * Chapman & Wieczorek 2020, §Uncertainty Related to Offset Precision; docs/method.md §5.1): the clean
 * labels of the primary measure. '5 km steps': from 20 km on to 5 km steps, as people often write
 * (common practice, no source); "25 km" then may be 2.5 km off, five times what it states, so these
 * labels are a sensitivity run, printed by the benchmark and not asserted.
 */
export type Rounding = 'as stated' | '5 km steps';

/** A distance in km as written under a rounding. */
function writtenKm(km: number, language: Language, rounding: Rounding): string {
  const step = km < 5 ? 0.5 : km < 20 || rounding === 'as stated' ? 1 : 5;
  const rounded = Math.max(step, Math.round(km / step) * step);
  const text = String(rounded);
  return language === 'en' ? text : text.replace('.', ',');
}

/** "au NE", "à l'E": French contracts before a vowel. */
const frenchTo = (heading: string) => (/^[EO]/.test(heading) ? `à l'${heading}` : `au ${heading}`);

function offsetLabel(language: Language, km: string, heading: string, place: string): string {
  switch (language) {
    case 'en': return `${km} km ${heading} of ${place}`;
    case 'es': return `${km} km al ${heading} de ${place}`;
    case 'pt': return `${km} km a ${heading} de ${place}`;
    case 'fr': return `à ${km} km ${frenchTo(heading)} de ${place}`;
  }
}

function orthogonalLabel(language: Language, [northKm, ns]: [string, string], [eastKm, ew]: [string, string], place: string): string {
  switch (language) {
    case 'en': return `${northKm} km ${ns} and ${eastKm} km ${ew} of ${place}`;
    case 'es': return `${northKm} km al ${ns} y ${eastKm} km al ${ew} de ${place}`;
    case 'pt': return `${northKm} km ao ${ns} e ${eastKm} km a ${ew} de ${place}`;
    case 'fr': return `${northKm} km ${frenchTo(ns)} et ${eastKm} km ${frenchTo(ew)} de ${place}`;
  }
}

const DISTANCE_ONLY: Record<Language, (km: string, place: string) => string> = {
  en: (km, place) => `${km} km from ${place}`,
  es: (km, place) => `a ${km} km de ${place}`,
  pt: (km, place) => `a ${km} km de ${place}`,
  fr: (km, place) => `à ${km} km de ${place}`,
};
const NEAR: Record<Language, (place: string) => string> = {
  en: (place) => `near ${place}`,
  es: (place) => `cerca de ${place}`,
  pt: (place) => `perto de ${place}`,
  fr: (place) => `près de ${place}`,
};
const BETWEEN: Record<Language, (a: string, b: string) => string> = {
  en: (a, b) => `between ${a} and ${b}`,
  es: (a, b) => `entre ${a} y ${b}`,
  pt: (a, b) => `entre ${a} e ${b}`,
  fr: (a, b) => `entre ${a} et ${b}`,
};
/** Only the trail "Sentier des Crêtes" is masculine among the lines used; the roads and "Trilha" are feminine. */
const ALONG: Record<Language, (km: string, line: string, place: string) => string> = {
  en: (km, line, place) => `${km} km along ${line} from ${place}`,
  es: (km, line, place) => `${km} km a lo largo ${line.startsWith('Sentier') ? 'del' : 'de la'} ${line} desde ${place}`,
  pt: (km, line, place) => `${km} km ao longo ${line.startsWith('Sentier') ? 'do' : 'da'} ${line} de ${place}`,
  fr: (km, line, place) => `${km} km le long ${line.startsWith('Sentier') ? 'du' : 'de la'} ${line} depuis ${place}`,
};

/** Degrees, minutes and seconds (or degrees and decimal minutes) of |value|, rounded as written, carries included. */
function sexagesimal(value: number, seconds: boolean): string {
  const unitsPerDegree = seconds ? 3600 : 600;
  const total = Math.round(Math.abs(value) * unitsPerDegree);
  const degrees = Math.floor(total / unitsPerDegree);
  const rest = total - degrees * unitsPerDegree;
  if (seconds) return `${degrees}°${String(Math.floor(rest / 60)).padStart(2, '0')}'${String(rest % 60).padStart(2, '0')}"`;
  return `${degrees}°${(rest / 10).toFixed(1).padStart(4, '0')}'`;
}

/** Coordinates of a point as a collector writes them; the variant says how. */
function coordinatesLabel(p: LatLon, random: () => number, language: Language): { text: string; variant: string } {
  const west = language === 'en' ? 'W' : 'O';
  const lat = p.lat;
  const lon = p.lon;
  const style = Math.floor(random() * 4);
  const datum = random() < 0.5;
  let text: string;
  let variant: string;
  if (style === 0) {
    const places = 2 + Math.floor(random() * 4);
    text = `${lat.toFixed(places)}, ${lon.toFixed(places)}`;
    variant = `decimal signed, ${places} places`;
  } else if (style === 1) {
    const places = 2 + Math.floor(random() * 4);
    text = `${Math.abs(lat).toFixed(places)}° S, ${Math.abs(lon).toFixed(places)}° ${west}`;
    variant = `decimal with letters, ${places} places`;
  } else if (style === 2) {
    text = `${sexagesimal(lat, false)}S ${sexagesimal(lon, false)}${west}`;
    variant = 'degrees and minutes';
  } else {
    text = `${sexagesimal(lat, true)}S ${sexagesimal(lon, true)}${west}`;
    variant = 'DMS';
  }
  return datum ? { text: `${text} (WGS84)`, variant: `${variant}, with datum` } : { text, variant: `${variant}, no datum` };
}

/**
 * `count` clean labels, the forms and languages in turn, the same on every run for the same seed.
 * @example generateCleanLabels(9, 1)[0].form // 'offset-heading'
 */
export function generateCleanLabels(count: number, seed: number, rounding: Rounding = 'as stated'): CleanLabel[] {
  const random = seededRandom(seed);
  const pick = <T>(items: readonly T[]): T => items[Math.floor(random() * items.length)]!;
  const between = (low: number, high: number) => low + random() * (high - low);
  /** Where a collector measures from: a uniform spot in the place's stated extent, else its point. */
  const origin = (place: Place) => (place.extent > 0 ? place.at.destinationPoint(place.extent * Math.sqrt(random()), random() * 360) : place.at);
  const labels: CleanLabel[] = [];
  for (let i = 0; i < count; i++) {
    const form = FORMS[i % FORMS.length]!;
    const language = LANGUAGES[Math.floor(i / FORMS.length) % LANGUAGES.length]!;
    let made: ReturnType<typeof makeLabel>;
    // A true point in the sea (or a path too short, or a place with no partner in range) is drawn again.
    while (!(made = makeLabel(form === 'unknown-place' ? pick(['offset-heading', 'near', 'named-place', 'distance-only'] as const) : form, language, form === 'unknown-place')));
    const province = PROVINCES.find((u) => inside(made.truth, u));
    const county = COUNTIES.find((u) => inside(made.truth, u));
    labels.push({
      form,
      variant: made.variant,
      language,
      locality: made.locality,
      countryCode: 'QV',
      stateProvince: province?.properties.name,
      county: county?.properties.name,
      latitude: made.truth.lat,
      longitude: made.truth.lon,
      georeferenceable: form !== 'unknown-place',
    });
  }
  return labels;

  function makeLabel(form: Exclude<Form, 'unknown-place'>, language: Language, unknown: boolean): { locality: string; truth: LatLon; variant: string } | undefined {
    const place = pick(form === 'named-place' ? PLACES_WITH_EXTENT : PLACES);
    const name = unknown ? pick(UNKNOWN_NAMES) : place.name;
    let truth: LatLon;
    let locality: string;
    let variant: string = form;
    switch (form) {
      case 'offset-heading': {
        const km = between(3, 40);
        const azimuth = random() * 360;
        truth = origin(place).destinationPoint(km * 1000, azimuth);
        const points = random() < 0.5 ? 8 : 16;
        locality = offsetLabel(language, writtenKm(km, language, rounding), headingOf(azimuth, points, language), name);
        variant = `${points} points`;
        break;
      }
      case 'offset-orthogonal': {
        const [northKm, eastKm] = [between(1, 15), between(1, 15)];
        const [north, east] = [random() < 0.5, random() < 0.5];
        truth = origin(place).destinationPoint(northKm * 1000, north ? 0 : 180).destinationPoint(eastKm * 1000, east ? 90 : 270);
        const rose = ROSE16[language];
        locality = orthogonalLabel(language, [writtenKm(northKm, language, rounding), north ? rose[0]! : rose[8]!], [writtenKm(eastKm, language, rounding), east ? rose[4]! : rose[12]!], name);
        break;
      }
      case 'distance-only': {
        const km = between(3, 40);
        truth = origin(place).destinationPoint(km * 1000, random() * 360);
        locality = DISTANCE_ONLY[language](writtenKm(km, language, rounding), name);
        break;
      }
      case 'near':
        truth = place.at.destinationPoint(place.extent + between(0, Math.max(place.extent, NEAR_MINIMUM_METERS)), random() * 360);
        locality = NEAR[language](name);
        break;
      case 'named-place':
        truth = origin(place);
        locality = name;
        break;
      case 'between': {
        const others = PLACES.filter((p) => p !== place && p.name !== place.name && inRange(place.at.distanceTo(p.at), 5000, 30000));
        if (others.length === 0) return undefined;
        const other = pick(others);
        const { distance, initialBearing } = place.at.inverse(other.at);
        const onLine = place.at.destinationPoint(distance * between(0.2, 0.8), initialBearing);
        truth = onLine.destinationPoint(distance * between(0, 0.1), initialBearing + (random() < 0.5 ? 90 : -90));
        locality = BETWEEN[language](place.name, other.name);
        break;
      }
      case 'offset-path': {
        const path = pick(PATHS);
        const km = between(3, 40);
        const found = alongLine(path.vertices, km * 1000);
        if (!found) return undefined;
        truth = found;
        locality = ALONG[language](writtenKm(km, language, rounding), path.line, path.town);
        variant = path.line;
        break;
      }
      case 'coordinates': {
        const [west, south, east, north] = [-133.2, -46.4, -128.8, -44.6];
        truth = new LatLon(between(south, north), between(west, east));
        ({ text: locality, variant } = coordinatesLabel(truth, random, language));
        break;
      }
    }
    return inside(truth, ISLAND) ? { locality, truth, variant } : undefined;
  }
}

/** "near": within max(r_f, 1 km) beyond the place's extent (docs/method.md §3 [CHOICE], written here as the truth's own number). */
const NEAR_MINIMUM_METERS = 1000;

const inRange = (value: number, low: number, high: number) => value >= low && value <= high;

/** Runs one label through the front door, `georeferenceRecord`, and judges the answer against the true point. */
export function measureCleanLabel(store: GazetteerStore, label: CleanLabel): CleanOutcome {
  const attribution = { georeferencedBy: 'bench:clean', georeferencedDate: '2026-01-01T00:00:00Z', sources: store.sources() };
  const { result } = georeferenceRecord(store, { locality: label.locality, countryCode: label.countryCode, stateProvince: label.stateProvince, county: label.county, attribution });
  const georef = result.status === 'georeferenced' ? result.georeference : undefined;
  if (!georef) return { label, result, answered: false, falseGeoreference: false };
  const errorMeters = new LatLon(label.latitude, label.longitude).inverse(new LatLon(georef.latitude, georef.longitude)).distance;
  const covered = label.georeferenceable && errorMeters <= georef.uncertaintyMeters;
  return { label, result, answered: true, errorMeters, covered, falseGeoreference: !covered };
}

/** The rates over a set of outcomes (definitions at the top of this file). */
export function cleanRatesOf(outcomes: CleanOutcome[]): CleanRates {
  const georeferenceable = outcomes.filter((o) => o.label.georeferenceable).length;
  const answeredable = outcomes.filter((o) => o.label.georeferenceable && o.answered).length;
  const answered = outcomes.filter((o) => o.answered).length;
  const covered = outcomes.filter((o) => o.covered).length;
  const falseGeoreferences = outcomes.filter((o) => o.falseGeoreference).length;
  const percent = (n: number, of: number) => (of === 0 ? 0 : (100 * n) / of);
  return {
    labels: outcomes.length,
    georeferenceable,
    answered,
    covered,
    falseGeoreferences,
    answeredPercent: percent(answeredable, georeferenceable),
    falsePercent: percent(falseGeoreferences, outcomes.length),
    coveredPercentOfAnswered: percent(covered, answered),
  };
}
