/**
 * A map that keeps at most `capacity` entries, dropping the least recently read or written one when
 * full (least-recently-used eviction over a Map's insertion order: a read moves its entry to the end).
 * @example const recent = new RecentMap<number, string>(2); recent.set(1, 'a'); recent.set(2, 'b'); recent.get(1); recent.set(3, 'c'); recent.has(2) // false
 */
export class RecentMap<K, V> {
  private readonly entries = new Map<K, V>();

  constructor(readonly capacity: number) {}

  get size(): number {
    return this.entries.size;
  }

  has(key: K): boolean {
    return this.entries.has(key);
  }

  /** The value, now the most recently used; undefined when not held. */
  get(key: K): V | undefined {
    const value = this.entries.get(key);
    if (value !== undefined) {
      this.entries.delete(key);
      this.entries.set(key, value);
    }
    return value;
  }

  set(key: K, value: V): void {
    this.entries.delete(key);
    if (this.entries.size >= this.capacity) this.entries.delete(this.entries.keys().next().value as K);
    this.entries.set(key, value);
  }

  clear(): void {
    this.entries.clear();
  }
}
