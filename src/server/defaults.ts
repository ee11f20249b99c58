import { availableParallelism } from 'node:os';

/**
 * Defaults of the service [CHOICE]: a label's text is well under 64 KiB; 1200 a minute is 20 lookups a
 * second per client; 2000 results are a few MB; an uploaded Darwin Core Archive may hold up to 512 MiB
 * uncompressed (about ten times the upload limit, what delimited text compresses to), so that a small zip
 * cannot fill the disk; worker threads for the georeference routes: one a core, at most 2 (measured with
 * bench:server on 2 cores, where the main thread's own share keeps a third from helping). Kept apart from the server so `whereabouts --help` can
 * show them without loading fastify.
 * @example SERVER_DEFAULTS.host // '127.0.0.1'
 */
export const SERVER_DEFAULTS = { host: '127.0.0.1', threads: Math.min(2, availableParallelism()), resultCache: 2000, bodyLimit: 64 * 1024, uploadLimit: 50 * 1024 * 1024, archiveExpandedLimit: 512 * 1024 * 1024, rateLimit: { max: 1200, timeWindowMs: 60_000 } } as const;
