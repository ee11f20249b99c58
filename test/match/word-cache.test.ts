/**
 * The bound of src/match/word-cache.ts: least recently used values forgotten first, never more bytes
 * held than the bound (least-recently-used eviction, common practice, no source).
 */
import { describe, expect, it } from 'vitest';
import { WordCache } from '../../src/match/word-cache.ts';

/** 10 bytes a word held, plus 2 a letter of its key (see WordCache.keep). */
const cache = (limit: number) => new WordCache<string[]>(limit, (words) => 10 * words.length);

describe('WordCache', () => {
  it('forgets the least recently used word first, and holds no more than its bound', () => {
    const kept = cache(60);
    kept.keep('aa', ['a', 'b']); // 24 bytes
    kept.keep('bb', ['c']); // 14
    expect(kept.get('aa')).toEqual(['a', 'b']); // 'aa' now the most recent
    kept.keep('cc', ['d', 'e']); // 24: 62 in all, 'bb' forgotten
    expect(kept.get('bb')).toBeUndefined();
    expect(kept.get('aa')).toEqual(['a', 'b']);
    expect(kept.bytes).toBe(48);
  });

  it('measures a kept value again when it has grown, and keeps none larger than the bound', () => {
    const kept = cache(40);
    const words = ['a'];
    kept.keep('aa', words);
    words.push('b', 'c');
    kept.keep('aa', words);
    expect(kept.bytes).toBe(34);
    words.push('d');
    kept.keep('aa', words);
    expect(kept.get('aa')).toBeUndefined();
    expect(kept.bytes).toBe(0);
    expect(new WordCache<string[]>(0, () => 0).get('x')).toBeUndefined();
  });
});
