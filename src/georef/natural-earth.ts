/**
 * Natural Earth land and country outlines at 1:50 000 000 (public domain), as the registry package
 * world-atlas 2.0.2 ships them (TopoJSON, cut at 180°). Read on first use, like a code table, not a
 * file a user gives: about 0.15 s to read and decode, so only points that need them pay for it.
 * At 1:50m, coastlines and borders are generalised: a shore or a border can lie a few kilometres from
 * where it is drawn (METHOD_DEFAULTS.naturalEarthToleranceMeters).
 */
import { createRequire } from 'node:module';
import type { Feature, MultiPolygon, Polygon } from 'geojson';
import type * as TopoJSONClient from 'topojson-client';
import type { GeometryCollection, Topology } from 'topojson-specification';
import { METHOD_DEFAULTS } from './method-defaults.ts';
import { outlinesOf, type Outline } from './outlines.ts';

const require = createRequire(import.meta.url);

export const NATURAL_EARTH = {
  name: 'Natural Earth 1:50m (public domain; registry package world-atlas 2.0.2)',
  toleranceMeters: METHOD_DEFAULTS.naturalEarthToleranceMeters,
} as const;

let land: Outline[] | undefined;
let countries: { topology: Topology; byNumeric: Map<string, GeometryCollection['geometries'][number]> } | undefined;
/** Each country's outlines decoded once: a batch checks every record of a country against the same outline. */
const countryOutlines = new Map<string, Outline[] | undefined>();

function topojson(): typeof TopoJSONClient {
  return require('topojson-client') as typeof TopoJSONClient;
}

/**
 * The land polygons (continents and islands large enough for 1:50m).
 * @example insideOutlines(48.86, 2.35, naturalEarthLand()) // true (Paris)
 */
export function naturalEarthLand(): Outline[] {
  if (!land) {
    const topology = require('world-atlas/land-50m.json') as Topology;
    const collection = topojson().feature(topology, topology.objects.land as GeometryCollection);
    land = collection.features.flatMap((f) => outlinesOf(f.geometry as Polygon | MultiPolygon));
  }
  return land;
}

/**
 * The outline of a country by its ISO 3166-1 alpha-2 code, through its ISO 3166-1 numeric code (the
 * ids world-atlas uses; the table of the registry package iso-3166-1 2.1.1); undefined when Natural
 * Earth has no outline under that code (e.g. an invented country, or one drawn without an ISO code).
 * @example naturalEarthCountry('FR')?.length // the polygons of France, overseas departments included
 */
export function naturalEarthCountry(alpha2: string): Outline[] | undefined {
  const numeric = (require('iso-3166-1') as typeof import('iso-3166-1')).whereAlpha2(alpha2)?.numeric;
  if (!numeric) return undefined;
  if (!countries) {
    const topology = require('world-atlas/countries-50m.json') as Topology;
    const collection = topology.objects.countries as GeometryCollection;
    countries = { topology, byNumeric: new Map(collection.geometries.filter((g) => g.id !== undefined).map((g) => [String(g.id), g])) };
  }
  if (!countryOutlines.has(numeric)) {
    const geometry = countries.byNumeric.get(numeric);
    // A single geometry (not a collection) decodes to one Feature.
    const shape = geometry && (topojson().feature(countries.topology, geometry) as Feature).geometry;
    countryOutlines.set(numeric, shape && (shape.type === 'Polygon' || shape.type === 'MultiPolygon') ? outlinesOf(shape) : undefined);
  }
  return countryOutlines.get(numeric);
}
