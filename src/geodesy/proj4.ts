/**
 * proj4, loaded on first use. Loading it takes about 0.1 s, more than a whole `whereabouts locate` needs
 * otherwise, and only UTM grids and datum shifts call it (measured with `npm run bench:cli`).
 * @example proj4()('+proj=utm +zone=18 +ellps=WGS84', '+proj=longlat +ellps=WGS84', [500000, 4649776]) // ≈ [-75, 42]
 */
import { createRequire } from 'node:module';
import type proj4Module from 'proj4';

const require = createRequire(import.meta.url);
let loaded: typeof proj4Module | undefined;

export function proj4(): typeof proj4Module {
  loaded ??= require('proj4') as typeof proj4Module;
  return loaded;
}
