import { createRequire } from 'node:module';

/** whereabouts' version, from package.json: cited in georeferenceProtocol so a result can be reproduced. */
export const VERSION: string = (createRequire(import.meta.url)('../package.json') as { version: string }).version;
