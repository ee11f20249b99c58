/**
 * Bounds on a lookup's work in src/match/candidate-matcher.ts, over small invented gazetteers held in
 * memory (test/support/memory-name-index.ts): each bound must leave the answer as reading everything
 * would give it. The bounds are ours (common practice, no source); what is checked is the rows the
 * index was asked for and the candidates returned.
 */
import { describe, expect, it } from 'vitest';
import { CandidateMatcher } from '../../src/match/candidate-matcher.ts';
import { oneEditQueryKeys, queryTokenKeys } from '../../src/match/edit-distance.ts';
import type { Feature } from '../../src/match/types.ts';
import { memoryNameIndex } from '../support/memory-name-index.ts';

const place = (sourceId: string, featureId: string, name: string, countryCode = 'QV', latitude = -45): Feature => ({
  sourceId, featureId, name, alternateNames: [], featureType: 'town', countryCode, stateProvince: null, county: null,
  latitude, longitude: -131 + Number(featureId.replace(/\D/g, '')) / 100, radiusMeters: 2000, radiusIsDefault: true, geometryType: 'Point',
});
/** `count` places called `name` in one source, spread apart (never the same place). */
const namesakes = (count: number, name: string, sourceId = 'atlas', countryOf = (_i: number) => 'QV') =>
  Array.from({ length: count }, (_, i) => place(sourceId, `${name}-${i}`, name, countryOf(i), -45 + i / 50));
const ids = (candidates: { feature: Feature }[]) => candidates.map((c) => c.feature.featureId);

describe('exact matches of a common name', () => {
  it('load only the first page of features when the lookup filters nothing and one source holds them', () => {
    const index = memoryNameIndex([...namesakes(450, 'Alba'), ...namesakes(3, 'Albar')]);
    const found = new CandidateMatcher(index).lookup({ name: 'Alba', context: {}, limit: 5 });
    expect(ids(found.candidates)).toEqual(['Alba-0', 'Alba-1', 'Alba-2', 'Alba-3', 'Alba-4']);
    expect(found.candidates.every((c) => c.why === 'exact name')).toBe(true);
    expect(index.rowsRead.features).toBeLessThanOrEqual(100);
    // The same first five as a lookup that reads every feature of the name.
    expect(ids(new CandidateMatcher(memoryNameIndex(namesakes(450, 'Alba'))).lookup({ name: 'Alba', context: {}, limit: 450 }).candidates).slice(0, 5))
      .toEqual(ids(found.candidates));
  });

  it('read every feature when a filter may drop some, and report the dropped ones', () => {
    const index = memoryNameIndex(namesakes(450, 'Alba', 'atlas', (i) => (i < 300 ? 'QW' : 'QV')));
    const found = new CandidateMatcher(index).lookup({ name: 'Alba', context: { countryCode: 'QV' }, limit: 5 });
    expect(ids(found.candidates)).toEqual(['Alba-300', 'Alba-301', 'Alba-302', 'Alba-303', 'Alba-304']);
    expect(found.dropped.length).toBe(50);
    expect(index.rowsRead.features).toBe(450);
  });

  it('read every feature when several sources may hold the same place (merged into one candidate)', () => {
    const atlas = namesakes(150, 'Alba');
    // The survey holds the atlas's first place again, 100 m away: merged into the first candidate.
    const survey = [{ ...place('survey', 's-1', 'Alba'), latitude: atlas[0].latitude + 0.0009, longitude: atlas[0].longitude }];
    const index = memoryNameIndex([...atlas, ...survey]);
    const found = new CandidateMatcher(index).lookup({ name: 'Alba', context: {}, limit: 5 });
    expect(found.candidates[0].feature.alsoIn?.map((other) => other.featureId)).toEqual(['s-1']);
    expect(index.rowsRead.features).toBe(151);
  });
});

describe('a lone word with typing errors', () => {
  it('reads its two-edit neighbours only when the names within one edit do not fill the pool', () => {
    // Twelve places one edit from 'moreno' fill the pool of ten: 'Marenu', two edits away, could only come after them.
    const crowded = memoryNameIndex([...namesakes(12, 'Morena'), ...namesakes(1, 'Marenu')]);
    const found = new CandidateMatcher(crowded).lookup({ name: 'Moreno', context: {}, limit: 5 });
    expect(found.candidates.map((c) => c.feature.name)).toEqual(Array(5).fill('Morena'));
    expect(crowded.rowsRead.deletionKeys).toBe(oneEditQueryKeys('moreno').length);
    // With two such places, the two-edit neighbour is read and listed after them.
    const sparse = memoryNameIndex([...namesakes(2, 'Morena'), ...namesakes(1, 'Marenu')]);
    const names = new CandidateMatcher(sparse).lookup({ name: 'Moreno', context: {}, limit: 5 }).candidates.map((c) => c.feature.name);
    expect(names).toEqual(['Morena', 'Morena', 'Marenu']);
    expect(sparse.rowsRead.deletionKeys).toBe(queryTokenKeys('moreno').length);
  });

  it('keeps between lookups what it read: a lookup needing more reads only the keys not read yet', () => {
    const index = memoryNameIndex([...namesakes(12, 'Morena'), ...namesakes(1, 'Marenu')]);
    const matcher = new CandidateMatcher(index);
    matcher.lookup({ name: 'Moreno', context: {}, limit: 5 });
    matcher.lookup({ name: 'Moreno', context: {}, limit: 5 });
    expect(index.rowsRead.deletionKeys).toBe(oneEditQueryKeys('moreno').length);
    // 'Moreno Altoz': no name comes within three edits, so the lookup is repeated with every word's
    // neighbours; 'moreno', a word of a longer name found within one edit ('morena'), is not read
    // within two ('altoz' has no keys beyond one edit).
    const repeated = memoryNameIndex([...namesakes(12, 'Morena'), ...namesakes(1, 'Marenu')]);
    new CandidateMatcher(repeated).lookup({ name: 'Moreno Altoz', context: {}, limit: 5 });
    expect(repeated.rowsRead.deletionKeys).toBe(oneEditQueryKeys('moreno').length + queryTokenKeys('altoz').length);
  });
});

describe('a lone word whose closest stored word is too common for the posting budget', () => {
  it('reads a few of the places named by that word alone, not all its postings', () => {
    // 850 places called 'Santiago' (more postings than a lookup reads), 'Santiago Alto' and two rare
    // words two edits from 'santigao'.
    const index = memoryNameIndex([...namesakes(850, 'Santiago'), ...namesakes(1, 'Santiago Alto'), ...namesakes(1, 'Santigma'), ...namesakes(1, 'Sanrigai')]);
    const found = new CandidateMatcher(index).lookup({ name: 'Santigao', context: {}, limit: 5 });
    expect(found.candidates[0].feature.name).toBe('Santiago');
    expect(found.candidates[0].why).toBe("1 edit from name 'Santiago'");
    expect(index.rowsRead.postings).toBeLessThan(10);
  });
});

describe('a name of two words, one too common for the posting budget', () => {
  it('finds the place whose other word is a farther neighbour through the rarer side, checked against the common word', () => {
    // 'marina' in 900 places (more postings than a lookup reads); 'cori' is stored as written, and its
    // neighbours one edit away fill the budget before 'corti', the word of the place meant.
    const index = memoryNameIndex([
      ...namesakes(900, 'Marina'), ...namesakes(3, 'Cori'), ...namesakes(250, 'Cora'), ...namesakes(250, 'Core'), ...namesakes(300, 'Corti'),
      ...namesakes(1, 'Marina Corti'),
    ]);
    const found = new CandidateMatcher(index).lookup({ name: 'Marina Cori', context: {}, limit: 5 });
    expect(found.candidates[0].feature.name).toBe('Marina Corti');
    // The common word's postings are never read whole: the rarer side is read and probed for it.
    expect(index.rowsRead.postings).toBeLessThan(900 + 800);
  });
});

describe('a name of several words with words too common for the posting budget', () => {
  it('checks the places its rarer word found for the common words, and reads no neighbour of a common word', () => {
    // 'vieja' and 'rosa' in more places than a probe reads (COMMON_TOKEN_LIMIT); 'dormida', one edit
    // from 'dbormida', names a hundred places before the one meant, 'Vieja Rosa Dormida'.
    const index = memoryNameIndex([
      ...namesakes(5001, 'Vieja'), ...namesakes(5001, 'Rosa'), ...namesakes(100, 'Dormida'), ...namesakes(1, 'Vieja Rosa Dormida'),
    ]);
    const found = new CandidateMatcher(index).lookup({ name: 'Vieja Rosa Dbormida', context: {}, limit: 5 });
    expect(found.candidates[0].feature.name).toBe('Vieja Rosa Dormida');
    // Only the misspelt word's keys within one edit: the common words are taken as written, and the
    // lookup is not repeated with farther neighbours.
    expect(index.rowsRead.deletionKeys).toBe(oneEditQueryKeys('dbormida').length);
    // The rarer word's postings, then one probe a place and common word.
    expect(index.rowsRead.postings).toBeLessThanOrEqual(101 + 2 * 101);
  });

  it('counts a partner word for the places found with the common word: the place holding both comes first', () => {
    // 'salto' is too common for the budget and the rarest unread word: its places are read with
    // those of 'santa' and 'castillo' (partners, more common than it) and of the rare 'castilho'.
    const index = memoryNameIndex([
      ...namesakes(900, 'Santa'), ...namesakes(820, 'Salto'), ...namesakes(830, 'Castillo'), ...namesakes(2, 'Salto Castilho'),
      ...namesakes(60, 'Castico'), ...namesakes(1, 'Santa Salto Castillo'),
    ]);
    const found = new CandidateMatcher(index).lookup({ name: 'Santa Salto Castilco', context: {}, limit: 5 });
    expect(found.candidates[0].feature.name).toBe('Santa Salto Castillo');
  });
});

describe('a lookup of exact names and readings only (nearSpellings off)', () => {
  it('reads no neighbour of a word and returns no near spelling', () => {
    const index = memoryNameIndex(namesakes(3, 'Morena'));
    const found = new CandidateMatcher(index).lookup({ name: 'Moreno', context: {}, nearSpellings: 'off' });
    expect(found.candidates).toEqual([]);
    expect(index.rowsRead.deletionKeys).toBe(0);
    expect(ids(new CandidateMatcher(index).lookup({ name: 'Morena', context: {}, nearSpellings: 'off' }).candidates)).toEqual(['Morena-0', 'Morena-1', 'Morena-2']);
  });
});
