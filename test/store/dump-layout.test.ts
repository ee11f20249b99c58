/**
 * Import of the world-gazetteer dump layout (19 tab-separated columns, no header) with its admin1
 * companion file, from fixtures (invented places): malformed rows rejected with row number and reason,
 * the rest imported. Expected output beside the input: test/fixtures/gazetteer/malformed-dump.expected.json
 * (UPDATE_FIXTURES=1 writes malformed-dump.expected.new.json beside it for a person to review and move over it).
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { dumpFeatureType, readAdminCodeLine } from '../../src/store/dump-layout.ts';
import { expectedFixture } from '../support/expected-fixture.ts';
import { importGazetteer } from '../../src/store/import.ts';
import { openGazetteer } from '../../src/store/gazetteer-store.ts';

const FIXTURES = new URL('../fixtures/gazetteer/', import.meta.url).pathname;
const directory = mkdtempSync(join(tmpdir(), 'whereabouts-dump-'));
afterAll(() => rmSync(directory, { recursive: true, force: true }));

describe('dump layout import', () => {
  it('rejects malformed rows with their row numbers and reasons and imports the rest', async () => {
    const store = openGazetteer(join(directory, 'dump.sqlite'));
    const summary = await importGazetteer(store, join(FIXTURES, 'malformed-dump.txt'), {
      format: 'geonames', citation: 'fixture dump', adminCodesFile: join(FIXTURES, 'admin1-codes.txt'),
    });
    const actual = { rowsRead: summary.rowsRead, imported: summary.imported, rejected: summary.rejected };
    const expectedPath = join(FIXTURES, 'malformed-dump.expected.json');
    expect(actual).toEqual(expectedFixture(expectedPath, actual, 2));

    // The admin1 code 01 of QX is named through the companion file; accents fold away in lookups.
    const [last] = store.findCandidates({ name: 'Ultima Buena', context: { countryCode: 'QX', stateProvince: 'Nortena' } });
    expect(last.feature).toMatchObject({ featureId: '8', stateProvince: 'Norteña', featureType: 'village', radiusIsDefault: true });
    store.close();
  });

  it('maps feature codes to whereabouts feature types, populated places by population', () => {
    expect(dumpFeatureType('P', 'PPLC', 0)).toBe('city');
    expect(dumpFeatureType('P', 'PPL', 250_000)).toBe('city');
    expect(dumpFeatureType('P', 'PPL', 8_000)).toBe('town');
    expect(dumpFeatureType('P', 'PPL', 300)).toBe('village');
    expect(dumpFeatureType('P', 'PPL', 0)).toBe('town');
    expect(dumpFeatureType('H', 'STMM', 0)).toBe('river mouth');
    expect(dumpFeatureType('A', 'ADM2', 0)).toBe('county');
    expect(dumpFeatureType('V', 'FRST', 0)).toBe('forest');
    // A code not listed takes the type of its class; an unknown class none.
    expect(dumpFeatureType('U', 'SMU', 0)).toBe('undersea feature');
    expect(dumpFeatureType('Z', 'ZZZ', 0)).toBeNull();
  });

  it('reads admin1 companion lines and skips others', () => {
    expect(readAdminCodeLine('QX.01\tNorteña\tNortena\t900001')).toEqual({ code: 'QX.01', level: 1, name: 'Norteña', asciiName: 'Nortena', featureId: '900001' });
    expect(readAdminCodeLine('# comment')).toBeNull();
  });
});
