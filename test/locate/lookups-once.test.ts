/**
 * lookupsOnce: one record's repeated gazetteer questions answered from memory, each answer a copy.
 * Checked against the real demo store (what the store itself answers), not against the memo's own output.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { CandidateQuery } from '../../src/match/types.ts';
import type { GazetteerStore } from '../../src/store/gazetteer-store.ts';
import { lookupsOnce } from '../../src/locate/lookups-once.ts';
import { openDemoStore } from '../support/demo-store.ts';

let store: GazetteerStore;

beforeAll(async () => {
  store = await openDemoStore('whereabouts-lookups-once-');
});
afterAll(() => store.close());

const poniente: CandidateQuery = { name: 'Poniente', context: { countryCode: 'QV' }, featureTypes: ['stateProvince'], withGeometry: true };

describe('lookupsOnce', () => {
  it('asks the store once for a repeated query and answers as the store does', () => {
    let asked = 0;
    const counting = { findCandidates: (q: CandidateQuery) => (asked++, store.findCandidates(q)) };
    const once = lookupsOnce(counting);
    const first = once.findCandidates(poniente);
    const second = once.findCandidates(poniente);
    expect(asked).toBe(1);
    expect(first).toEqual(store.findCandidates(poniente));
    expect(second).toEqual(first);
  });

  it('hands out copies: what one caller changes, the next does not see', () => {
    const once = lookupsOnce(store);
    const first = once.findCandidates(poniente);
    first[0]!.feature.name = 'changed';
    first.pop();
    expect(once.findCandidates(poniente)).toEqual(store.findCandidates(poniente));
  });

  it('keeps a field set to undefined apart from one left out', () => {
    let asked = 0;
    const once = lookupsOnce({ findCandidates: (q) => (asked++, store.findCandidates(q)) });
    once.findCandidates({ name: 'Millbrook', context: {} });
    once.findCandidates({ name: 'Millbrook', context: { county: undefined } });
    expect(asked).toBe(2);
  });

  it('offers lookupCandidates and countryOutlines only where the finder has them', () => {
    expect(lookupsOnce({ findCandidates: () => [] }).lookupCandidates).toBeUndefined();
    const once = lookupsOnce(store);
    const query: CandidateQuery = { name: 'Millbrook', context: { countryCode: 'QV', county: 'Haut-Levant' } };
    expect(once.lookupCandidates!(query)).toEqual(store.lookupCandidates(query));
    expect(once.countryOutlines!('QV')).toEqual(store.countryOutlines!('QV'));
  });
});
