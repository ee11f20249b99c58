/**
 * The front door, `georeferenceRecord`, over the real store (the demo gazetteer imported into a
 * temporary SQLite file): the georeferencer's edits are applied inside the pipeline, so a record keeps
 * its bounding unit and its clip once edited. Expected behaviour from the method: a heading alone is
 * georeferenced only within a bounding unit, and the footprint is the circle clipped to the stated
 * administrative unit (Chapman & Wieczorek 2020, Georeferencing Best Practices §3.4.6 and §3.4.1,
 * section numbers from memory); areas by turf (geodesic polygon area, @turf/area), an outside reference.
 */
import { area, circle } from '@turf/turf';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { GazetteerStore } from '../../src/store/gazetteer-store.ts';
import { EditRefused } from '../../src/locate/edits.ts';
import { georeferenceRecord, type RecordRequest } from '../../src/locate/georeference-record.ts';
import { footprintGeometry } from '../../src/output/footprint-geometry.ts';
import type { RecordContext } from '../../src/record/darwin-core.ts';
import { openDemoStore } from '../support/demo-store.ts';

let store: GazetteerStore;
let attribution: RecordContext;

beforeAll(async () => {
  store = await openDemoStore('whereabouts-front-door-');
  attribution = { georeferencedBy: 'a tester', georeferencedDate: '2026-12-01T12:00:00Z', sources: store.sources() };
});
afterAll(() => store.close());

const record = (locality: string, more: Partial<RecordRequest> = {}): RecordRequest => ({ locality, countryCode: 'QV', stateProvince: 'Poniente', attribution, ...more });
const usedIds = (answer: ReturnType<typeof georeferenceRecord>) => answer.result.georeference?.features.map((f) => f.featureId);
const PUERTO_LINDO = { sourceId: 'demo', featureId: 'qv-0013' };
const PONIENTE = 'qv-0002';

describe('georeferenceRecord', () => {
  it('keeps the bounded answer of a heading-only record with a state once a candidate is picked', () => {
    const first = georeferenceRecord(store, record('N of Puerto Lindo'));
    expect(first.result.status).toBe('georeferenced');
    expect(usedIds(first)).toContain(PONIENTE);
    const edited = georeferenceRecord(store, record('N of Puerto Lindo', { edits: { chosenFeatures: [PUERTO_LINDO] } }));
    // The edit picks the feature the matcher picked, so the answer is the same: still bounded by Poniente.
    expect(edited.result.status).toBe('georeferenced');
    expect(usedIds(edited)).toEqual(usedIds(first));
    expect(edited.result.georeference!.footprintWKT).toBe(first.result.georeference!.footprintWKT);
    expect(edited.darwinCore.georeferenceRemarks).toMatch(/feature chosen by the georeferencer: Puerto Lindo \(demo:qv-0013\)/);
  });

  it('keeps the clip to the stated province when an offset is given another distance precision', () => {
    const first = georeferenceRecord(store, record('5 km N of Puerto Lindo'));
    const edited = georeferenceRecord(store, record('5 km N of Puerto Lindo', { edits: { chosenFeatures: [PUERTO_LINDO], distancePrecision: 4 } }));
    for (const answer of [first, edited]) {
      const g = answer.result.georeference!;
      expect(usedIds(answer)).toContain(PONIENTE);
      // Clipped: the footprint covers clearly less than the whole circle of the same center and radius.
      const whole = area(circle([g.longitude, g.latitude], g.uncertaintyMeters / 1000, { steps: 256 }));
      expect(area(footprintGeometry(g.footprintWKT)!)).toBeLessThan(0.9 * whole);
    }
    // Method §5.2 with δ = 4 / 2 km: a larger radius than the default precision's.
    expect(edited.result.georeference!.uncertaintyMeters).toBeGreaterThan(first.result.georeference!.uncertaintyMeters);
    expect(area(footprintGeometry(edited.result.georeference!.footprintWKT)!)).toBeGreaterThan(area(footprintGeometry(first.result.georeference!.footprintWKT)!));
  });

  it('takes a chosen feature for each name of the text, not just one', () => {
    const request = { locality: 'between Santa Rosa and Puerto Lindo', countryCode: 'QV', attribution };
    expect(georeferenceRecord(store, request).result.status).toBe('ambiguous');
    const town = georeferenceRecord(store, { ...request, edits: { chosenFeatures: [{ name: 'Santa Rosa', sourceId: 'demo', featureId: 'qv-0015' }] } });
    const village = georeferenceRecord(store, { ...request, edits: { chosenFeatures: [{ name: 'Santa Rosa', sourceId: 'demo', featureId: 'qv-0053' }, { name: 'Puerto Lindo', ...PUERTO_LINDO }] } });
    expect(town.result.status).toBe('georeferenced');
    expect(usedIds(town)).toEqual(expect.arrayContaining(['qv-0015', 'qv-0013']));
    expect(usedIds(village)).toEqual(expect.arrayContaining(['qv-0053', 'qv-0013']));
  });

  it('refuses an edit that does not fit the record, saying which', () => {
    expect(() => georeferenceRecord(store, record('Puerto Lindo', { edits: { chosenFeatures: [{ sourceId: 'demo', featureId: 'qv-0053' }] } }))).toThrow(EditRefused);
    expect(() => georeferenceRecord(store, record('between Santa Rosa and Puerto Lindo', { edits: { chosenFeatures: [{ name: 'Alba', ...PUERTO_LINDO }] } }))).toThrow(/"Alba" is not a name of this locality/);
  });

  it("checks the record's own coordinates: a distance for the API, flags for the batch", () => {
    const answer = georeferenceRecord(store, record('Puerto Lindo', { decimalLatitude: '45.226495', decimalLongitude: '-131.3876' }));
    // The record's latitude has the wrong sign: it lies far outside the circle and fits once flipped (README, coordinate flags).
    expect(answer.coordinateCheck!.flags).toEqual(['outside-locality-circle', 'fits-if-latitude-sign-flipped']);
    expect(answer.coordinateCheck!.recordPoint!.withinUncertainty).toBe(false);
    const near = georeferenceRecord(store, record('Puerto Lindo', { decimalLatitude: -45.226495, decimalLongitude: -131.3876 }));
    expect(near.coordinateCheck!.flags).toEqual(['agrees-with-locality']);
    expect(near.coordinateCheck!.recordPoint!.distanceMeters).toBeLessThan(1);
  });
});
