/**
 * JSON bodies are read as bytes and must be valid UTF-8: a byte sequence that is not UTF-8 is refused
 * with its offset instead of being turned silently into replacement characters.
 */
import type { FastifyInstance } from 'fastify';
import { RequestError } from './errors.ts';

const strictUtf8 = new TextDecoder('utf-8', { fatal: true });

/** Replaces fastify's JSON parser with one that checks UTF-8 first, keeping its prototype-poisoning checks. */
export function registerStrictJson(app: FastifyInstance): void {
  const parseJson = app.getDefaultJsonParser('error', 'error');
  // Only JSON (and multipart, for uploads) is read: a text/plain body gets 415, not a guess.
  app.removeContentTypeParser(['application/json', 'text/plain']);
  app.addContentTypeParser('application/json', { parseAs: 'buffer' }, (request, body, done) => {
    const bytes = body as Buffer;
    if (bytes.length === 0) {
      done(new RequestError(400, 'the request body is empty: send a JSON object', 'body'), undefined);
      return;
    }
    let text: string;
    try {
      text = strictUtf8.decode(bytes);
    } catch {
      done(new RequestError(400, `the request body is not valid UTF-8 (first bad byte at offset ${firstInvalidByte(bytes)})`, 'body'), undefined);
      return;
    }
    parseJson(request, text, (error, value) => {
      if (error) done(new RequestError(400, `the request body is not valid JSON: ${error.message}`, 'body'), undefined);
      else done(null, value);
    });
  });
}

/** Offset of the first byte that does not start a valid UTF-8 sequence (only run on a bad body). */
function firstInvalidByte(bytes: Buffer): number {
  for (let i = 0; i < bytes.length; ) {
    const b = bytes[i];
    const length = b < 0x80 ? 1 : b >= 0xc2 && b < 0xe0 ? 2 : b >= 0xe0 && b < 0xf0 ? 3 : b >= 0xf0 && b < 0xf5 ? 4 : 0;
    if (length === 0 || !decodes(bytes.subarray(i, i + length))) return i;
    i += length;
  }
  return bytes.length;
}

function decodes(sequence: Buffer): boolean {
  try {
    strictUtf8.decode(sequence);
    return true;
  } catch {
    return false;
  }
}
