/**
 * One record's gazetteer questions asked once. `locate` asks the same question more than once for a
 * record: the stated province as the wall for a name and again as the unit that clips, and a clause's
 * name again when the plausibility stage georeferences that clause alone; a fuzzy lookup of a long
 * name the gazetteer lacks costs milliseconds. Pure: it lives for one `locate` call, in which the
 * gazetteer does not change, and hands every answer out as a copy (array, candidates, features), so
 * no caller sees what another did with its answer.
 */
import type { Candidate, CandidateFinder, CandidateLookup, CandidateQuery } from '../match/types.ts';

/**
 * A finder that answers a repeated query from memory.
 * @example const once = lookupsOnce(store); once.findCandidates(q); once.findCandidates(q) // the store is asked once
 */
export function lookupsOnce(finder: CandidateFinder): CandidateFinder {
  const found = new Map<string, Candidate[]>();
  const looked = new Map<string, CandidateLookup>();
  const once: CandidateFinder = {
    findCandidates: (query) => copyCandidates(remembered(found, query, () => finder.findCandidates(query))),
  };
  const { countryOutlines, lookupCandidates, nearestPlace, unitNames, unitFeatures } = finder;
  if (countryOutlines) once.countryOutlines = (code) => countryOutlines.call(finder, code);
  if (nearestPlace) once.nearestPlace = (query) => nearestPlace.call(finder, query);
  if (unitNames) once.unitNames = (level, key) => unitNames.call(finder, level, key);
  if (unitFeatures) once.unitFeatures = (level, key) => unitFeatures.call(finder, level, key);
  if (lookupCandidates) {
    once.lookupCandidates = (query) => {
      const lookup = remembered(looked, query, () => lookupCandidates.call(finder, query));
      return {
        candidates: copyCandidates(lookup.candidates),
        dropped: lookup.dropped.map((d) => ({ ...d, candidate: copyCandidate(d.candidate) })),
        notes: [...lookup.notes],
      };
    };
  }
  return once;
}

function remembered<T>(memory: Map<string, T>, query: CandidateQuery, ask: () => T): T {
  // A field set to undefined is kept apart from one left out: the key never joins two different questions.
  const key = JSON.stringify(query, (_, value: unknown) => (value === undefined ? '\u0000undefined' : value));
  if (!memory.has(key)) memory.set(key, ask());
  return memory.get(key)!;
}

function copyCandidates(candidates: Candidate[]): Candidate[] {
  return candidates.map(copyCandidate);
}

function copyCandidate(candidate: Candidate): Candidate {
  return { ...candidate, feature: { ...candidate.feature } };
}
