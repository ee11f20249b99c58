/**
 * The whereabouts HTTP service: the georeference API, the map's data, batch review, and the page.
 * Safe by default: loopback only unless a token protects it, strict security headers, no CORS unless
 * configured, bounded bodies and uploads, a per-client rate limit, and schemas on every route.
 */
import cors from '@fastify/cors';
import helmet from '@fastify/helmet';
import rateLimit from '@fastify/rate-limit';
import swagger from '@fastify/swagger';
import { resolve } from 'node:path';
import type { TypeBoxTypeProvider } from '@fastify/type-provider-typebox';
import Fastify, { type FastifyInstance } from 'fastify';
import { openGazetteer } from '../store/gazetteer-store.ts';
import type { LocateResult } from '../locate/locate.ts';
import { VERSION } from '../version.ts';
import { assertSafeBind, tokenGuard } from './access.ts';
import { loadAssets, registerAssets } from './assets.ts';
import { errorHandler } from './errors.ts';
import { registerStrictJson } from './json-body.ts';
import { RecordPool } from './record-pool.ts';
import { ResultCache } from './result-cache.ts';
import { SERVER_DEFAULTS } from './defaults.ts';
import { BatchService } from './batches.ts';
import { openReviews } from '../store/reviews.ts';
import { reviewsDatabasePath } from '../store/side-files.ts';
import type { ServedGazetteer } from './lookup.ts';
import { batchRoutes } from './routes/batches.ts';
import { datumsRoutes } from './routes/datums.ts';
import { featureRoutes } from './routes/features.ts';
import { georeferenceRoutes } from './routes/georeference.ts';
import { layersRoutes, type LayerSource } from './routes/layers.ts';
import { loginRoutes } from './routes/login.ts';
import { methodRoutes } from './routes/method.ts';
import { recordsRoutes } from './routes/records.ts';
import { shapedFeatureLister } from './shaped-features.ts';

export interface ServerOptions extends AppOptions {
  /** The SQLite database holding the gazetteer (opened read-only by the service). */
  dbPath: string;
  /** Worker threads that compute the georeference routes' answers (default one a core, at most 2); 0 computes them in the main thread. */
  threads?: number;
}

/** The service's settings, apart from where its files are. */
export interface AppOptions {
  /** Access token; required when `host` is not a loopback address. */
  token?: string;
  /** The address the caller will listen on (default 127.0.0.1); checked here, bound by the caller. */
  host?: string;
  /** An origin allowed to call the API from another site (CORS); none by default. */
  corsOrigin?: string;
  /** Requests per client per window, or false for none (default 1200 a minute). */
  rateLimit?: { max: number; timeWindowMs: number } | false;
  /** Largest JSON body in bytes (default 64 KiB). */
  bodyLimit?: number;
  /** Largest batch upload in bytes (default 50 MiB). */
  uploadLimit?: number;
  /** Largest sum of an uploaded Darwin Core Archive's files uncompressed, in bytes (default 512 MiB). */
  archiveExpandedLimit?: number;
  /** Results kept in memory for repeated lookups (default 2000; 0 keeps none). */
  resultCache?: number;
  /** Log requests as JSON lines on stdout (default off). */
  logger?: boolean;
}


/** The opened stores the routes work on, injected into them as plugin options. */
export interface ServedStores {
  gazetteer: ServedGazetteer;
  /** The gazetteer's polygons and lines, for the map's layers. */
  layers: LayerSource;
  /** Batch upload and review; without it the batch routes are not offered. */
  batches?: BatchService;
  /** Results kept for repeated lookups. */
  results?: ResultCache<LocateResult>;
  /** Worker threads that compute the georeference routes' answers; without them the main thread does. */
  pool?: RecordPool;
}

/**
 * Builds the service (not yet listening) on the files beside `dbPath`: the gazetteer (read-only), the
 * reviews and the batch jobs, closed again when the service closes. Refuses a non-loopback host
 * without a token.
 * @example
 *   const app = await buildServer({ dbPath: 'whereabouts.sqlite' });
 *   await app.listen({ host: '127.0.0.1', port: 8737 });
 */
export async function buildServer(options: ServerOptions): Promise<FastifyInstance> {
  assertSafeBind(options.host ?? SERVER_DEFAULTS.host, options.token);
  // Resolved once: every file beside the gazetteer (jobs, reviews, batch outputs) is named from this absolute path.
  const dbPath = resolve(options.dbPath);
  const store = openGazetteer(dbPath, { readonly: true });
  const reviews = openReviews(reviewsDatabasePath(dbPath));
  const results = new ResultCache<LocateResult>(options.resultCache ?? SERVER_DEFAULTS.resultCache);
  const batches = new BatchService(dbPath, store, reviews, results, options.archiveExpandedLimit);
  await batches.resumeUnfinished();
  const threads = options.threads ?? SERVER_DEFAULTS.threads;
  const pool = threads > 0 ? new RecordPool(dbPath, threads) : undefined;
  const app = await buildApp({ gazetteer: store, layers: shapedFeatureLister(dbPath, store), batches, results, pool }, options).catch(async (error: unknown) => {
    await pool?.close();
    throw error;
  });
  // On close (SIGTERM) requests in flight finish first; running jobs have committed their steps and resume on the next start.
  app.addHook('onClose', async () => {
    if (batches.runningJobs().length) app.log.info({ jobs: batches.runningJobs() }, 'batch jobs stopped at their last committed step');
    await pool?.close();
    reviews.close();
    store.close();
  });
  return app;
}

/**
 * Builds the service on stores the caller has opened (and closes). Refuses a non-loopback host without a token.
 * @example const app = await buildApp({ gazetteer: store, layers: { shapedFeatures: () => [], sources: () => [] } }, {});
 */
export async function buildApp(stores: ServedStores, options: AppOptions): Promise<FastifyInstance> {
  const host = options.host ?? SERVER_DEFAULTS.host;
  assertSafeBind(host, options.token);
  const bodyLimit = options.bodyLimit ?? SERVER_DEFAULTS.bodyLimit;
  const app = Fastify({
    logger: options.logger ?? false,
    bodyLimit,
    // Types are checked, never coerced; unknown fields are refused, never dropped in silence.
    ajv: { customOptions: { coerceTypes: false, removeAdditional: false, allErrors: false } },
    forceCloseConnections: 'idle',
  }).withTypeProvider<TypeBoxTypeProvider>();
  app.setErrorHandler(errorHandler(bodyLimit));
  app.setNotFoundHandler((request, reply) => reply.code(404).send({ statusCode: 404, error: 'Not Found', message: `nothing at ${request.method} ${request.url.split('?')[0].slice(0, 200)}` }));
  registerStrictJson(app);

  await app.register(helmet, {
    contentSecurityPolicy: {
      useDefaults: false,
      directives: {
        defaultSrc: ["'self'"],
        scriptSrc: ["'self'"],
        styleSrc: ["'self'"],
        imgSrc: ["'self'", 'data:', 'blob:'],
        connectSrc: ["'self'"],
        fontSrc: ["'self'"],
        objectSrc: ["'none'"],
        baseUri: ["'none'"],
        formAction: ["'self'"],
        frameAncestors: ["'none'"],
      },
    },
    // Served over plain HTTP on a workstation: HSTS would be ignored, and a TLS proxy sets its own.
    strictTransportSecurity: false,
  });
  if (options.corsOrigin) await app.register(cors, { origin: options.corsOrigin, methods: ['GET', 'POST', 'PUT'] });
  const limit = options.rateLimit ?? SERVER_DEFAULTS.rateLimit;
  if (limit) {
    await app.register(rateLimit, {
      max: limit.max,
      timeWindow: limit.timeWindowMs,
      errorResponseBuilder: (_request, context) => ({
        statusCode: 429,
        error: 'Too Many Requests',
        message: `more than ${context.max} requests in ${Math.round(limit.timeWindowMs / 1000)} s from this client: try again in ${Math.ceil(context.ttl / 1000)} s`,
      }),
    });
  }
  if (options.token) app.addHook('onRequest', tokenGuard(options.token));

  await app.register(swagger, {
    openapi: {
      openapi: '3.0.3',
      info: { title: 'whereabouts', version: VERSION, description: 'Georeference locality text against your own gazetteer with the point-radius method.' },
      components: { securitySchemes: { token: { type: 'http', scheme: 'bearer' } } },
      ...(options.token ? { security: [{ token: [] }] } : {}),
    },
  });

  await app.register(georeferenceRoutes, { gazetteer: stores.gazetteer, results: stores.results, pool: stores.pool });
  await app.register(recordsRoutes, { gazetteer: stores.gazetteer, results: stores.results, pool: stores.pool });
  await app.register(featureRoutes, { gazetteer: stores.gazetteer });
  await app.register(datumsRoutes);
  await app.register(layersRoutes, { layers: stores.layers });
  await app.register(methodRoutes);
  if (stores.batches) await app.register(batchRoutes, { batches: stores.batches, uploadLimit: options.uploadLimit ?? SERVER_DEFAULTS.uploadLimit });
  if (options.token) await app.register(loginRoutes, { token: options.token });
  app.get('/api/v1/openapi.json', { schema: { hide: true } }, async () => app.swagger());
  registerAssets(app, loadAssets());
  return app;
}
