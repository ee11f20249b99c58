/**
 * The bounded map behind the matcher's cache of stored words (src/match/recent-map.ts): the
 * least-recently-used rule, reading counting as use (common practice, no source).
 */
import { describe, expect, it } from 'vitest';
import { RecentMap } from '../../src/match/recent-map.ts';

describe('RecentMap', () => {
  it('holds at most its capacity, dropping the entry least recently read or written', () => {
    const recent = new RecentMap<number, string>(2);
    recent.set(1, 'a');
    recent.set(2, 'b');
    expect(recent.get(1)).toBe('a');
    recent.set(3, 'c');
    expect([recent.has(1), recent.has(2), recent.has(3), recent.size]).toEqual([true, false, true, 2]);
    // Writing an entry again is a use too, and does not count twice.
    recent.set(1, 'A');
    recent.set(4, 'd');
    expect([recent.get(1), recent.has(3), recent.get(4), recent.size]).toEqual(['A', false, 'd', 2]);
    recent.clear();
    expect(recent.size).toBe(0);
  });
});
