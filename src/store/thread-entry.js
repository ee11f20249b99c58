// Entry of a worker thread when run from the TypeScript sources (dist/ loads the compiled module itself,
// see start-thread.ts): worker threads do not inherit the tsx loader of the main thread, so it is
// registered first, then the thread's module (its URL the thread's first argument) is loaded.
import { register } from 'tsx/esm/api';

register();
await import(process.argv[2]);
