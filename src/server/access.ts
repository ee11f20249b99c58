/**
 * Who may call the service: loopback callers by default; anything else only with the access token.
 * The token comes from the environment or a file, never from the command line (other users of the
 * machine can read a process's arguments).
 */
import { createHash, timingSafeEqual } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { isIP } from 'node:net';
import type { FastifyReply, FastifyRequest } from 'fastify';

/** The cookie the sign-in form sets, so the page's own requests carry the token. */
export const TOKEN_COOKIE = 'whereabouts_token';

/** Paths anyone may load: the sign-in form and its style sheet hold no data. */
const OPEN_PATHS = new Set(['/login', '/login.css', '/login.js']);

/**
 * True for addresses only this machine can reach (127.0.0.0/8, ::1, localhost).
 * @example isLoopback('127.0.0.1') // true; isLoopback('0.0.0.0') // false
 */
export function isLoopback(host: string): boolean {
  const bare = host.replace(/^\[|\]$/g, '').toLowerCase();
  if (bare === 'localhost' || bare === '::1') return true;
  if (isIP(bare) === 4) return bare.startsWith('127.');
  return bare.startsWith('::ffff:127.');
}

/**
 * The access token from env WHEREABOUTS_TOKEN, or from the file named by WHEREABOUTS_TOKEN_FILE
 * (surrounding white space trimmed). Undefined when neither is set (an empty variable is unset); an
 * error for a token shorter than 16 characters.
 */
export function readAccessToken(env: NodeJS.ProcessEnv): string | undefined {
  let token: string | undefined;
  let from = '';
  if (env.WHEREABOUTS_TOKEN) {
    token = env.WHEREABOUTS_TOKEN.trim();
    from = 'WHEREABOUTS_TOKEN';
  } else if (env.WHEREABOUTS_TOKEN_FILE) {
    token = readFileSync(env.WHEREABOUTS_TOKEN_FILE, 'utf8').trim();
    from = `the file ${env.WHEREABOUTS_TOKEN_FILE} (WHEREABOUTS_TOKEN_FILE)`;
  }
  if (token === undefined) return undefined;
  // 16 characters: common practice, no source; a guessable token is no protection on a network.
  if (token.length < 16) throw new Error(`the access token from ${from} must be at least 16 characters long`);
  return token;
}

/** Refuses a bind that other machines can reach when no token protects it. */
export function assertSafeBind(host: string, token: string | undefined): void {
  if (!isLoopback(host) && !token) {
    throw new Error(
      `refusing to listen on ${host} without an access token: other machines could reach it. ` +
        'Set WHEREABOUTS_TOKEN (or WHEREABOUTS_TOKEN_FILE to a file holding it), or listen on 127.0.0.1.',
    );
  }
}

/**
 * A fastify onRequest hook that lets a request through only with the token, given as
 * `Authorization: Bearer <token>` or as the sign-in cookie. Compared in constant time.
 */
export function tokenGuard(token: string) {
  const expected = digest(token);
  return async (request: FastifyRequest, reply: FastifyReply) => {
    const path = request.url.split('?')[0];
    if (OPEN_PATHS.has(path)) return;
    const given = presentedToken(request);
    if (given !== undefined && timingSafeEqual(digest(given), expected)) return;
    const message = given === undefined ? 'an access token is required' : 'the access token is not valid';
    if (request.method === 'GET' && !path.startsWith('/api/')) {
      // A person at a browser: to the sign-in form, which the page's own data never reaches.
      return reply.redirect('/login', 303);
    }
    return reply.code(401).send({ statusCode: 401, error: 'Unauthorized', message: `${message}: send "Authorization: Bearer <token>"` });
  };
}

/** Checks a token typed into the sign-in form. */
export function tokenMatches(token: string, given: string): boolean {
  return timingSafeEqual(digest(token), digest(given));
}

function presentedToken(request: FastifyRequest): string | undefined {
  const header = request.headers.authorization;
  if (header?.startsWith('Bearer ')) return header.slice('Bearer '.length).trim();
  const cookies = request.headers.cookie ?? '';
  for (const part of cookies.split(';')) {
    const [name, ...value] = part.trim().split('=');
    if (name === TOKEN_COOKIE) return safeDecode(value.join('='));
  }
  return undefined;
}

function safeDecode(text: string): string {
  try {
    return decodeURIComponent(text);
  } catch {
    return text;
  }
}

function digest(text: string): Buffer {
  return createHash('sha256').update(text, 'utf8').digest();
}
