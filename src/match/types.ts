/** Gazetteer features, match candidates and the index matching reads: the contract between `src/match`, `src/store` and `src/georef`. */
import type { Geometry } from 'geojson';

export type GeometryType = 'Point' | 'LineString' | 'MultiLineString' | 'Polygon' | 'MultiPolygon';

/** One place from a loaded gazetteer, with its corrected center and geographic radial. */
export interface Feature {
  /** The gazetteer source it came from (see Source.id). */
  sourceId: string;
  /** The feature's id within that source. */
  featureId: string;
  name: string;
  alternateNames: string[];
  featureType: string | null;
  countryCode: string | null;
  stateProvince: string | null;
  county: string | null;
  /** Corrected center, WGS84 decimal degrees (method §4). */
  latitude: number;
  longitude: number;
  /** Geographic radial in meters: center to the furthest point of the feature. */
  radiusMeters: number;
  /** True when radiusMeters came from the default table by feature type, not from the source. */
  radiusIsDefault: boolean;
  geometryType: GeometryType;
  /** The full geometry, present for lines and polygons when it was asked for. */
  geometry?: Geometry;
  /** The same place as held by other sources, when several sources hold it (see src/match/same-place.ts). */
  alsoIn?: SamePlaceElsewhere[];
  /** What the source says of some alternate names: their language and whether former, short, colloquial. */
  nameDetails?: AlternateName[];
  /**
   * Set by a lookup when the name the text matched is not a current name of the feature, in plain
   * words for the remarks ("former name 'Puerto Viejo' (until 1921)").
   */
  matchedAs?: string;
}

/** An alternate name as a gazetteer with name details gives it (the dump layout's alternate-names file). */
export interface AlternateName {
  name: string;
  /** ISO 639 language code, or null. */
  language: string | null;
  preferred?: true;
  short?: true;
  colloquial?: true;
  /** A former name: no longer in use. */
  historic?: true;
  /** When the name was in use, as the source writes it (a year, usually). */
  from?: string;
  to?: string;
}

/** Another source's feature found to be the same place as the one cited (src/match/same-place.ts). */
export type SamePlaceElsewhere = Omit<Feature, 'alsoIn'> & {
  /** Geodesic distance from the cited feature's center, meters. */
  distanceMeters: number;
};

/** Which feature: its source and its id there (what a choice among candidates names). */
export interface FeatureKey {
  sourceId: string;
  featureId: string;
}

/** A feature that may be the one a name in the text means. */
export interface Candidate {
  feature: Feature;
  /** 1 for an exact folded-name match, lower for fuzzier ones (0..1). */
  score: number;
  /** The name or alternate name that matched. */
  matchedName: string;
  /** Why it matched, in plain words ("exact name", "alternate name", "1 edit from 'X'"). */
  why: string;
}

/** A gazetteer as loaded: enough to cite it and reproduce a result against the same version. */
export interface Source {
  id: string;
  citation: string;
  licence: string | null;
  importedAt: string;
  /** sha256 of the imported file's bytes. */
  contentHash: string;
  featureCount: number;
  /**
   * Rank of the source where several hold the same place: 1 is cited first, then 2…; null (not set)
   * after every ranked source, in the order imported.
   */
  priority: number | null;
}

/** Administrative context used to narrow candidates (a record's fields, or clauses of its text). */
export type { AdministrativeContext } from '../parse/types.ts';

/** What to look up: a name as written, with the context that narrows it. */
export interface CandidateQuery {
  name: string;
  context: import('../parse/types.ts').AdministrativeContext;
  /** Keep only these feature types (e.g. ['county'] for a bounding unit). */
  featureTypes?: string[];
  /** Keep only these geometry types (e.g. lines for a path offset or a junction). */
  geometryTypes?: GeometryType[];
  /** Load each candidate's full geometry (lines and polygons). */
  withGeometry?: boolean;
  /** At most this many candidates, best first (default 10). */
  limit?: number;
  /**
   * When the name is found neither as written nor by another reading, also read it as an older
   * spelling of the record's country or the text's language (src/match/older-spelling.ts): 'on' or
   * 'off' (default). The METHOD_DEFAULTS choice `olderSpellings` sets it for a locality's places.
   */
  olderSpellings?: 'on' | 'off';
  /** The language of the text the name was read from, when known (which older spellings apply). */
  language?: import('../parse/types.ts').Language;
  /**
   * 'off': only the name as written and its documented readings, no near-spelling search (default 'on').
   * What a gazetteer holds under a name, as a measure asks it (test/real/harness.ts, answerability).
   */
  nearSpellings?: 'on' | 'off';
  /**
   * When the name is not found as written, also read it as the short form of a Spanish-speaking
   * country's official long form "X de <honoree>" (src/match/short-form.ts), beside its older spellings:
   * inside the stated state, or without one only beside what the looser readings find, at no higher a
   * score (candidate-matcher.ts, readingCandidates): 'on' or 'off' (default). The METHOD_DEFAULTS choice `honoreeShortForms` sets it.
   */
  honoreeShortForms?: 'on' | 'off';
  /**
   * When the name is found by none of the readings above, also read it with the words joining its parts left
   * out, added or changed ("San Manuel Colohete" for San Manuel de Colohete; src/match/connector-words.ts), only
   * inside a stated country and state: 'on' or 'off' (default). The METHOD_DEFAULTS choice `connectorReadings` sets it.
   */
  connectorReadings?: 'on' | 'off';
}

/** Finds candidate features for a name: the store implements it; the core only calls it. */
export interface CandidateFinder {
  findCandidates(query: CandidateQuery): Candidate[];
  /**
   * The polygons of the country with this ISO 3166-1 alpha-2 code (features of type "country"), with
   * their geometry, for the plausibility checks (optional for other finders). A finder may hand out the
   * same array again while its data stays the same (the store does): the checks keep their reading of it by it.
   */
  countryOutlines?(countryCode: string): readonly Feature[];
  /** The same lookup with the candidates the context dropped and why (optional for other finders). */
  lookupCandidates?(query: CandidateQuery): CandidateLookup;
  /**
   * The loaded place nearest a point, within `meters`, that lies in the context's stated units by what
   * it records (an administrative unit's own feature is not a place of it); null when none (optional
   * for other finders).
   */
  nearestPlace?(query: NearestPlaceQuery): NearbyPlace | null;
  /**
   * Every name of the loaded units of a level (UnitLevel), or those with the key `key`, each with its unit's
   * comparison key (administrativeKey); empty when the gazetteer records none (optional for other finders).
   */
  unitNames?(level: UnitLevel, key?: string): readonly UnitName[];
  /**
   * The features, with their geometry, of the units of a level that the name or code with the key `key` names, when
   * every file that recorded it said which feature is its unit (a unit row of a GIS, GeoJSON or CSV gazetteer):
   * a code names its one unit though others share the unit's name. Empty when a file did not say (the dump's admin
   * code files, a store before schema version 5): the unit is then found by its key (unitNames). Optional for other finders.
   */
  unitFeatures?(level: UnitLevel, key: string): readonly Feature[];
}

/** A level of the store's unit names: 1 a state or province, 2 a county, 3 a municipality. */
export type UnitLevel = 1 | 2 | 3;

/** One name of a loaded administrative unit: its key and its unit's key (both administrativeKey). */
export interface UnitName {
  key: string;
  unitKey: string;
}

/** Where to look for the nearest place of the stated units. */
export interface NearestPlaceQuery {
  latitude: number;
  longitude: number;
  /** The units the place must record: every level given here must be recorded and be the one given. */
  context: import('../parse/types.ts').AdministrativeContext;
  /** How far to look, meters. */
  meters: number;
}

/** A place found near a point, with its geodesic distance from it in meters. */
export interface NearbyPlace {
  feature: Feature;
  meters: number;
}

/** A box of latitudes and longitudes, WGS84 degrees, west ≤ east (one that crosses 180° is asked as two). */
export interface DegreeBox {
  south: number;
  west: number;
  north: number;
  east: number;
}

/** A candidate the context removed, with the reason kept (a name outside the stated county, say). */
export interface DroppedCandidate {
  candidate: Candidate;
  /** Plain words, e.g. "center outside the polygon of county 'Alto' (source demo, feature c-3)". */
  reason: string;
}

/** Everything a lookup found: the candidates kept and the ones the context dropped. */
export interface CandidateLookup {
  candidates: Candidate[];
  dropped: DroppedCandidate[];
  /** Notes on how the query was read ("country 'Atlantis' not recognised: not used to filter"). */
  notes: string[];
}

/** A stored word of the token index: its row id and the number of features holding it. */
export interface IndexedToken {
  id: number;
  df: number;
}

/** One row of the token index: a feature holding a token. */
export interface Posting {
  feature: number;
  token: number;
}

/**
 * What matching asks of a gazetteer's indexes (the SQLite store implements it): rows for folded
 * names, tokens, deletion keys and postings, and features by row id. It answers; `src/match` ranks.
 * Row ids are the index's own, stable while `version` stays the same.
 */
export interface NameIndex {
  /** Changes whenever the indexes may have changed, by any writer (the matcher's cached token matches then go). */
  version(): number;
  /** Row ids of the features with a name, alternate name or reading folded to `key`, in row-id order; at most `limit` when given. */
  featureIdsByName(key: string, limit?: number): number[];
  /** One feature by row id, without its geometry; null when there is none. */
  feature(id: number): Feature | null;
  /** Features by row id (those that exist), without their geometry. */
  features(ids: readonly number[]): Map<number, Feature>;
  /** Each feature's name and alternate names as written, by row id. */
  namesOf(ids: readonly number[]): { id: number; names: string[] }[];
  /** The stored token written exactly as `token`, if any. */
  token(token: string): IndexedToken | undefined;
  /** Every stored token sharing one of these deletion keys, each once, as [id, token, df]. */
  tokensByDeletionKeys(keys: readonly number[]): [number, string, number][];
  /**
   * Up to `limit` postings of these tokens, by token (in id order) and feature; with `countries`, only
   * features in them or without a country. Meant for tokens whose postings together fit `limit` (their
   * df): without `countries` a store may read each token's postings whole before cutting.
   */
  postings(tokenIds: readonly number[], countries: readonly string[] | null, limit: number): Posting[];
  /**
   * The postings of `driver` and of `partners` of the features holding `driver` and one of `partners`,
   * by feature, the driver's first: a feature's driver posting, then one posting of each partner it
   * holds, for up to `limit` (feature, partner) pairs; with `countries`, only features in them or without a country.
   * @example postingsWithPartner(santa, [cruz], null, 800) // [{ feature: 7, token: santa.id }, { feature: 7, token: cruz.id }, …]
   */
  postingsWithPartner(driver: IndexedToken, partners: readonly IndexedToken[], countries: readonly string[] | null, limit: number): Posting[];
  /** The postings of these tokens held by these features (one index probe a pair). */
  postingsAmong(tokenIds: readonly number[], featureIds: readonly number[]): Posting[];
  /** Loads a line's or polygon's full geometry into the feature (nothing for points or when present). */
  attachGeometry(feature: Feature): void;
  /**
   * Each source's place in the order the user ranks them (0 first), for merging the same place held
   * by several sources (same-place.ts); without it, the better-scored feature is cited.
   */
  sourceRanks?(): ReadonlyMap<string, number>;
  /**
   * The comparison keys (administrativeKey) of the names of the units of a level (UnitLevel) one of whose
   * names or codes, in any language, has the key `key`; empty when the index knows none.
   */
  unitKeys?(level: UnitLevel, key: string): string[];
  /** Row ids of the features unitFeatures gives for a name or code; empty as there. */
  unitFeatureIds?(level: UnitLevel, key: string): number[];
  /** Row ids of the features whose center lies in the box (optional: without it no place is found near a point). */
  featureIdsInBox?(box: DegreeBox): number[];
}
