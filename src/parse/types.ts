/**
 * The parser's output: how a locality text was read. This is the contract between `src/parse`
 * and `src/georef`; every field is plain data so it can be shown to a curator and serialised.
 * @example parseLocality('S of Millbrook') // { type: 'heading-only', features: ['Millbrook'], offsets: [{ heading: { azimuth: 180, … } }], … }
 */

/** Units a distance can be written in (leagues vary by country and period: see src/parse/units.ts). */
export type DistanceUnit = 'm' | 'km' | 'mi' | 'ft' | 'yd' | 'nmi' | 'league';

/** Locality types of the point-radius method (docs/method.md §3), each with its own rule. */
export type LocalityType =
  | 'coordinates' // coordinates written in the text are the most specific clause
  | 'named-place'
  | 'offset-heading' // distance at a heading, by air ("10 km NE of X")
  | 'offset-orthogonal' // two offsets on perpendicular headings ("3 km N and 2 km E of X")
  | 'distance-only' // "5 km from X"
  | 'offset-path' // distance along a road, trail or river ("10 km by road from X")
  | 'heading-only' // "N of X": georeferenced only with a bounding clause
  | 'between' // "between X and Y"
  | 'near' // near, vicinity, outskirts
  | 'junction' // junction, confluence or crossing of two named lines
  | 'administrative-unit' // the clause names only an administrative unit ("Alisos County"): never read as a town
  | 'no-locality' // text that names no place ("locality unknown")
  | 'unparseable';

/** A distance exactly as written, with the precision read from how the number is written (docs/method.md §5.1). */
export interface WrittenDistance {
  /** The words as they stand in the text, e.g. "1 1/2 mi." */
  written: string;
  /** Value in the written unit; the midpoint for a range. */
  value: number;
  unit: DistanceUnit;
  /** Precision in the written unit, read from the number as written. */
  precision: number;
  /** δ in the written unit: precision / 2, plus half the range for a range. */
  uncertainty: number;
  range?: { low: number; high: number };
  meters: number;
  uncertaintyMeters: number;
  /**
   * True when the text wrote no unit ("0.5 NW of X"). The parser then reads the number in miles, the larger
   * of the two plausible units, so `meters` reaches far enough; the method widens it to cover kilometres too
   * (METHOD_DEFAULTS.unitlessDistanceUnits, a [CHOICE] in src/georef/method-defaults.ts).
   */
  unitAssumed?: boolean;
  /**
   * True when the number stands before "of the road from" a place ("13.5 da estrada de X", "12 km del camino de
   * X"): read as the distance along that road from the place, where the road's count begins
   * (METHOD_DEFAULTS.roadNumberFromPlace, a [CHOICE] in src/georef/method-defaults.ts).
   */
  fromRoadStart?: boolean;
}

/** A heading as written, as a true azimuth with its half-width Δ (docs/method.md §5.2). */
export interface WrittenHeading {
  written: string;
  /** Degrees clockwise from true north, in [0, 360). Already reversed for a bearing toward the feature. */
  azimuth: number;
  /** Δ, half the width of the sector the heading stands for, in degrees. */
  halfWidth: number;
  kind: 'rose4' | 'rose8' | 'rose16' | 'rose32' | 'degrees' | 'due';
  /** True when the text gave a bearing toward the feature (reversed by 180°). */
  toward?: boolean;
}

/** How an offset follows a path instead of a straight line. */
export interface PathQualifier {
  mode: 'road' | 'trail' | 'river' | 'upstream' | 'downstream' | 'along';
  /** The named line followed, when the text names one ("along Rio Claro", "on Rd. 12"). */
  lineName?: string;
  written: string;
}

/** One offset from a feature. Orthogonal offsets have two, one per axis. */
export interface Offset {
  /** Absent for heading-only. */
  distance?: WrittenDistance;
  /** Absent for distance-only and path offsets. */
  heading?: WrittenHeading;
  /** Present when the offset is along a path ("by road", "upstream"); by air otherwise. */
  path?: PathQualifier;
  /** True when the text said "by air" explicitly. */
  byAir?: boolean;
  /**
   * "N km from X toward Y": the place the offset heads for. Its heading from X is unknown until both are
   * matched, so the offset is read as distance-only from X and Y is kept here (not used for the point).
   */
  toward?: string;
  /**
   * The word before `toward` when the text wrote a slip for "até" there ("ato"): read as "até"
   * (METHOD_DEFAULTS.typedUpTo, a [CHOICE] in src/georef/method-defaults.ts).
   */
  upToSlip?: string;
}

/** Coordinates written in the text or in verbatim coordinate fields, before any datum shift. */
export interface WrittenCoordinates {
  written: string;
  /**
   * Decimal degrees in the stated datum (not yet converted to WGS84). For a UTM reference, whose datum may
   * only become known later (the record's geodeticDatum, an edit), these are the grid read on the WGS84
   * ellipsoid, a preview; georef converts `utm` again in the datum it finally uses.
   */
  latitude: number;
  longitude: number;
  format: 'decimal' | 'degrees-minutes' | 'degrees-minutes-seconds' | 'utm';
  /** The UTM reference as written (format 'utm'): zone, hemisphere, easting and northing in meters, and the band letter when one was written. */
  utm?: { zone: number; hemisphere: 'N' | 'S'; band?: string; easting: number; northing: number };
  /** Coordinate precision in degrees, from how the numbers are written (docs/method.md §5.3; the finer axis). */
  precisionDegrees: number;
  /** Datum as an EPSG code ("EPSG:4267") when the text states one. */
  datum?: string;
  datumWritten?: string;
  /** Problems found (swapped, out of range): flagged, never silently fixed. */
  problems: string[];
  /** Readings of the marks other than the standard one ("54° 15\"" typewritten: the double prime as minutes). */
  notes?: string[];
}

/** A piece of the text that can be read on its own. */
export interface Clause {
  text: string;
  /** Offsets into the verbatim text, [start, end). */
  start: number;
  end: number;
  kind: 'locality' | 'administrative' | 'coordinates' | 'elevation' | 'habitat' | 'other';
}

export type Language = 'en' | 'es' | 'pt' | 'fr';

/** Administrative units, from the record's fields or from clauses of the text. */
export interface AdministrativeContext {
  countryCode?: string;
  country?: string;
  stateProvince?: string;
  county?: string;
  municipality?: string;
}

/** Administrative levels a unit word can name. */
export type AdministrativeLevel = 'country' | 'stateProvince' | 'county' | 'municipality' | 'unit';

/** A clause that names an administrative unit by a unit word ("Alisos County", "Municipio de Alisos"). */
export interface NamedUnit {
  /** The unit's name without its unit word ("Alisos"). */
  name: string;
  /** The level the unit word names; 'unit' when the word does not say which level ("District", "Distrito"). */
  level: AdministrativeLevel;
  /** The clause as written ("Municipio de Alisos"). */
  written: string;
  /**
   * The language of the country's name when the text names the record's country only by a name in
   * another language than the four read throughout (the Latin "Brasilia"), which a town may share.
   */
  exonymLanguage?: string;
}

/** What kind of place a generic word says a name is ("Laguna Negra" → 'water'). */
export type FeatureKind = 'populated-place' | 'water' | 'stream' | 'mountain' | 'farm' | 'road' | 'protected-area' | 'locality';

/**
 * A named place that may also be a route between two places ("Ipala to Amatillo", "estrada X - Y", "de X a Y"):
 * "to", "a", "-" can stand inside a name ("Puerto a Dentro"), so the parser offers every split and the gazetteer
 * decides (src/locate/route.ts): the whole found as one name stays one name; else both ends found make the
 * route between them [CHOICE routeReading].
 */
export interface RouteReading {
  /** The clause's words for the route, as written ("Ipala to Amatillo"). */
  written: string;
  /** Each way to split it into its two ends, in the order written (first joiner first). */
  ends: [string, string][];
  /** A road kilometre post written beside the route ("km 12"): a distance along the road from its own origin. */
  kilometrePost?: string;
}

/** A locality clause other than the chosen one, read on its own; most specific first. */
export interface ClauseReading {
  /** Index into `Interpretation.clauses`. */
  clause: number;
  type: LocalityType;
  features: string[];
  offsets: Offset[];
  /** What the generic word of its (first) feature says it is ("Fazenda Boa Vista" → 'farm'). */
  featureKind?: FeatureKind;
  /** A named place that may also be a route between two places (see RouteReading). */
  route?: RouteReading;
  /** A second name of its one feature, written in brackets after it (see `Interpretation.secondName`). */
  secondName?: string;
}

/** The whole reading of one locality text. */
export interface Interpretation {
  verbatim: string;
  language?: Language;
  clauses: Clause[];
  /** Index into `clauses` of the most specific clause used; null when none could be used. */
  chosenClause: number | null;
  type: LocalityType;
  /**
   * Feature names as written, in the order the type's rule uses them: one for offsets, named
   * place and near; two for between and junction (the two lines); none for coordinates.
   */
  features: string[];
  offsets: Offset[];
  /** "ca.", "about": changes neither point nor radius (docs/method.md §3), but is recorded. */
  approximate: boolean;
  coordinates?: WrittenCoordinates;
  /** Administrative units named in the text itself. */
  administrative: AdministrativeContext;
  /** Type 'administrative-unit' only: the unit the chosen clause names (its name is also `features[0]`). */
  unit?: NamedUnit;
  /** What the generic word of the chosen feature says it is ("Laguna Negra" → 'water'); absent when no word says. */
  featureKind?: FeatureKind;
  /** The chosen named place may also be a route between two places: its splits, for locate to judge. */
  route?: RouteReading;
  /**
   * A second name of the one feature, written alone in brackets after it ("Alisos (Alisitos)": an older or
   * other name of the same place): the locate step tries it only when the first name is not found.
   */
  secondName?: string;
  /**
   * The whole text read as one place's name, beside a reading of its words that names no place ("Country Homes",
   * "Town and Country", "Woodland", "Forks", "Summit": common words a town may bear): the locate step takes it only
   * where the gazetteer holds a settlement of that very name in the record's stated country and state
   * (METHOD_DEFAULTS.wordNamedTown, a [CHOICE] in src/georef/method-defaults.ts).
   */
  wholeName?: string;
  /**
   * A road kilometre post written in a clause of its own ("km 23", "km 12 of the road") and not beside a route
   * read from the text: its distance runs from the road's own origin, which no clause gives. Alone, the text asks
   * a person for a georeference; beside a place, the road is a place named but not loaded.
   */
  kilometrePost?: string;
  /** The other locality clauses, each read on its own, most specific first; [] when there are none. */
  otherClauses: ClauseReading[];
  elevation?: { minimumMeters: number; maximumMeters: number; written: string };
  /** Plain-words reason, always present when type is 'unparseable' or 'no-locality'. */
  reason?: string;
  /** Assumptions made while reading, in plain words ("no path qualifier: assumed by air"). */
  notes: string[];
}
