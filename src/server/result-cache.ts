/**
 * Recently computed results, by request, for repeated lookups (the page re-asks the same record for
 * every edit; a review re-opens records). Least recently used entries go first. The key includes the
 * loaded sources' content hashes, so a gazetteer imported while serving never returns stale results.
 */
export class ResultCache<T> {
  private readonly entries = new Map<string, T>();

  /** `capacity` 0 keeps nothing. */
  constructor(private readonly capacity: number) {}

  /** Whether a value for `key` is kept (without making it the most recently used). */
  has(key: string): boolean {
    return this.entries.has(key);
  }

  /** The cached value for `key`, or `compute()`'s, kept for next time. */
  get(key: string, compute: () => T): T {
    const hit = this.entries.get(key);
    if (hit !== undefined) {
      this.entries.delete(key);
      this.entries.set(key, hit);
      return hit;
    }
    const value = compute();
    if (this.capacity > 0) {
      this.entries.set(key, value);
      if (this.entries.size > this.capacity) this.entries.delete(this.entries.keys().next().value as string);
    }
    return value;
  }
}
