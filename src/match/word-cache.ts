/**
 * A size-bounded, least-recently-used map of what lookups have read for query words (their stored
 * neighbours, see candidate-matcher.ts): words such as 'san', 'rio' or a recurring misspelling cost
 * no index seek after their first lookup. Bounded in estimated bytes, not in words, because one word's
 * neighbours range from none to thousands of stored tokens (two-edit neighbours at 13 M names): a
 * count of words said nothing of the memory held. The bound is the caller's (OpenOptions.wordCacheKiB);
 * the estimate is the caller's too (`bytesOf`), and a value larger than the whole bound is not kept.
 * Pure and answer-neutral: a value is what the index answers for its key, so a lookup reads the same
 * rows whether they come from here or from the index.
 * @example const cache = new WordCache<string[]>(1024, (words) => 16 * words.length); cache.keep('san', ['san']); cache.get('san') // ['san']
 */
export class WordCache<V> {
  /** In order of last use, the least recent first (a Map iterates in insertion order). */
  private readonly entries = new Map<string, { value: V; bytes: number }>();
  private held = 0;

  constructor(private readonly limitBytes: number, private readonly bytesOf: (value: V) => number) {}

  /** The value kept for `key`, now the most recently used, or undefined. */
  get(key: string): V | undefined {
    const entry = this.entries.get(key);
    if (entry === undefined) return undefined;
    this.entries.delete(key);
    this.entries.set(key, entry);
    return entry.value;
  }

  /**
   * Keeps `value` for `key` as the most recently used, measured afresh (a kept value that has grown
   * is kept again), and forgets the least recently used values beyond the bound.
   */
  keep(key: string, value: V): void {
    const previous = this.entries.get(key);
    if (previous !== undefined) {
      this.held -= previous.bytes;
      this.entries.delete(key);
    }
    const bytes = this.bytesOf(value) + 2 * key.length;
    if (bytes > this.limitBytes) return;
    this.entries.set(key, { value, bytes });
    this.held += bytes;
    for (const [oldest, entry] of this.entries) {
      if (this.held <= this.limitBytes) break;
      this.entries.delete(oldest);
      this.held -= entry.bytes;
    }
  }

  clear(): void {
    this.entries.clear();
    this.held = 0;
  }

  /** Estimated bytes held, never above the bound. */
  get bytes(): number {
    return this.held;
  }
}
