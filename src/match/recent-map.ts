/**
 * A map that keeps at most `capacity` entries, dropping those least recently used, in two generations
 * of capacity / 2 (the "hashlru" scheme: writes fill the current generation; when it is full it
 * becomes the previous one and the old previous is dropped whole; a read of a previous entry copies
 * it into the current one). Every operation is a few Map operations: a strict order of use kept by
 * deleting and re-adding on each read costs V8 a scan over the deleted slots at every eviction.
 * @example const recent = new RecentMap<number, string>(4); recent.set(1, 'a'); recent.get(1) // 'a'
 */
export class RecentMap<K, V> {
  private current = new Map<K, V>();
  private previous = new Map<K, V>();
  private readonly generation: number;

  constructor(capacity: number) {
    this.generation = Math.max(1, Math.floor(capacity / 2));
  }

  /** Entries held (a key may be counted in both generations). */
  get size(): number {
    return this.current.size + this.previous.size;
  }

  has(key: K): boolean {
    return this.current.has(key) || this.previous.has(key);
  }

  /** The value, now counted as recently used; undefined when not held. */
  get(key: K): V | undefined {
    const value = this.current.get(key);
    if (value !== undefined) return value;
    const older = this.previous.get(key);
    if (older !== undefined) this.set(key, older);
    return older;
  }

  set(key: K, value: V): void {
    if (!this.current.has(key) && this.current.size >= this.generation) {
      this.previous = this.current;
      this.current = new Map();
    }
    this.current.set(key, value);
  }

  clear(): void {
    this.current.clear();
    this.previous.clear();
  }
}
