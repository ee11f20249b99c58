/**
 * Every error leaves the service as JSON `{statusCode, error, message, field?}`: a 400 names the field
 * that is wrong, a 413 says the limit, and nothing internal (paths, stack traces) is ever shown.
 */
import type { FastifyError, FastifyReply, FastifyRequest } from 'fastify';

/** An error the routes raise on purpose, with the field it is about. */
export class RequestError extends Error {
  constructor(
    readonly statusCode: number,
    message: string,
    readonly field?: string,
  ) {
    super(message);
  }
}

const PHRASES: Record<number, string> = {
  400: 'Bad Request',
  401: 'Unauthorized',
  404: 'Not Found',
  409: 'Conflict',
  413: 'Payload Too Large',
  415: 'Unsupported Media Type',
  429: 'Too Many Requests',
  500: 'Internal Server Error',
  503: 'Service Unavailable',
};

export interface ValidationItem {
  instancePath: string;
  keyword: string;
  message?: string;
  params: Record<string, unknown>;
}

/**
 * The fastify error handler: validation errors name the field, everything else keeps its status.
 * `bodyLimit` is the JSON body limit in bytes, quoted in the 413 message.
 */
export const errorHandler = (bodyLimit: number) => (error: FastifyError | RequestError, request: FastifyRequest, reply: FastifyReply) => {
  if ('validation' in error && error.validation) {
    const { message, field } = validationProblem((error as FastifyError).validationContext ?? 'body', error.validation[0] as ValidationItem);
    return send(reply, 400, message, field);
  }
  const status = error.statusCode ?? 500;
  if (status >= 500) {
    request.log.error(error);
    return send(reply, status, 'the service could not complete this request; it is still running');
  }
  const field = error instanceof RequestError ? error.field : undefined;
  return send(reply, status, messageFor(error, status, bodyLimit), field);
};

function send(reply: FastifyReply, statusCode: number, message: string, field?: string) {
  return reply.code(statusCode).send({ statusCode, error: PHRASES[statusCode] ?? 'Error', message, ...(field ? { field } : {}) });
}

/**
 * A schema validation error in words, with the field it is about.
 * @example validationProblem('body', { instancePath: '/locality', keyword: 'type', params: {}, message: 'must be string' }) // { message: 'body.locality must be string', field: 'locality' }
 */
export function validationProblem(context: string, item: ValidationItem): { message: string; field: string } {
  const field = fieldOf(item);
  return { message: `${context}${field ? `.${field}` : ''} ${item.message ?? 'is not valid'}${detail(item)}`, field: field || context };
}

/** `options.mapScale`, `locality`, or the missing/extra property. */
function fieldOf(item: ValidationItem): string {
  const path = item.instancePath.split('/').filter(Boolean);
  const named = item.params.missingProperty ?? item.params.additionalProperty;
  if (typeof named === 'string') path.push(named);
  return path.join('.');
}

/** What a pattern asks for, in words, after the pattern itself (which stays for those who read it). */
const PATTERN_WORDS: Record<string, string> = {
  '^[A-Za-z]{2}$': 'a two-letter ISO 3166-1 alpha-2 code such as MX; a country\'s name goes in "country"',
  '^EPSG:[0-9]{4,5}$': 'an EPSG code such as EPSG:4267 (GET /api/v1/datums lists those converted)',
};

function detail(item: ValidationItem): string {
  if (item.keyword === 'additionalProperties') return `: "${String(item.params.additionalProperty).slice(0, 64)}" is not a field of this request`;
  if (item.keyword === 'pattern' && PATTERN_WORDS[String(item.params.pattern)]) return `: ${PATTERN_WORDS[String(item.params.pattern)]}`;
  // JSON numbers like 1e999 parse to Infinity, which is no number to the schema.
  if (item.keyword === 'type' && String(item.params.type).includes('number')) return ' (a finite number)';
  return '';
}

/** Fastify's own wording is kept where it is already specific; the body limit gets the number. */
function messageFor(error: FastifyError | RequestError, status: number, bodyLimit: number): string {
  const code = (error as FastifyError).code;
  if (code === 'FST_ERR_CTP_BODY_TOO_LARGE') return `the request body is larger than the limit of ${bodyLimit} bytes`;
  if (code === 'FST_REQ_FILE_TOO_LARGE') return 'the uploaded file is larger than the upload limit';
  if (code === 'FST_ERR_CTP_INVALID_MEDIA_TYPE') return 'this content type is not accepted here: send application/json';
  if (code === 'FST_ERR_CTP_EMPTY_JSON_BODY') return 'the request body is empty: send a JSON object';
  return status === 413 ? `${error.message} (limit exceeded)` : error.message;
}
