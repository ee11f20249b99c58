/**
 * The bounded map behind the matcher's cache of stored words (src/match/recent-map.ts): least
 * recently used dropped first, by generations (the "hashlru" scheme; common practice, no source).
 */
import { describe, expect, it } from 'vitest';
import { RecentMap } from '../../src/match/recent-map.ts';

describe('RecentMap', () => {
  it('holds at most its capacity, dropping the entries not used during the last generation', () => {
    const recent = new RecentMap<number, string>(4);
    recent.set(1, 'a');
    recent.set(2, 'b');
    // The first generation (two entries) is full: 3 starts the next; 1 read then is kept.
    recent.set(3, 'c');
    expect(recent.get(1)).toBe('a');
    recent.set(4, 'd');
    // 2 was not used since its generation ended: dropped whole with it.
    expect([recent.has(1), recent.has(2), recent.has(3), recent.get(4)]).toEqual([true, false, true, 'd']);
    for (let key = 10; key < 100; key++) recent.set(key, 'x');
    expect(recent.size).toBeLessThanOrEqual(4);
    recent.clear();
    expect(recent.size).toBe(0);
  });
});
