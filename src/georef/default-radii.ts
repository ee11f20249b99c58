/**
 * Default geographic radials for gazetteer points that carry no extent, by feature type (docs/method.md §4
 * [CHOICE]: BP2020 gives no table, so the values err large). Every value is a judgement, so each says why; a source may override any of
 * them at import (`radii` option of importGazetteer).
 */

export interface DefaultRadius {
  meters: number;
  reasoning: string;
}

/** The feature-type vocabulary of whereabouts with the radius a point of that type gets by default. */
export const DEFAULT_RADII: Readonly<Record<string, DefaultRadius>> = {
  city: { meters: 15_000, reasoning: 'a city point is usually its center; large cities reach 10–20 km out (common practice, no source; erred large)' },
  town: { meters: 5_000, reasoning: 'towns of a few thousand people span a few km (common practice, no source; erred large)' },
  village: { meters: 2_000, reasoning: 'villages rarely span more than 1–2 km (common practice, no source)' },
  hamlet: { meters: 1_000, reasoning: 'a cluster of houses, well under 1 km (common practice, no source; erred large)' },
  locality: { meters: 3_000, reasoning: 'a named area of unknown size: a few km (common practice, no source; erred large)' },
  farm: { meters: 3_000, reasoning: 'farm holdings span up to a few km (common practice, no source)' },
  estate: { meters: 5_000, reasoning: 'estates, haciendas and fazendas can span several km (common practice, no source)' },
  station: { meters: 500, reasoning: 'a railway or research station is a building group (common practice, no source)' },
  bridge: { meters: 200, reasoning: 'a bridge point lies on the bridge; most are under 200 m long (common practice, no source)' },
  island: { meters: 10_000, reasoning: 'islands range from meters to hundreds of km; 10 km covers most named small islands (common practice, no source); load the polygon for large ones' },
  mountain: { meters: 5_000, reasoning: 'a mountain as a massif, not only its summit (common practice, no source)' },
  peak: { meters: 1_000, reasoning: 'a summit point; labels "on X peak" mean its upper slopes (common practice, no source)' },
  hill: { meters: 1_000, reasoning: 'hills are mostly under 2 km across (common practice, no source)' },
  pass: { meters: 1_000, reasoning: 'a pass is a saddle of a few hundred meters (common practice, no source; erred large)' },
  lake: { meters: 5_000, reasoning: 'a lake point is its center; many named lakes are a few km across (common practice, no source); load the polygon for large ones' },
  bay: { meters: 10_000, reasoning: 'bays range up to tens of km (common practice, no source)' },
  cape: { meters: 2_000, reasoning: 'a headland of a km or two (common practice, no source)' },
  beach: { meters: 2_000, reasoning: 'beaches run for hundreds of meters to a few km (common practice, no source)' },
  waterfall: { meters: 500, reasoning: 'a waterfall and its pool (common practice, no source; erred large)' },
  river: { meters: 50_000, reasoning: 'a river given as a point may mean any stretch of it (common practice, no source; erred large); load the line instead' },
  stream: { meters: 10_000, reasoning: 'a stream given as a point may mean any stretch of it (common practice, no source); load the line instead' },
  'river mouth': { meters: 2_000, reasoning: 'a river mouth or estuary of up to a few km (common practice, no source)' },
  road: { meters: 50_000, reasoning: 'a road given as a point may mean any stretch of it (common practice, no source; erred large); load the line instead' },
  trail: { meters: 20_000, reasoning: 'a trail given as a point may mean any stretch of it (common practice, no source); load the line instead' },
  country: { meters: 1_000_000, reasoning: 'a country given as a point: only its polygon gives a real extent (common practice, no source; erred large)' },
  stateProvince: { meters: 300_000, reasoning: 'a state or province given as a point: only its polygon gives a real extent (common practice, no source; erred large)' },
  county: { meters: 50_000, reasoning: 'a county given as a point: only its polygon gives a real extent (common practice, no source; erred large)' },
  // Administrative levels below the county (the dump layout's ADM3, ADM4, ADM5 and ADMD).
  municipality: { meters: 20_000, reasoning: 'a third-level unit (municipality, commune) given as a point: most span 5–40 km (common practice, no source; erred large)' },
  district: { meters: 10_000, reasoning: 'a fourth-level or lower unit (ward, parish, district) given as a point: a few km to about 20 km (common practice, no source)' },
  'administrative unit': { meters: 50_000, reasoning: 'an administrative unit of unknown level given as a point: taken as a county (common practice, no source; erred large)' },
  // Water bodies beyond lakes and streams.
  sea: { meters: 300_000, reasoning: 'a sea or ocean part given as a point (common practice, no source; erred large); load the polygon instead' },
  channel: { meters: 20_000, reasoning: 'a strait, channel or sound of up to tens of km (common practice, no source)' },
  wetland: { meters: 5_000, reasoning: 'a marsh, swamp or bog of a few km (common practice, no source)' },
  spring: { meters: 200, reasoning: 'a spring or well is a point with its immediate surroundings (common practice, no source; erred large)' },
  'water body': { meters: 5_000, reasoning: 'a water feature of unknown kind (feature class H): as a lake (common practice, no source)' },
  // Terrain.
  valley: { meters: 10_000, reasoning: 'a valley or canyon given as a point may mean any stretch of it (common practice, no source)' },
  ridge: { meters: 5_000, reasoning: 'a ridge or escarpment of a few km (common practice, no source)' },
  plain: { meters: 20_000, reasoning: 'a plain, plateau or desert given as a point (common practice, no source; erred large)' },
  'terrain feature': { meters: 5_000, reasoning: 'a relief feature of unknown kind (feature class T): as a mountain (common practice, no source)' },
  // Spots, buildings, farms (class S).
  building: { meters: 200, reasoning: 'a building or small installation (church, school, hut, mine head): its grounds (common practice, no source; erred large)' },
  airport: { meters: 3_000, reasoning: 'an airport with its runways, up to a few km (common practice, no source)' },
  spot: { meters: 500, reasoning: 'a spot feature of unknown kind (feature class S): a site of a few hundred meters (common practice, no source; erred large)' },
  // Areas (class L) and vegetation (class V).
  park: { meters: 10_000, reasoning: 'a park or reserve given as a point: from a few to tens of km (common practice, no source); load the polygon for large ones' },
  area: { meters: 10_000, reasoning: 'an area of unknown kind (feature class L): a region of up to tens of km (common practice, no source; erred large)' },
  forest: { meters: 10_000, reasoning: 'a forest, grassland or scrub area given as a point (feature class V) (common practice, no source)' },
  // Undersea features (class U).
  'undersea feature': { meters: 50_000, reasoning: 'a seamount, bank, trench or canyon on the sea floor: tens of km (common practice, no source; erred large)' },
};

/** Radius for a point whose feature type is missing or outside the vocabulary. */
export const UNKNOWN_TYPE_RADIUS: DefaultRadius = {
  meters: 10_000,
  reasoning: 'feature type unknown: 10 km, larger than any settlement type but a city (common practice, no source; erred large)',
};

/**
 * The default radius for a feature type, with per-source overrides taking precedence.
 * @example defaultRadius('village') // { meters: 2000, reasoning: 'villages rarely …' }
 * @example defaultRadius('village', { village: 5000 }).meters // 5000
 */
export function defaultRadius(featureType: string | null, overrides?: Readonly<Record<string, number>>): DefaultRadius {
  if (featureType !== null && overrides?.[featureType] !== undefined) {
    return { meters: overrides[featureType], reasoning: `set for this gazetteer source at import (${featureType})` };
  }
  return (featureType !== null ? DEFAULT_RADII[featureType] : undefined) ?? UNKNOWN_TYPE_RADIUS;
}
