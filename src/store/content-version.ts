/**
 * What a store connection reads once and keeps between lookups (the matcher's word cache, a level's unit
 * names, country outlines) holds only while the file's content stays as it was read. Two things change
 * it: another connection's commit, which moves SQLite's `PRAGMA data_version` for this connection (also
 * seen inside a read transaction begun after that commit), and this connection's own writes, which do
 * not move it, so the store says so (`changed`) around its imports and removals.
 */

/**
 * A number that differs whenever the file's content may have changed for this connection.
 * @example const content = new ContentVersion(() => db.pragma('data_version', { simple: true }) as number);
 *   const v = content.current(); content.changed(); content.current() !== v // true
 */
export class ContentVersion {
  private dataVersionSeen: number | undefined;
  private generation = 0;

  constructor(private readonly dataVersion: () => number) {}

  /** The content version now: asks the file whether another connection has committed. */
  current(): number {
    const dataVersion = this.dataVersion();
    if (dataVersion !== this.dataVersionSeen) {
      this.dataVersionSeen = dataVersion;
      this.generation++;
    }
    return this.generation;
  }

  /** This connection has written (or is about to): what was read before no longer holds. */
  changed(): void {
    this.generation++;
  }
}

/**
 * Values read for keys, kept while the content version stays and all forgotten when it changes. Each
 * value is handed to every caller as it is, so callers must not change it (the store freezes what it keeps).
 * @example const outlines = new KeptWhileUnchanged<string, Feature[]>(content); outlines.get('QX', () => readOutlines('QX'))
 */
export class KeptWhileUnchanged<K, V> {
  private readonly values = new Map<K, V>();
  private version = -1;

  constructor(private readonly content: ContentVersion) {}

  /** The value kept for `key`, or `read()`'s, kept, when none is kept or the content has changed since. */
  get(key: K, read: () => V): V {
    const version = this.content.current();
    if (version !== this.version) {
      this.values.clear();
      this.version = version;
    }
    let value = this.values.get(key);
    if (value === undefined) {
      value = read();
      this.values.set(key, value);
    }
    return value;
  }
}
