import { Readable } from 'node:stream';
import type { FastifyPluginAsyncTypebox } from '@fastify/type-provider-typebox';
import { Type } from 'typebox';
import type { LocateResult } from '../../locate/locate.ts';
import { answerLine, errorLine } from '../../output/ndjson.ts';
import { errorHandler, RequestError, validationProblem, type ValidationItem } from '../errors.ts';
import { lookUpIn, type ServedGazetteer } from '../lookup.ts';
import type { RecordPool } from '../record-pool.ts';
import type { ResultCache } from '../result-cache.ts';
import { errorResponses, lookupBodySchema, oneOf, openObject, type LookupRequest } from '../schemas.ts';

export interface RecordsRoutesOptions {
  gazetteer: ServedGazetteer;
  results?: ResultCache<LocateResult>;
  /** Worker threads that compute the answers; without them the main thread does. */
  pool?: RecordPool;
}

/**
 * Limits of one request [CHOICE]: 1000 records of a few hundred bytes each are well under 4 MiB and take
 * about a second to georeference; a script with more sends them in several requests.
 */
export const RECORDS_LIMITS = { maxRecords: 1000, maxBytes: 4 * 1024 * 1024 } as const;

/** One record: the body of POST /api/v1/georeference, with the caller's own identifier to bind the answer back. */
export const recordSchema = Type.Object(
  {
    ...lookupBodySchema.properties,
    occurrenceID: Type.Optional(Type.String({ maxLength: 500, description: "The caller's identifier of the record, returned on its answer line." })),
  },
  { additionalProperties: false },
);

const recordsBodySchema = Type.Array(recordSchema, {
  maxItems: RECORDS_LIMITS.maxRecords,
  description:
    `A JSON array of records (application/json), or one record a line (application/x-ndjson); at most ${RECORDS_LIMITS.maxRecords} records and ${RECORDS_LIMITS.maxBytes} bytes. ` +
    'Each record is checked on its own: a bad one gets an error line, the others are answered.',
});

const recordLineSchema = Type.Object(
  {
    index: Type.Integer({ minimum: 0, description: 'The place of the record in the request, from 0.' }),
    occurrenceID: Type.Optional(Type.String({ description: "The record's occurrenceID, when it had one." })),
    status: oneOf(['georeferenced', 'ambiguous', 'not-found', 'unparseable', 'invalid', 'failed'], 'The locate status; "invalid" for a record refused by the schema or its edits; "failed" when the service could not answer it.'),
    darwinCore: Type.Optional(openObject('The Darwin Core georeference terms, as strings.')),
    flags: Type.Optional(Type.Array(Type.String(), { description: "What the check of the record's own coordinates found." })),
    reason: Type.Optional(Type.String({ description: 'Why no georeference was made.' })),
    error: Type.Optional(Type.Object({ message: Type.String(), field: Type.Optional(Type.String()) }, { description: 'For an invalid record: what is wrong, and the field.' })),
  },
  { description: 'One line of the application/x-ndjson answer: one line a record, in the order of the request.' },
);

const DESCRIPTION =
  'Georeferences many records in one request, for scripts that hold their data in memory, and streams one NDJSON line a record in order, ' +
  `each as POST /api/v1/georeference would answer it. At most ${RECORDS_LIMITS.maxRecords} records (413 beyond) and ${RECORDS_LIMITS.maxBytes} bytes (413).`;

/** A line of an NDJSON body that is not JSON: answered with an error line of its own. */
class UnreadableLine {
  constructor(readonly message: string) {}
}

/**
 * What a line's JSON error adds to "this line is not valid JSON": nothing for the parser's generic syntax
 * error, the message otherwise.
 * @example lineError(new Error('Unexpected end')) // ': Unexpected end'
 */
function lineError(error: Error): string {
  return (error as { code?: string }).code === 'FST_ERR_CTP_INVALID_JSON_BODY' ? '' : `: ${error.message}`;
}

/**
 * POST /api/v1/georeference/records: many records in, one answer line each out, in order, through the
 * same front door and output as the one-record route.
 * @example await app.register(recordsRoutes, { gazetteer: store, results: new ResultCache(100) })
 */
export const recordsRoutes: FastifyPluginAsyncTypebox<RecordsRoutesOptions> = async (app, { gazetteer, results, pool }) => {
  const parseJson = app.getDefaultJsonParser('error', 'error');
  const strictUtf8 = new TextDecoder('utf-8', { fatal: true });
  app.addContentTypeParser('application/x-ndjson', { parseAs: 'buffer', bodyLimit: RECORDS_LIMITS.maxBytes }, (_request, body, done) => {
    let text: string;
    try {
      text = strictUtf8.decode(body as Buffer);
    } catch {
      done(new RequestError(400, 'the request body is not valid UTF-8', 'body'), undefined);
      return;
    }
    // A blank line (such as the one after the last record) is no record.
    const lines = text.split('\n').filter((line) => line.trim() !== '');
    done(null, lines.map((line) => {
      let value: unknown;
      // The parser's own message for a syntax error speaks of an application/json body, not of this line.
      parseJson(_request, line, (error, parsed) => (value = error ? new UnreadableLine(`this line is not valid JSON${lineError(error)}`) : parsed));
      return value;
    }));
  });

  app.post(
    '/api/v1/georeference/records',
    {
      bodyLimit: RECORDS_LIMITS.maxBytes,
      // Each record is validated on its own below, so one bad record does not refuse the others.
      attachValidation: true,
      errorHandler: errorHandler(RECORDS_LIMITS.maxBytes),
      schema: {
        summary: 'Georeference many records, streamed back as NDJSON',
        description: DESCRIPTION,
        tags: ['georeference'],
        consumes: ['application/json', 'application/x-ndjson'],
        produces: ['application/x-ndjson'],
        body: recordsBodySchema,
        response: { 200: recordLineSchema, ...errorResponses },
      },
    },
    async (request, reply) => {
      const body: unknown = request.body;
      if (!Array.isArray(body)) throw new RequestError(400, 'the request body is not a list of records: send a JSON array, or one JSON object a line as application/x-ndjson', 'body');
      const records: unknown[] = body;
      if (records.length > RECORDS_LIMITS.maxRecords) {
        throw new RequestError(413, `${records.length} records is more than the limit of ${RECORDS_LIMITS.maxRecords} records a request: send them in several requests`, 'body');
      }
      const isRecord = request.compileValidationSchema(recordSchema);
      /** One record's answer line (or error line). */
      const lineOf = async (index: number, record: unknown): Promise<string> => {
        const id = (record as { occurrenceID?: unknown } | null)?.occurrenceID;
        const occurrenceID = typeof id === 'string' ? id : undefined;
        if (record instanceof UnreadableLine) return errorLine(index, undefined, { message: `records[${index}]: ${record.message}`, field: 'body' });
        if (!isRecord(record)) return errorLine(index, occurrenceID, validationProblem(`records[${index}]`, isRecord.errors?.[0] as ValidationItem));
        const { occurrenceID: _id, ...lookup } = record as LookupRequest & { occurrenceID?: string };
        try {
          return answerLine(index, occurrenceID, await lookUpIn(pool, gazetteer, lookup, results));
        } catch (error) {
          if (error instanceof RequestError) return errorLine(index, occurrenceID, { message: `records[${index}].${error.message}`, ...(error.field ? { field: error.field } : {}) });
          request.log.error(error);
          return errorLine(index, occurrenceID, { message: 'the service could not answer this record' }, 'failed');
        }
      };
      // In order, with a few records ahead in the worker threads so that they all keep busy; without them, one at a time.
      const ahead = pool ? pool.threads * 2 : 1;
      async function* lines(): AsyncGenerator<string> {
        const pending: Promise<string>[] = [];
        for (const [index, record] of records.entries()) {
          pending.push(lineOf(index, record));
          if (pending.length >= ahead) yield await pending.shift()!;
        }
        for (const line of pending) yield await line;
      }
      // A stream is sent as it is, never through the response schema, which documents one line.
      return reply.type('application/x-ndjson; charset=utf-8').send(Readable.from(lines()) as never);
    },
  );
};
