/**
 * Coordinates written in a locality text beside a named place: read as written (a typewritten double prime
 * as minutes, [CHOICE typewriterMinutes], common practice, no source), never taken as a place's name, and
 * checked against the place the text names. Chapman & Wieczorek 2020, Georeferencing Best Practices,
 * §Georeferencing Workflow – Localities: the parts of a locality must agree, and where they do not the record
 * needs a person. A small invented gazetteer (demo island style, CC0): one town, imported from CSV into a
 * real SQLite file. Distances by hand: 54° N 150° W lies some 13,000 km from 20° S 50° W, far beyond any radius.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { GazetteerStore } from '../../src/store/gazetteer-store.ts';
import { locate } from '../../src/locate/locate.ts';
import { openCsvStore } from '../support/csv-store.ts';

const directory = mkdtempSync(join(tmpdir(), 'whereabouts-written-coordinates-'));
let store: GazetteerStore;

beforeAll(async () => {
  store = await openCsvStore(directory, ['id,name,latitude,longitude,featureType,countryCode,stateProvince', 't1,Alisos,-20,-50,town,QV,Poniente'], 'towns');
});
afterAll(() => {
  store.close();
  rmSync(directory, { recursive: true, force: true });
});

describe('coordinates written beside a named place', () => {
  it('far from the place: the clauses disagree, so no georeference is given', () => {
    const result = locate(store, { locality: 'Alisos. Lat. 54° 15" N. Long. 150° 20" W.', countryCode: 'QV' });
    expect(result.interpretation.type).toBe('coordinates');
    expect(result.interpretation.coordinates).toMatchObject({ latitude: 54.25, format: 'degrees-minutes' });
    expect(result.status).not.toBe('georeferenced');
    expect(result.reason).toContain('the clauses disagree');
  });

  it('near the place: answered from the coordinates, the typewriter reading noted', () => {
    // 20° 01′ S 50° 02′ W is about 4 km from the town at 20° S 50° W (one minute of arc is about 1.85 km).
    const result = locate(store, { locality: 'Alisos. Lat. 20° 01" S. Long. 50° 02" W.', countryCode: 'QV' });
    expect(result.status).toBe('georeferenced');
    expect(result.georeference!.latitude).toBeCloseTo(-20 - 1 / 60, 6);
    expect(result.georeference!.longitude).toBeCloseTo(-50 - 2 / 60, 6);
    expect(result.interpretation.notes.join('\n')).toContain('[CHOICE typewriterMinutes: common practice, no source]');
  });

  it('written but not readable: declined, and the town is not answered in their place', () => {
    const result = locate(store, { locality: 'Alisos. Lat. 20° 1/2 S, Long. illegible', countryCode: 'QV' });
    expect(result.status).toBe('unparseable');
    expect(result.georeference).toBeUndefined();
    expect(result.reason).toContain('coordinates written but not readable');
  });

  it('beside a place the gazetteer lacks: the coordinates are not widened for it', () => {
    // A missing lake would widen a town's answer by unusedFeatureMeters (120 km); written coordinates already
    // say where the specimen was taken, so the radius is the coordinates' own (one minute of arc: a few km).
    const result = locate(store, { locality: 'Laguna Escondida. Lat. 20° 01\' S. Long. 50° 02\' W.', countryCode: 'QV' });
    expect(result.status).toBe('georeferenced');
    expect(result.georeference!.components.unusedFeature).toBeUndefined();
    expect(result.georeference!.uncertaintyMeters).toBeLessThan(5000);
    expect(result.interpretation.notes.join('\n')).toContain('the written coordinates');
  });
});
