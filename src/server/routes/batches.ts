import multipart from '@fastify/multipart';
import type { FastifyPluginAsyncTypebox } from '@fastify/type-provider-typebox';
import { Type } from 'typebox';
import type { BatchService, RecordFilter } from '../batches.ts';
import { RequestError } from '../errors.ts';
import type { Resolution } from '../../store/reviews.ts';
import { generalisationQuerySchema, generalisationRequest } from '../generalisation-request.ts';
import { errorResponses, errorSchema, featureKeySchema, oneOf, openObject } from '../schemas.ts';

const jobParams = Type.Object({ jobId: Type.String({ pattern: '^[A-Za-z0-9_-]{1,64}$' }) });
const recordParams = Type.Object({ jobId: jobParams.properties.jobId, row: Type.String({ pattern: '^[1-9][0-9]{0,8}$', description: 'Data row number, from 1.' }) });
const wholeMeters = Type.String({ pattern: '^[0-9]{1,9}$' });
const open = openObject();
const correctedLocality = Type.String({ minLength: 1, maxLength: 4000, description: "The locality text as the reviewer corrected it, georeferenced instead of the record's (which is kept unchanged)." });
const recordCoordinatesDescription = "Use the record's own decimalLatitude/decimalLongitude as the point, with a sign or order error corrected when the coordinate check found one.";

export interface BatchRoutesOptions {
  batches: BatchService;
  /** Largest upload in bytes. */
  uploadLimit: number;
}

/**
 * Batch upload and review: POST /api/v1/batches (multipart, field `file`: CSV text or a Darwin Core
 * Archive, told apart by content), GET …/:jobId (progress, for polling), GET …/:jobId/records (the
 * review list), GET and PUT …/records/:row (one record, its decision), GET …/:jobId/reviewed.csv (the
 * reviewed file; also reviewed.geojson and reviewed.gpkg, and reviewed.zip for an archive).
 * @example await app.register(batchRoutes, { batches, uploadLimit: 50 * 1024 * 1024 })
 */
export const batchRoutes: FastifyPluginAsyncTypebox<BatchRoutesOptions> = async (scope, { batches, uploadLimit }) => {
  await scope.register(multipart, { limits: { fileSize: uploadLimit, files: 2, fields: 4, parts: 6, fieldSize: 1024 } });

  scope.post(
    '/api/v1/batches',
    {
      schema: {
        summary: 'Upload a CSV or a Darwin Core Archive and start a batch job',
        description:
          'The file is CSV or tab-separated text, or a Darwin Core Archive (a zip with a meta.xml, whose occurrence core is georeferenced), ' +
          'told apart by its bytes, not its name. A zip that is not an archive (unreadable, no meta.xml) is refused with 415; ' +
          'an archive whose meta.xml names no core, or a core that cannot be read, with 400. ' +
          'A list of sensitive taxa, when rows are to be generalised, goes in a second file field, "sensitiveTaxa" (see the query fields).',
        tags: ['batch'],
        consumes: ['multipart/form-data'],
        querystring: generalisationQuerySchema,
        response: { 202: open, 409: errorSchema, 415: errorSchema, ...errorResponses },
      },
    },
    async (request, reply) => {
      if (!request.isMultipart()) throw new RequestError(415, 'send the CSV or the Darwin Core Archive as multipart/form-data in a field named "file"', 'file');
      const files = new Map<string, Buffer>();
      for await (const part of request.files()) {
        if (part.fieldname !== 'file' && part.fieldname !== 'sensitiveTaxa') {
          throw new RequestError(400, `the upload needs a field named "file" holding the CSV or the Darwin Core Archive (and, to generalise sensitive taxa, "sensitiveTaxa"), not "${part.fieldname}"`, 'file');
        }
        files.set(part.fieldname, await part.toBuffer().catch((error: { code?: string }) => {
          if (error.code === 'FST_REQ_FILE_TOO_LARGE') throw new RequestError(413, `the uploaded file is larger than the upload limit of ${uploadLimit} bytes`, part.fieldname);
          throw error;
        }));
      }
      const bytes = files.get('file');
      if (!bytes) throw new RequestError(400, 'the upload needs a field named "file" holding the CSV or the Darwin Core Archive', 'file');
      const jobId = await batches.start(bytes, generalisationRequest(request.query, files.get('sensitiveTaxa')));
      return reply.code(202).send({ jobId, progress: `/api/v1/batches/${jobId}` });
    },
  );

  scope.get(
    '/api/v1/batches/:jobId',
    { schema: { summary: 'Progress of a batch job', tags: ['batch'], params: jobParams, response: { 200: open, 404: errorSchema } } },
    async (request) => batches.progress(request.params.jobId),
  );

  scope.get(
    '/api/v1/batches/:jobId/records',
    {
      schema: {
        summary: 'The review list of a finished batch, filtered',
        tags: ['batch'],
        params: jobParams,
        querystring: Type.Object(
          {
            status: Type.Optional(Type.String({ maxLength: 100 })),
            review: Type.Optional(oneOf(['pending', 'accepted', 'rejected'])),
            flag: Type.Optional(Type.String({ maxLength: 100 })),
            localityType: Type.Optional(Type.String({ maxLength: 100 })),
            radiusMin: Type.Optional(wholeMeters),
            radiusMax: Type.Optional(wholeMeters),
          },
          { additionalProperties: false },
        ),
        response: { 200: open, 404: errorSchema, 409: errorSchema },
      },
    },
    async (request) => {
      const q = request.query;
      const filter: RecordFilter = {
        status: q.status || undefined,
        review: q.review || undefined,
        flag: q.flag || undefined,
        localityType: q.localityType || undefined,
        radiusMin: q.radiusMin ? Number(q.radiusMin) : undefined,
        radiusMax: q.radiusMax ? Number(q.radiusMax) : undefined,
      };
      return batches.list(request.params.jobId, filter);
    },
  );

  scope.get(
    '/api/v1/batches/:jobId/records/:row',
    {
      schema: {
        summary: 'One record of a batch with its georeference, candidates and review',
        tags: ['batch'],
        params: recordParams,
        querystring: Type.Object(
          {
            candidateSource: Type.Optional(featureKeySchema.properties.sourceId),
            candidateFeature: Type.Optional(featureKeySchema.properties.featureId),
            locality: Type.Optional(correctedLocality),
            recordCoordinates: Type.Optional(oneOf(['true'], recordCoordinatesDescription)),
          },
          { additionalProperties: false, dependencies: { candidateSource: ['candidateFeature'], candidateFeature: ['candidateSource'] } },
        ),
        response: { 200: open, 404: errorSchema, 409: errorSchema },
      },
    },
    async (request) => {
      const { candidateSource, candidateFeature, locality, recordCoordinates } = request.query;
      const resolution: Resolution = {};
      if (candidateSource && candidateFeature) resolution.candidate = { sourceId: candidateSource, featureId: candidateFeature };
      if (locality !== undefined) resolution.locality = locality;
      if (recordCoordinates === 'true') resolution.recordCoordinates = true;
      return batches.record(request.params.jobId, Number(request.params.row), resolution);
    },
  );

  scope.put(
    '/api/v1/batches/:jobId/records/:row/review',
    {
      schema: {
        summary: 'Accept or reject a record, with how its point was resolved; stored with who and when',
        description:
          'Accepting verifies a point, so a record without one (not found, ambiguous, unreadable) is refused with 409 until the body resolves it: ' +
          "another candidate, a corrected locality (with a candidate if that is ambiguous), or the record's own coordinates.",
        tags: ['batch'],
        params: recordParams,
        body: Type.Object(
          {
            decision: oneOf(['accepted', 'rejected']),
            reviewer: Type.String({ maxLength: 200 }),
            candidate: Type.Optional(featureKeySchema),
            locality: Type.Optional(correctedLocality),
            recordCoordinates: Type.Optional(Type.Boolean({ description: recordCoordinatesDescription })),
          },
          { additionalProperties: false },
        ),
        response: { 200: open, ...errorResponses, 404: errorSchema, 409: errorSchema },
      },
    },
    async (request) => {
      const { decision, reviewer, ...resolution } = request.body;
      if (resolution.recordCoordinates === false) delete resolution.recordCoordinates;
      return batches.decide(request.params.jobId, Number(request.params.row), decision, reviewer, resolution);
    },
  );

  scope.get(
    '/api/v1/batches/:jobId/reviewed.csv',
    { schema: { summary: 'The batch output with every review decision applied, as CSV', tags: ['batch'], params: jobParams, produces: ['text/csv'] } },
    async (request, reply) => {
      // The input's delimiter is kept: a tab-separated upload comes back as tab-separated values. An
      // archive's core is the table whereabouts wrote from it (its originals are in the archive): CSV.
      const { text, delimiter } = batches.reviewedCsv(request.params.jobId, batches.progress(request.params.jobId).input === 'darwin-core-archive' ? ',' : undefined);
      const [type, extension] = delimiter === '\t' ? ['text/tab-separated-values', 'tsv'] : ['text/csv', 'csv'];
      return reply
        .header('content-type', `${type}; charset=utf-8`)
        .header('content-disposition', `attachment; filename="whereabouts-reviewed-${request.params.jobId}.${extension}"`)
        .send(text);
    },
  );

  const gisFormats = [
    { format: 'geojson', type: 'application/geo+json', summary: 'The reviewed batch output as a GeoJSON FeatureCollection (RFC 7946)' },
    { format: 'gpkg', type: 'application/geopackage+sqlite3', summary: 'The reviewed batch output as a GeoPackage: layers points and footprints' },
  ] as const;
  for (const { format, type, summary } of gisFormats) {
    scope.get(
      `/api/v1/batches/:jobId/reviewed.${format}`,
      { schema: { summary, tags: ['batch'], params: jobParams, produces: [type] } },
      async (request, reply) =>
        reply
          .header('content-type', type)
          .header('content-disposition', `attachment; filename="whereabouts-reviewed-${request.params.jobId}.${format}"`)
          .send(await batches.reviewedFile(request.params.jobId, format)),
    );
  }

  scope.get(
    '/api/v1/batches/:jobId/reviewed.zip',
    {
      schema: {
        summary: 'A batch over a Darwin Core Archive as a new archive: every original file byte for byte, the core with the reviewed georeference terms, meta.xml describing them, the EML with a method step',
        tags: ['batch'],
        params: jobParams,
        description: 'A job over a CSV upload has no archive: 404.',
        produces: ['application/zip'],
      },
    },
    async (request, reply) =>
      reply
        .header('content-type', 'application/zip')
        .header('content-disposition', `attachment; filename="whereabouts-reviewed-${request.params.jobId}.zip"`)
        .send(await batches.reviewedArchive(request.params.jobId)),
  );
};
