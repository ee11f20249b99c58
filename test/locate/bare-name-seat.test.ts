/**
 * A text that is only one place name, found as a town that may be the seat of a municipality of its
 * name, is answered with the town's radius widened ([CHOICE] bareNameSeatMeters): where municipalities
 * tile the land and bear their seat's name, such a label often means the municipality. A small invented
 * gazetteer (demo island style, CC0) of towns of the island QV, imported from CSV into a real SQLite
 * file. The rule is common practice, no source; its width was measured on the real-record sets (docs/real-records.md).
 * What is checked is the rule's reach — only a bare name, only a town recorded in no
 * differently named county — and that the remarks cite it whenever it is used, as every default
 * extent must be stated (Chapman & Wieczorek 2020, Georeferencing Best Practices, §Documenting
 * Georeferences).
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { GazetteerStore } from '../../src/store/gazetteer-store.ts';
import { locate } from '../../src/locate/locate.ts';
import { METHOD_DEFAULTS } from '../../src/georef/method-defaults.ts';
import { openCsvStore } from '../support/csv-store.ts';

// Invented towns: Itacorá in no recorded county, Mirante the seat of its own county, Vila Alta in the county Serrano.
const directory = mkdtempSync(join(tmpdir(), 'whereabouts-bare-seat-'));
let store: GazetteerStore;

beforeAll(async () => {
  store = await openCsvStore(directory, ['id,name,latitude,longitude,featureType,countryCode,stateProvince,county',
    't1,Itacorá,-20.0,-50.0,town,QV,Poniente,',
    't2,Mirante,-21.0,-50.0,town,QV,Poniente,Mirante',
    't3,Vila Alta,-22.0,-50.0,town,QV,Poniente,Serrano'], 'towns');
});
afterAll(() => {
  store.close();
  rmSync(directory, { recursive: true, force: true });
});

const widened = (locality: string, options = {}) => locate(store, { locality, countryCode: 'QV', options }).georeference!;

describe('a bare name found as a town that may be its municipality\'s seat ([CHOICE] bareNameSeatMeters)', () => {
  it('widens the town\'s radius by the default, 40 km, and the remarks cite the choice', () => {
    expect(METHOD_DEFAULTS.bareNameSeatMeters).toBe(40000);
    const g = widened('Itacorá.');
    expect(g.components.unusedFeature).toBe(40000);
    expect(g.remarks.join('\n')).toMatch(/"Itacorá" is only a place name, found as the town Itacorá, which may be the seat of a municipality of that name: the radius widened by 40 km.*\[CHOICE bareNameSeatMeters/);
  });

  it('widens a town recorded as lying in a county of its own name', () => {
    expect(widened('Mirante').components.unusedFeature).toBe(40000);
  });

  it('keeps the town\'s radius for a town recorded in a county of another name, for a text with more than the name, and with the choice 0', () => {
    expect(widened('Vila Alta').components.unusedFeature).toBeUndefined();
    expect(widened('5 km N of Itacorá').components.unusedFeature).toBeUndefined();
    expect(widened('Itacorá', { bareNameSeatMeters: 0 }).components.unusedFeature).toBeUndefined();
    // The record's county Serrano is not a municipality of the town's name: answered with the town's radius.
    const inAnotherCounty = locate(store, { locality: 'Itacorá', countryCode: 'QV', county: 'Serrano' });
    expect(inAnotherCounty.georeference?.components.unusedFeature).toBeUndefined();
  });
});
