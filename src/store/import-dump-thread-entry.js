// Entry of the dump import's reading thread when run from the TypeScript sources (dist/ loads the compiled
// import-dump-thread.js): worker threads do not inherit the tsx loader of the main thread, so it is registered first.
import { register } from 'tsx/esm/api';

register();
await import('./import-dump-thread.ts');
