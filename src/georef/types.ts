/** The computed georeference: the contract between `src/georef` and `src/record`. */
import type { DistanceUnit } from '../parse/types.ts';

/** The uncertainty budget in meters, one entry per source of the point-radius method (docs/method.md §5). */
export interface UncertaintyComponents {
  /** r_f: geographic radial of the feature (or the union of features) used. */
  extent: number;
  /** The offset term: distance and direction combined geometrically, orthogonal, distance-only or path. */
  offset: number;
  /** From how written coordinates are given, at their latitude (docs/method.md §5.3). */
  coordinatePrecision: number;
  /** Unknown datum (5359 m worst case) or a datum transformation's stated accuracy (docs/method.md §5.4). */
  datum: number;
  /** Map reading at a stated scale (docs/method.md §5.5). */
  mapScale: number;
  /** A stated measurement error, e.g. twice a GPS's displayed accuracy (docs/method.md §5.5). */
  measurement: number;
  /**
   * Present only when widened: how far a place the text names, but the gazetteer lacks, may lie from
   * the place used (METHOD_DEFAULTS.unusedFeatureMeters [CHOICE]).
   */
  unusedFeature?: number;
}

/** The rules of [CHOICE routeKilometrePost], as the CLI and the HTTP API accept them. */
export const ROUTE_KILOMETRE_POST_RULES = ['route', 'decline'] as const;
export type RouteKilometrePostRule = (typeof ROUTE_KILOMETRE_POST_RULES)[number];

/** Settings of the method that the sources leave to the georeferencer ([CHOICE] in the method). */
export interface MethodOptions {
  /** Uncertainty when the datum is not stated; default 5359 m (docs/method.md §5.4). */
  unknownDatumMeters?: number;
  /** Minimum added for "near": radius r_f + max(r_f, this); default 1000 m. */
  nearMinimumMeters?: number;
  /** Own extent of a junction of two lines; default 100 m. */
  junctionExtentMeters?: number;
  /** Scale denominator of the map the coordinates were read from (e.g. 24000). */
  mapScale?: number;
  /** Stated measurement error in meters (added as given). */
  measurementErrorMeters?: number;
  /** How far a named place the gazetteer lacks may lie from the place used; default 120 km ([CHOICE]). */
  unusedFeatureMeters?: number;
  /** 'widen' (default) by unusedFeatureMeters, or 'decline' when such a place is named ([CHOICE]). */
  unusedFeatureRule?: 'widen' | 'decline';
  /** How far outside the record's stated unit a reference place may lie and still be taken, plus the text's offset; default 25 km ([CHOICE]). */
  justOutsideMeters?: number;
  /** With no polygon of the stated unit loaded, how far outside it a place lies, from its nearest loaded place: 'nearest place' (default), 'halfway' or 'off' ([CHOICE]). */
  unitEdgeByPlaces?: 'nearest place' | 'halfway' | 'off';
  /** Places sharing a name in an offset text: judged by where each one's 'result' lands (default) or only by where the 'reference place' lies ([CHOICE]). */
  namesakesJudgedBy?: 'result' | 'reference place';
  /** A name whose generic word says river, mountain… held only as a settlement of that very name: 'settlement' (default) or 'decline' ([CHOICE]). */
  settlementNamedLikeFeature?: 'settlement' | 'decline';
  /** A route between two places with a road kilometre post beside it: answered as the whole 'route' (default) or 'decline' ([CHOICE]). */
  routeKilometrePost?: RouteKilometrePostRule;
  /** Features of one name all within this distance of one another are covered by one circle; default 30 km ([CHOICE]). */
  namesakesWithinMeters?: number;
  /** A text that is only a name, found only by a near spelling: 'review' (default, ambiguous) or 'answer' ([CHOICE]). */
  fuzzyLoneName?: 'review' | 'answer';
  /** A name found only as the first word(s) of a longer name ("Redmere" for Redmere Springs): 'review' (default, ambiguous) or 'answer' ([CHOICE]). */
  nameAsFirstWords?: 'review' | 'answer';
  /** A place name found neither as written nor by another reading is read as an older spelling of its country's or text's language: 'on' (default) or 'off' ([CHOICE]). */
  olderSpellings?: 'on' | 'off';
  /** A name found only as the first words of an official long form "X de <honoree>" of its stated state ("Texcoco" for Texcoco de Mora): read as its short form, 'on' (default) or 'off' ([CHOICE]). */
  honoreeShortForms?: 'on' | 'off';
  /** A name found by no other reading, read with the words joining its parts left out, added or changed ("San Manuel Colohete"), inside a stated state: 'on' (default) or 'off' ([CHOICE]). */
  connectorReadings?: 'on' | 'off';
  /** A text that is only the record's country's name in another language (Latin "Brasilia"), which a town also bears: 'review' (default, ambiguous) or 'town' ([CHOICE]). */
  countryExonymTown?: 'review' | 'town';
  /** The record's state or province that names no loaded unit, read as the one loaded unit it names by a looser reading ("Labrador"): 'on' (default) or 'off' ([CHOICE]). */
  statedUnitReadings?: 'on' | 'off';
  /** The record's state or province written by a renamed unit's former name ("Distrito Federal" in Mexico), read as that unit: 'on' (default) or 'off' ([CHOICE]). */
  formerUnitNames?: 'on' | 'off';
  /** A leading clause naming a loaded state of a record stating none, read as that state when the next clause's place lies in it ("US, Colorado, Vail"), and a hierarchy's head naming a state read as the state, not a town ("BOCAS DEL TORO: …"): 'on' (default) or 'off' ([CHOICE]). */
  headStateByPlace?: 'on' | 'off';
  /** A protected area the gazetteer lacks, named after a town: the town stands in, widened, when "of" joins its name ('of', default), also in apposition ('any'), or never ('decline') ([CHOICE]). */
  protectedAreaTown?: 'of' | 'any' | 'decline';
  /** A number before "of the road from" a place ("13.5 da estrada de X"): the distance along that road from the place ('from the place', default) or no georeference ('decline') ([CHOICE]). */
  roadNumberFromPlace?: 'from the place' | 'decline';
  /** A station the gazetteer lacks, named after a place ("Alisos Station"): the town stands in, widened ('town', default), or never ('decline') ([CHOICE]). */
  stationTown?: 'town' | 'decline';
  /** A clause that is a near spelling of the record's own county ("Hitamalco" for Hueytamalco), read as the county: 'on' (default) or 'off' ([CHOICE]). */
  countyNearSpellings?: 'on' | 'off';
  /** A text of a few capitalised words whose words name no place ("Forks", "Country Homes"), read whole as a settlement of that name loaded in the record's stated units ('town', default) or by its words ('word') ([CHOICE]). */
  wordNamedTown?: 'town' | 'word';
  /** "ato" where "até" is read ("13.5 da estrada de X ato Y"), read as "até" ('até', default) or only as written ('as written') ([CHOICE]). */
  typedUpTo?: 'até' | 'as written';
  /** A county or municipality named alone with no polygon loaded: its seat town, widened by this much; 0 declines ([CHOICE]). */
  unitSeatMeters?: number;
  /** A lone name found farther than this from the town of the record's county is left for review; 0 turns it off ([CHOICE]). */
  countyReachMeters?: number;
  /** A text that is only one place name, found as a town that may be its municipality's seat: its radius widened by this much; 0 keeps the town's radius ([CHOICE]). */
  bareNameSeatMeters?: number;
  /** Datum of written coordinates when the record states one outside the text (EPSG code). */
  datum?: string;
  /** Accuracy standard of the map at `mapScale`; default 'unknown' (1 mm on the map only, docs/method.md §5.5). */
  mapStandard?: 'us-nmas' | 'australian' | 'unknown';
  /** Vertices of the footprint circle; default 64. */
  footprintSegments?: number;
  /** The two units a distance written with no unit is read between, smaller first; default 'km mi' ([CHOICE], docs/method.md §5.1). */
  unitlessDistanceUnits?: `${DistanceUnit} ${DistanceUnit}`;
}

/** A point, its datum and its radius, with how each part was obtained. */
export interface Georeference {
  /** WGS84 (EPSG:4326), full precision; rounding for output happens in src/record. */
  latitude: number;
  longitude: number;
  /** Sum of the components in meters, not yet rounded. */
  uncertaintyMeters: number;
  components: UncertaintyComponents;
  /** The footprint as WKT in EPSG:4326: the circle as a polygon, or the circle clipped to a unit. */
  footprintWKT: string;
  /** Features the result rests on, for georeferenceSources. */
  features: { sourceId: string; featureId: string; name: string }[];
  /** The interpretation in plain words, and every default or assumption used. */
  remarks: string[];
}
