/**
 * Starts one of this folder's worker-thread modules, from the compiled module (dist/) or, run from the
 * TypeScript sources, through thread-entry.js, which registers tsx first (worker threads do not inherit
 * the main thread's loader).
 * @example const thread = startThread('import-dump-thread', { workerData });
 */
import { Worker, type WorkerOptions } from 'node:worker_threads';

export function startThread(name: string, options: WorkerOptions): Worker {
  const fromSources = import.meta.url.endsWith('.ts');
  const module = new URL(`./${name}.${fromSources ? 'ts' : 'js'}`, import.meta.url);
  return fromSources ? new Worker(new URL('./thread-entry.js', import.meta.url), { ...options, argv: [module.href] }) : new Worker(module, options);
}
