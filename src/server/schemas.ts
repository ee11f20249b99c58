/**
 * JSON schemas of the API, built with TypeBox: one source for validation (fastify's ajv), the OpenAPI
 * document (@fastify/swagger) and the TypeScript types of requests (`Static<…>`, through the fastify
 * type provider), so none of the three can drift from the others.
 */
import { Type, type Static } from 'typebox';
import { ROUTE_KILOMETRE_POST_RULES } from '../georef/types.ts';

/** Text fields of a record: bounded so that no single field can make the service do unbounded work. */
const text = (description: string, maxLength = 500) => Type.String({ maxLength, description });

/** A string from a fixed list, written as `{type: 'string', enum}` (the form ajv words its errors for). */
export const oneOf = <const T extends readonly string[]>(values: T, description?: string) =>
  Type.Unsafe<T[number]>({ type: 'string', enum: [...values], ...(description ? { description } : {}) });

/** A feature by source and id, as listed in `candidates[].feature`. */
export const featureKeySchema = Type.Object(
  {
    sourceId: Type.String({ minLength: 1, maxLength: 200 }),
    featureId: Type.String({ minLength: 1, maxLength: 200 }),
  },
  { additionalProperties: false },
);

const chosenFeatureSchema = Type.Object(
  {
    name: Type.String({ minLength: 1, maxLength: 500, description: 'The name as interpretation.features lists it.' }),
    sourceId: featureKeySchema.properties.sourceId,
    featureId: featureKeySchema.properties.featureId,
  },
  { additionalProperties: false },
);

const lookupOptionsSchema = Type.Object(
  {
    candidate: Type.Optional(Type.Object(featureKeySchema.properties, { additionalProperties: false, description: 'Use this candidate feature instead of the one the matcher chose (a text that names one place): a candidate of its name, of its second name in brackets, or of a later clause that stands in for a place the gazetteer lacks.' })),
    candidates: Type.Optional(Type.Array(chosenFeatureSchema, { maxItems: 20, description: 'For a text that names several places: the candidate chosen for each name.' })),
    distancePrecision: Type.Optional(Type.Number({ exclusiveMinimum: 0, maximum: 100000, description: 'Distance precision in the written unit (method §5.1: δ = precision / 2).' })),
    mapScale: Type.Optional(Type.Number({ minimum: 1, maximum: 100000000, description: 'Scale denominator of the map the coordinates were read from, e.g. 24000.' })),
    datum: Type.Optional(Type.String({ pattern: '^EPSG:[0-9]{4,5}$', description: 'Datum of written coordinates as an EPSG code, e.g. EPSG:4267.' })),
    measurementErrorMeters: Type.Optional(Type.Number({ minimum: 0, maximum: 20000000, description: 'A stated measurement error in meters.' })),
    coverAmbiguous: Type.Optional(Type.Boolean({ description: 'For an ambiguous name, one circle covering every candidate.' })),
    administrativeFallback: Type.Optional(Type.Boolean({ description: "For text naming no place, use the record's smallest administrative unit." })),
    routeKilometrePost: Type.Optional(
      oneOf(ROUTE_KILOMETRE_POST_RULES, "A route between two places with a road kilometre post beside it and no road line loaded: 'route' answers the whole route, the post not placed; 'decline' gives no georeference (GET /api/v1/method, routeKilometrePost, gives the rule in force)."),
    ),
  },
  { additionalProperties: false, description: 'Edits and method settings; every one is optional.' },
);

export const lookupBodySchema = Type.Object(
  {
    locality: text('The locality text as written on the label.', 4000),
    countryCode: Type.Optional(Type.String({ pattern: '^[A-Za-z]{2}$', description: 'ISO 3166-1 alpha-2 country code.' })),
    country: Type.Optional(text('Country of the record.')),
    stateProvince: Type.Optional(text('State or province of the record.')),
    county: Type.Optional(text('County of the record.')),
    municipality: Type.Optional(text('Municipality of the record.')),
    verbatimCoordinates: Type.Optional(text('Coordinates as written in the record.')),
    geodeticDatum: Type.Optional(text('Datum of verbatimCoordinates as the record states it.', 100)),
    decimalLatitude: Type.Optional(Type.Number({ minimum: -90, maximum: 90, description: "The record's own latitude, compared with the proposed point." })),
    decimalLongitude: Type.Optional(Type.Number({ minimum: -180, maximum: 180, description: "The record's own longitude." })),
    georeferencedBy: Type.Optional(text('Who is georeferencing, for georeferencedBy.', 200)),
    options: Type.Optional(lookupOptionsSchema),
  },
  { additionalProperties: false },
);

/** The body of POST /api/v1/georeference. */
export type LookupRequest = Static<typeof lookupBodySchema>;

/** Objects whose inner shape is given by the TypeScript contract (src/parse/types.ts, src/georef/types.ts). */
export const openObject = (description?: string) => Type.Object({}, { additionalProperties: true, ...(description ? { description } : {}) });

export const lookupResponseSchema = Type.Object({
  status: oneOf(['georeferenced', 'ambiguous', 'not-found', 'unparseable']),
  georeference: Type.Optional(openObject('The point (WGS84), uncertaintyMeters, components, footprintWKT, features used and remarks.')),
  components: Type.Optional(openObject('The uncertainty budget in meters by source: extent, offset, coordinatePrecision, datum, mapScale, measurement.')),
  interpretation: openObject('How the text was read: clauses, locality type, feature names, offsets with their precisions.'),
  candidates: Type.Array(openObject('A candidate feature with its score, matched name and why it matched.')),
  reason: Type.Optional(Type.String({ description: 'Why no georeference was made.' })),
  darwinCore: openObject('The Darwin Core georeference terms for this result, as strings.'),
  footprint: Type.Optional(openObject('The footprint as GeoJSON geometry.')),
  footprintSummary: Type.Optional(
    Type.Object(
      {
        type: oneOf(['Polygon', 'MultiPolygon']),
        parts: Type.Integer({ minimum: 1 }),
        vertices: Type.Integer({ minimum: 0 }),
        areaSquareMeters: Type.Number({ minimum: 0 }),
      },
      { description: 'The footprint in brief: its type, polygons, distinct vertices and geodesic area on WGS84.' },
    ),
  ),
  recordPoint: Type.Optional(openObject("The record's own coordinates and their distance from the proposed point.")),
  flags: Type.Optional(Type.Array(Type.String(), { description: 'What the plausibility checks found about the proposed point (outside-record-country, at-sea, clauses-conflict); each is also explained in the remarks.' })),
});

export const errorSchema = Type.Object({
  statusCode: Type.Integer(),
  error: Type.String(),
  message: Type.String(),
  field: Type.Optional(Type.String({ description: 'The request field the error is about.' })),
});

/** The usual error responses of a route that takes a body. */
export const errorResponses = { 400: errorSchema, 401: errorSchema, 413: errorSchema, 429: errorSchema } as const;

/** A path parameter that is an identifier, never a path. */
export const identifier = Type.String({ minLength: 1, maxLength: 200 });
