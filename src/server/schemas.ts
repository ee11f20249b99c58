/**
 * JSON schemas of the API (draft-07, as fastify's ajv reads them). They validate every request and
 * generate the OpenAPI document, so the documentation cannot drift from what the service checks.
 */

/** Text fields of a record: bounded so that no single field can make the service do unbounded work. */
const text = (description: string, maxLength = 500) => ({ type: 'string', maxLength, description }) as const;

/** A feature by source and id, as listed in `candidates[].feature`. */
export const featureKeySchema = {
  type: 'object',
  additionalProperties: false,
  required: ['sourceId', 'featureId'],
  properties: {
    sourceId: { type: 'string', minLength: 1, maxLength: 200 },
    featureId: { type: 'string', minLength: 1, maxLength: 200 },
  },
} as const;

const lookupOptionsSchema = {
  type: 'object',
  additionalProperties: false,
  description: 'Edits and method settings; every one is optional.',
  properties: {
    candidate: { ...featureKeySchema, description: 'Use this candidate feature instead of the one the matcher chose.' },
    distancePrecision: { type: 'number', exclusiveMinimum: 0, maximum: 100000, description: 'Distance precision in the written unit (method §5.1: δ = precision / 2).' },
    mapScale: { type: 'number', minimum: 1, maximum: 100000000, description: 'Scale denominator of the map the coordinates were read from, e.g. 24000.' },
    datum: { type: 'string', pattern: '^EPSG:[0-9]{4,5}$', description: 'Datum of written coordinates as an EPSG code, e.g. EPSG:4267.' },
    measurementErrorMeters: { type: 'number', minimum: 0, maximum: 20000000, description: 'A stated measurement error in meters.' },
    coverAmbiguous: { type: 'boolean', description: 'For an ambiguous name, one circle covering every candidate.' },
    administrativeFallback: { type: 'boolean', description: "For text naming no place, use the record's smallest administrative unit." },
  },
} as const;

export const lookupBodySchema = {
  type: 'object',
  additionalProperties: false,
  required: ['locality'],
  properties: {
    locality: text('The locality text as written on the label.', 4000),
    countryCode: { type: 'string', pattern: '^[A-Za-z]{2}$', description: 'ISO 3166-1 alpha-2 country code.' },
    country: text('Country of the record.'),
    stateProvince: text('State or province of the record.'),
    county: text('County of the record.'),
    municipality: text('Municipality of the record.'),
    verbatimCoordinates: text('Coordinates as written in the record.'),
    geodeticDatum: text('Datum of verbatimCoordinates as the record states it.', 100),
    decimalLatitude: { type: 'number', minimum: -90, maximum: 90, description: "The record's own latitude, compared with the proposed point." },
    decimalLongitude: { type: 'number', minimum: -180, maximum: 180, description: "The record's own longitude." },
    georeferencedBy: text('Who is georeferencing, for georeferencedBy.', 200),
    options: lookupOptionsSchema,
  },
} as const;

/** Objects whose inner shape is given by the TypeScript contract (src/parse/types.ts, src/georef/types.ts). */
const openObject = (description: string) => ({ type: 'object', additionalProperties: true, description }) as const;

export const lookupResponseSchema = {
  type: 'object',
  required: ['status', 'interpretation', 'candidates', 'darwinCore'],
  properties: {
    status: { type: 'string', enum: ['georeferenced', 'ambiguous', 'not-found', 'unparseable'] },
    georeference: openObject('The point (WGS84), uncertaintyMeters, components, footprintWKT, features used and remarks.'),
    components: openObject('The uncertainty budget in meters by source: extent, offset, coordinatePrecision, datum, mapScale, measurement.'),
    interpretation: openObject('How the text was read: clauses, locality type, feature names, offsets with their precisions.'),
    candidates: { type: 'array', items: openObject('A candidate feature with its score, matched name and why it matched.') },
    reason: { type: 'string', description: 'Why no georeference was made.' },
    darwinCore: openObject('The Darwin Core georeference terms for this result, as strings.'),
    footprint: openObject('The footprint as GeoJSON geometry.'),
    footprintSummary: {
      type: 'object',
      required: ['type', 'parts', 'vertices', 'areaSquareMeters'],
      description: 'The footprint in brief: its type, polygons, distinct vertices and geodesic area on WGS84.',
      properties: {
        type: { type: 'string', enum: ['Polygon', 'MultiPolygon'] },
        parts: { type: 'integer', minimum: 1 },
        vertices: { type: 'integer', minimum: 0 },
        areaSquareMeters: { type: 'number', minimum: 0 },
      },
    },
    recordPoint: openObject("The record's own coordinates and their distance from the proposed point."),
  },
} as const;

export const errorSchema = {
  type: 'object',
  required: ['statusCode', 'error', 'message'],
  properties: {
    statusCode: { type: 'integer' },
    error: { type: 'string' },
    message: { type: 'string' },
    field: { type: 'string', description: 'The request field the error is about.' },
  },
} as const;

/** The usual error responses of a route that takes a body. */
export const errorResponses = { 400: errorSchema, 401: errorSchema, 413: errorSchema, 429: errorSchema } as const;

/** A path parameter that is an identifier, never a path. */
export const identifier = { type: 'string', minLength: 1, maxLength: 200 } as const;
