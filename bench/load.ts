/**
 * npm run bench:load: 200 concurrent clients for 30 s on loopback against the demo gazetteer,
 * bounded in requests and time; throughput, p50 and p99 latency, and errors (target 0).
 */
import { describe, run, startService } from './server-harness.ts';

const CLIENTS = 200;
const MAX_SECONDS = 30;
const MAX_REQUESTS = 3_000_000;

const service = await startService();
try {
  const result = await run(service.url, CLIENTS, MAX_REQUESTS, MAX_SECONDS);
  console.log(`POST /api/v1/georeference, ${CLIENTS} concurrent clients for up to ${MAX_SECONDS} s on loopback`);
  console.log(describe(result));
  console.log(`errors target 0: ${result.errors === 0 ? 'met' : 'NOT met'}`);
  process.exitCode = result.errors === 0 ? 0 : 1;
} finally {
  await service.stop();
}
