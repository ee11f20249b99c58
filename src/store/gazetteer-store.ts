/**
 * The gazetteer store: one SQLite file (better-sqlite3, WAL, prepared statements only) holding every
 * imported source, its features, the folded-name index and the deletion-neighbourhood token index that
 * fuzzy lookups use instead of scanning (see src/match/edit-distance.ts). The store answers the
 * index's questions (NameIndex); src/match/candidate-matcher.ts ranks the answers.
 */
import Database from 'better-sqlite3';
import type { Geometry } from 'geojson';
import { CandidateMatcher, WORD_CACHE_BYTES } from '../match/candidate-matcher.ts';
import { storedTokenKeys } from '../match/edit-distance.ts';
import { administrativeKey } from '../match/context.ts';
import { ContentVersion, KeptWhileUnchanged } from './content-version.ts';
import { indexTerms, type IndexTerms } from './index-terms.ts';
import { RowWriter, SortedPairs, StagedNames } from './import-writers.ts';
import { importSortPath } from './side-files.ts';
import type {
  AlternateName, Candidate, CandidateFinder, CandidateLookup, CandidateQuery, Feature, GeometryType, IndexedToken, NameIndex, NearbyPlace, NearestPlaceQuery, Posting, Source, UnitName, UnitLevel,
} from '../match/types.ts';

/** Schema version kept in PRAGMA user_version; an older file is migrated (MIGRATIONS), a newer one refused, never guessed at. */
export const SCHEMA_VERSION = 5;

const GEOMETRY_TYPES: readonly GeometryType[] = ['Point', 'LineString', 'MultiLineString', 'Polygon', 'MultiPolygon'];
/** Which features are country outlines (see countryOutlines): written out, so that the partial index below serves the query. */
const COUNTRY_POLYGONS = `feature_type = 'country' AND geometry_type IN (${GEOMETRY_TYPES.indexOf('Polygon')}, ${GEOMETRY_TYPES.indexOf('MultiPolygon')})`;
/** The country outlines alone: most gazetteers hold none, and a world dump a few hundred among millions of features. */
const COUNTRY_POLYGONS_INDEX = `CREATE INDEX features_country_polygons ON features (country_code) WHERE ${COUNTRY_POLYGONS};`;

/**
 * Each older schema version's step to the next, run in order in one transaction when a store of that
 * version is opened (a read-only open migrates through a short writable connection first).
 */
export const MIGRATIONS: Readonly<Record<number, string>> = {
  // Version 2: the rank of a source where several hold the same place (src/match/same-place.ts), the
  // details of alternate names (language, former…), and every name of the administrative units.
  1: `ALTER TABLE sources ADD COLUMN priority INTEGER;
    ALTER TABLE features ADD COLUMN name_details TEXT;
    CREATE TABLE unit_names (key TEXT NOT NULL, level INTEGER NOT NULL, unit_key TEXT NOT NULL, source INTEGER NOT NULL,
      PRIMARY KEY (key, level, unit_key, source)) WITHOUT ROWID;`,
  // Version 3: features by position, for the places near a point (a stated unit's places standing for its extent).
  2: 'CREATE INDEX features_by_position ON features (latitude, longitude);',
  // Version 4: the country outlines indexed, so that they are no longer found by reading every feature.
  3: COUNTRY_POLYGONS_INDEX,
  // Version 5: each unit name tied to the unit's own feature (`feature`, its id in the source; '' when the file
  // did not say which feature, as an older store's names did not), so that a code names one unit though its
  // unit's name is shared. The key gains the column, so the table is made anew; its rows are kept as they were.
  4: `CREATE TABLE unit_names_by_feature (key TEXT NOT NULL, level INTEGER NOT NULL, unit_key TEXT NOT NULL, source INTEGER NOT NULL,
      feature TEXT NOT NULL DEFAULT '', PRIMARY KEY (key, level, unit_key, source, feature)) WITHOUT ROWID;
    INSERT INTO unit_names_by_feature (key, level, unit_key, source) SELECT key, level, unit_key, source FROM unit_names;
    DROP TABLE unit_names;
    ALTER TABLE unit_names_by_feature RENAME TO unit_names;`,
};
/** The oldest schema version this whereabouts reads (migrating it when opened). */
export const OLDEST_READABLE_SCHEMA = 1;

const SCHEMA = `
CREATE TABLE sources (
  id INTEGER PRIMARY KEY, name TEXT NOT NULL UNIQUE, citation TEXT NOT NULL, licence TEXT,
  imported_at TEXT NOT NULL, content_hash TEXT NOT NULL, format TEXT NOT NULL, feature_count INTEGER NOT NULL,
  priority INTEGER
);
CREATE TABLE features (
  id INTEGER PRIMARY KEY, source INTEGER NOT NULL, feature_id TEXT NOT NULL, name TEXT NOT NULL,
  alternate_names TEXT, feature_type TEXT, country_code TEXT, state_province TEXT, county TEXT,
  latitude REAL NOT NULL, longitude REAL NOT NULL, radius REAL NOT NULL, radius_default INTEGER NOT NULL,
  geometry_type INTEGER NOT NULL, geometry TEXT, name_details TEXT
);
CREATE UNIQUE INDEX features_by_source_id ON features (source, feature_id);
CREATE INDEX features_by_position ON features (latitude, longitude);
${COUNTRY_POLYGONS_INDEX}
CREATE TABLE names (key TEXT NOT NULL, feature INTEGER NOT NULL, PRIMARY KEY (key, feature)) WITHOUT ROWID;
CREATE TABLE tokens (id INTEGER PRIMARY KEY, token TEXT NOT NULL UNIQUE, df INTEGER NOT NULL);
CREATE TABLE postings (token INTEGER NOT NULL, feature INTEGER NOT NULL, PRIMARY KEY (token, feature)) WITHOUT ROWID;
CREATE TABLE deletions (hash INTEGER NOT NULL, token INTEGER NOT NULL, PRIMARY KEY (hash, token)) WITHOUT ROWID;
CREATE TABLE unit_names (key TEXT NOT NULL, level INTEGER NOT NULL, unit_key TEXT NOT NULL, source INTEGER NOT NULL,
  feature TEXT NOT NULL DEFAULT '', PRIMARY KEY (key, level, unit_key, source, feature)) WITHOUT ROWID;
`;

/** Alternate names are stored joined by the ASCII unit separator, which no name contains. */
const NAME_SEPARATOR = '\u001f';
/**
 * Token ids an import keeps in memory (tens of MB at most): the whole vocabulary of a million-name list
 * (about 260,000 words with real word frequencies), so its tokens are never looked up again; when full,
 * the cache starts afresh and tokens it lacks are looked up in the file.
 */
const TOKEN_CACHE_LIMIT = 1_000_000;
/**
 * SQLite's page cache during an import: postings and deletion keys are written in key order at the end
 * (import-writers.ts) and need little of it, so it is no larger than a reader's, which keeps the
 * import's memory down now that a second thread reads the file.
 */
const IMPORT_CACHE_KIB = 65_536;
const QUERY_CACHE_KIB = 65_536;
/** Helper threads SQLite's sorter may use during an import, besides the importing thread (the machine's second core). */
const IMPORT_SORT_THREADS = 1;
/** Bytes of the file read through a memory map (SQLite caps it at its compile-time limit; the rest is read as usual). */
const MMAP_BYTES = 2 ** 32;

/** A feature as an importer hands it to the store: geometry as GeoJSON text (null for points). */
export type FeatureRecord = Omit<Feature, 'sourceId' | 'geometry'> & { geometry: string | null };

/** What a source is recorded with once its import is complete. */
export interface SourceRecord {
  citation: string;
  licence: string | null;
  contentHash: string;
  format: string;
  /** Rank where several sources hold the same place; undefined keeps the replaced source's. */
  priority?: number | null;
}

/** One import in progress: a single transaction, rolled back unless committed. */
export interface ImportSession {
  /**
   * Adds a feature; returns null, or the reason it was refused (a duplicate id, say). `terms`, when the
   * caller has worked them out already, are `indexTerms(record.name, record.alternateNames)`.
   */
  add(record: FeatureRecord, terms?: IndexTerms): string | null;
  /** Keeps an alternate name of a feature still to come, on disk for the length of the import. */
  stageAlternateName(featureId: string, name: AlternateName): void;
  /** The alternate names staged for a feature, in the order staged. */
  stagedAlternateNames(featureId: string): AlternateName[];
  /**
   * Records every name of a unit of a level (UnitLevel: state, county, municipality) whose features carry `unitName`,
   * tied to the unit's own feature of this source when `featureId` says which (a unit row of a GIS, GeoJSON or CSV file).
   */
  addUnitNames(level: UnitLevel, unitName: string, names: readonly string[], featureId?: string): void;
  commit(source: SourceRecord): Source;
  rollback(): void;
}

/**
 * A feature's row as an array in FEATURE_COLUMNS order: better-sqlite3 builds arrays (`raw()`) in about
 * half the time of named rows, which counts when a common name loads a thousand features.
 */
type FeatureRow = [
  id: number, sourceName: string, featureId: string, name: string, alternateNames: string | null, featureType: string | null,
  countryCode: string | null, stateProvince: string | null, county: string | null, latitude: number, longitude: number,
  radius: number, radiusDefault: number, geometryType: number, nameDetails: string | null,
];

interface TokenRow {
  id: number;
  token: string;
  df: number;
}

interface SourceRow {
  id: number;
  name: string;
  citation: string;
  licence: string | null;
  imported_at: string;
  content_hash: string;
  feature_count: number;
  priority?: number | null;
}

/** The SQLite gazetteer: CandidateFinder for the core, plus source management. */
export interface GazetteerStore extends CandidateFinder {
  lookupCandidates(query: CandidateQuery): CandidateLookup;
  nearestPlace(query: NearestPlaceQuery): NearbyPlace | null;
  unitNames(level: UnitLevel, key?: string): readonly UnitName[];
  unitFeatures(level: UnitLevel, key: string): readonly Feature[];
  getFeature(sourceId: string, featureId: string, options?: { withGeometry?: boolean }): Feature | null;
  sources(): Source[];
  /**
   * `read()`'s value, every statement in it reading the store as it stood at its first (one read
   * transaction): the sources an answer names and the rows it was found in are of one store, though
   * another process imports meanwhile.
   * @example store.asOfOneMoment(() => [store.sources(), store.findCandidates(query)])
   */
  asOfOneMoment<T>(read: () => T): T;
  /** Removes a source and all its features; returns false when there is no such source. */
  removeSource(id: string): boolean;
  /** Starts an import of a source (replacing it if it exists, keeping its priority) in one transaction. */
  beginImport(sourceId: string): ImportSession;
  /**
   * Sets (or with null clears) the rank of a source where several hold the same place: 1 is cited
   * first. Returns false when there is no such source.
   */
  setPriority(sourceId: string, priority: number | null): boolean;
  close(): void;
}

/**
 * Opens (creating when writable and absent) the gazetteer file at `path`.
 * Throws when the file holds another schema version, or when `readonly` and the file does not exist.
 * @example const store = openGazetteer('g.sqlite'); store.findCandidates({ name: 'Rosario', context: { countryCode: 'AR' } });
 */
export interface OpenOptions {
  readonly?: boolean;
  /**
   * Read the file through a memory map (default true): about 15 % faster lookups, but the mapped pages
   * count in the process's resident memory, so batch workers that must stay small turn it off.
   */
  memoryMap?: boolean;
  /** SQLite page cache of a reading connection in KiB (default 65536). */
  cacheKiB?: number;
  /**
   * Query words' stored neighbours kept between lookups, in KiB of heap (estimated; default 32768, 0
   * keeps none): at most this much besides SQLite's cache. Never changes an answer; cleared by an
   * import, a source's removal or another connection's write (as are a level's unit names and country
   * outlines, see unitNames and countryOutlines; content-version.ts).
   */
  wordCacheKiB?: number;
}

export function openGazetteer(path: string, options: OpenOptions = {}): GazetteerStore {
  const wordCacheBytes = options.wordCacheKiB === undefined ? WORD_CACHE_BYTES : 1024 * options.wordCacheKiB;
  return new SqliteGazetteer(path, options.readonly === true, options.memoryMap !== false, options.cacheKiB ?? QUERY_CACHE_KIB, wordCacheBytes);
}

class SqliteGazetteer implements GazetteerStore {
  private readonly db: Database.Database;
  private readonly statements: Statements;
  private readonly matcher: CandidateMatcher;
  /** What lookups keep between them (the matcher's word cache too) holds while this stays (content-version.ts). */
  private readonly content: ContentVersion;
  /** Every unit name of a level (see unitNames). */
  private readonly levelNames: KeptWhileUnchanged<UnitLevel, readonly UnitName[]>;
  /** A country's outlines by its code (see countryOutlines). */
  private readonly outlines: KeptWhileUnchanged<string, readonly Feature[]>;
  /** Every country polygon's row, without its geometry, by country code (see countryOutlines). */
  private readonly countryRows: KeptWhileUnchanged<'every country', ReadonlyMap<string, FeatureRow[]>>;

  constructor(path: string, readonly: boolean, memoryMap: boolean, cacheKiB: number, wordCacheBytes: number) {
    let db = new Database(path, { readonly, fileMustExist: readonly });
    let version = db.pragma('user_version', { simple: true }) as number;
    if (readonly && version >= OLDEST_READABLE_SCHEMA && version < SCHEMA_VERSION) {
      db.close();
      db = new Database(path, { fileMustExist: true });
      migrate(db, path, version);
      db.close();
      db = new Database(path, { readonly: true, fileMustExist: true });
      version = SCHEMA_VERSION;
    }
    this.db = db;
    if (version === 0 && !readonly) {
      this.db.pragma('journal_mode = WAL');
      this.db.exec(`BEGIN; ${SCHEMA} PRAGMA user_version = ${SCHEMA_VERSION}; COMMIT;`);
    } else if (version < OLDEST_READABLE_SCHEMA || version > SCHEMA_VERSION) {
      this.db.close();
      throw new Error(`${path}: gazetteer schema version ${version}, this whereabouts reads versions ${OLDEST_READABLE_SCHEMA} to ${SCHEMA_VERSION}`);
    } else if (version < SCHEMA_VERSION) {
      migrate(this.db, path, version);
    }
    if (!readonly) this.db.pragma('synchronous = NORMAL');
    this.db.pragma(`cache_size = -${Math.round(cacheKiB)}`);
    // Lookups seek into the token indexes at random: through a memory map a page costs no read call.
    if (memoryMap) this.db.pragma(`mmap_size = ${MMAP_BYTES}`);
    this.statements = prepareStatements(this.db);
    this.content = new ContentVersion(() => this.statements.dataVersion.get() as number);
    this.levelNames = new KeptWhileUnchanged(this.content);
    this.outlines = new KeptWhileUnchanged(this.content);
    this.countryRows = new KeptWhileUnchanged(this.content);
    this.matcher = new CandidateMatcher(sqliteNameIndex(this.statements, this.content), wordCacheBytes);
  }

  findCandidates(query: CandidateQuery): Candidate[] {
    return this.matcher.lookup(query).candidates;
  }

  lookupCandidates(query: CandidateQuery): CandidateLookup {
    return this.matcher.lookup(query);
  }

  nearestPlace(query: NearestPlaceQuery): NearbyPlace | null {
    return this.matcher.nearestPlace(query);
  }

  unitNames(level: UnitLevel, key?: string): readonly UnitName[] {
    if (key !== undefined) return this.statements.unitNamesByKey.all(key, level) as UnitName[];
    // A stated unit the gazetteer does not know reads every name of its level, a whole table (10 ms and
    // more a record): read once until the file changes, as the word cache is. Frozen, as every caller
    // is handed the same rows.
    return this.levelNames.get(level, () => Object.freeze((this.statements.unitNamesAt.all(level) as UnitName[]).map((name) => Object.freeze(name))));
  }

  unitFeatures(level: UnitLevel, key: string): readonly Feature[] {
    const ids = unitFeatureIds(this.statements, level, key);
    if (ids.length === 0) return [];
    return (this.statements.featuresByIds.all(JSON.stringify(ids)) as FeatureRow[]).map((row) => {
      const feature = toFeature(row);
      attachGeometry(this.statements, feature);
      return feature;
    });
  }

  countryOutlines(countryCode: string): readonly Feature[] {
    // Every georeferenced record's country is checked against its outlines, which can hold many thousand
    // vertices: read once until the file changes, as the word cache is. Frozen (the array and each
    // feature), as every caller is handed the same array: the plausibility stage keeps what it makes of it by it.
    const code = countryCode.toUpperCase();
    return this.outlines.get(code, () => {
      // Every country's rows at once, through their own index (features_country_polygons): a few hundred at most.
      const byCountry = this.countryRows.get('every country', () => {
        const rows = new Map<string, FeatureRow[]>();
        for (const row of this.statements.countryPolygons.all() as FeatureRow[]) {
          const country = rows.get(row[6] ?? '');
          if (country === undefined) rows.set(row[6] ?? '', [row]);
          else country.push(row);
        }
        return rows;
      });
      return Object.freeze((byCountry.get(code) ?? []).map((row) => {
        const feature = toFeature(row);
        attachGeometry(this.statements, feature);
        return Object.freeze(feature);
      }));
    });
  }

  getFeature(sourceId: string, featureId: string, options: { withGeometry?: boolean } = {}): Feature | null {
    const row = this.statements.featureBySourceId.get(sourceId, featureId) as FeatureRow | undefined;
    if (row === undefined) return null;
    const feature = toFeature(row);
    if (options.withGeometry) attachGeometry(this.statements, feature);
    return feature;
  }

  sources(): Source[] {
    return (this.statements.allSources.all() as SourceRow[]).map(toSource);
  }

  asOfOneMoment<T>(read: () => T): T {
    // A deferred transaction: in WAL mode it takes no lock that would keep another process from importing.
    return this.db.transaction(read)();
  }

  setPriority(sourceId: string, priority: number | null): boolean {
    if (priority !== null && !(Number.isInteger(priority) && priority >= 1)) throw new Error(`a source priority is a whole number from 1 (cited first), not ${priority}`);
    return this.statements.setPriority.run(priority, sourceId).changes === 1;
  }

  removeSource(id: string): boolean {
    this.content.changed();
    const row = this.statements.sourceByName.get(id) as SourceRow | undefined;
    if (row === undefined) return false;
    this.db.transaction(() => {
      this.deleteSourceRows(row.id);
      this.refreshTokenCounts();
    })();
    return true;
  }

  beginImport(sourceId: string): ImportSession {
    const db = this.db;
    const s = this.statements;
    // In WAL mode a transaction syncs nothing until its commit, and FULL makes the commit wait for the
    // log to reach the disk: the import is durable when it returns. Temporary tables and sorts larger
    // than the page cache go to a temporary file (the staged names, the features' index built at commit,
    // below): in memory they would grow with the store. Set before the names' temporary table is made,
    // as a change of temp_store drops every temporary table.
    db.pragma('synchronous = FULL');
    db.pragma(`cache_size = -${IMPORT_CACHE_KIB}`);
    db.pragma('temp_store = FILE');
    // SQLite's sorter may sort the staged names and the features' index keys on a second core
    // (IMPORT_SORT_THREADS) when they outgrow the cache, as they do at the world's size.
    db.pragma(`threads = ${IMPORT_SORT_THREADS}`);
    this.content.changed();
    db.exec('BEGIN');
    const previous = s.sourceByName.get(sourceId) as SourceRow | undefined;
    if (previous !== undefined) this.deleteSourceRows(previous.id);
    // Into a store with no feature left, the features' secondary indexes (not the one that finds a
    // duplicate id) are built once all rows are in, from one sort: faster than a random insert a row,
    // with full pages. Inside the transaction, so readers and a failed import see them as they were.
    const laterIndexes = s.anyFeature.get() === undefined ? s.featureSecondaryIndexes.all() as { name: string; sql: string }[] : [];
    for (const { name } of laterIndexes) db.exec(`DROP INDEX ${name}`);
    const sourceRowId = Number(s.insertSource.run(sourceId, new Date().toISOString(), previous?.priority ?? null).lastInsertRowid);
    const tokenIds = new Map<string, number>();
    // Into an empty token table (freshTokens, below), the new tokens wait in memory, in id order from
    // `firstNewToken`, and are written with their document frequencies when the postings are: written
    // as they came, each token's row cost a random insert into the words' unique index among the
    // features' pages in the page cache, and its count an update at the end (1 M names: 3.2 s → 0.3 s).
    const newTokens: string[] = [];
    let firstNewToken = 1;
    const tokenRows = new RowWriter(db, 'tokens', ['id', 'token', 'df']);
    const deletions = new SortedPairs(new RowWriter(db, 'deletions', ['hash', 'token']), importSortPath(db.name, 'deletions'));
    const postings = new SortedPairs(new RowWriter(db, 'postings', ['token', 'feature']), importSortPath(db.name, 'postings'));
    const names = new StagedNames(db);
    let count = 0;
    let open = true;
    let staging: { insert: Database.Statement; select: Database.Statement } | null = null;
    // Into an empty token table, a token the cache has not seen is new: no need to look it up; and
    // every token's document frequency is the number of its postings written at the end.
    const freshTokens = s.anyToken.get() === undefined;
    let everyTokenCached = freshTokens;
    const tokenId = (token: string, deletionKeys?: Iterable<number>): number => {
      const cached = tokenIds.get(token);
      if (cached !== undefined) return cached;
      const existing = everyTokenCached ? undefined : s.tokenByText.get(token) as TokenRow | undefined;
      let id: number;
      if (existing !== undefined) {
        id = existing.id;
      } else {
        id = freshTokens ? firstNewToken + newTokens.push(token) - 1 : Number(s.insertToken.run(token).lastInsertRowid);
        for (const hash of deletionKeys ?? storedTokenKeys(token)) deletions.add(hash, id);
      }
      if (tokenIds.size >= TOKEN_CACHE_LIMIT) {
        // The tokens the cache forgets must be found in the file from now on: the waiting ones are written first.
        writeNewTokens(() => 0);
        tokenIds.clear();
        everyTokenCached = false;
      }
      tokenIds.set(token, id);
      return id;
    };
    /** Writes the waiting new tokens with the counts `df` gives them. */
    const writeNewTokens = (df: (id: number) => number) => {
      newTokens.forEach((token, i) => tokenRows.add(firstNewToken + i, token, df(firstNewToken + i)));
      tokenRows.end();
      firstNewToken += newTokens.length;
      newTokens.length = 0;
    };
    const finish = () => {
      open = false;
      newTokens.length = 0;
      deletions.discard();
      postings.discard();
      db.pragma('synchronous = NORMAL');
      db.pragma('threads = 0');
      staging = null;
      this.content.changed();
      db.pragma(`cache_size = -${QUERY_CACHE_KIB}`);
    };
    return {
      add: (record, terms) => {
        let rowId: number;
        try {
          rowId = Number(s.insertFeature.run(
            sourceRowId, record.featureId, record.name,
            record.alternateNames.length > 0 ? record.alternateNames.join(NAME_SEPARATOR) : null,
            record.featureType, record.countryCode, record.stateProvince, record.county,
            record.latitude, record.longitude, record.radiusMeters, record.radiusIsDefault ? 1 : 0,
            GEOMETRY_TYPES.indexOf(record.geometryType), record.geometry,
            record.nameDetails !== undefined && record.nameDetails.length > 0 ? JSON.stringify(record.nameDetails) : null,
          ).lastInsertRowid);
        } catch (error) {
          if (error instanceof Database.SqliteError && error.code === 'SQLITE_CONSTRAINT_UNIQUE') return `duplicate id '${record.featureId}'`;
          throw error;
        }
        const { keys, tokens, deletionKeys } = terms ?? indexTerms(record.name, record.alternateNames);
        for (const key of keys) names.add(key, rowId);
        for (const token of tokens) postings.add(tokenId(token, deletionKeys?.get(token)), rowId);
        count++;
        return null;
      },
      stageAlternateName: (featureId, name) => {
        if (staging === null) {
          // A table of the file, not of memory: a world alternate-names file holds millions of rows.
          db.exec(`CREATE TABLE IF NOT EXISTS import_staged_names (feature_id TEXT NOT NULL, detail TEXT NOT NULL);
            CREATE INDEX IF NOT EXISTS import_staged_names_by_feature ON import_staged_names (feature_id);`);
          staging = {
            insert: db.prepare('INSERT INTO import_staged_names (feature_id, detail) VALUES (?, ?)'),
            select: db.prepare('SELECT detail FROM import_staged_names WHERE feature_id = ? ORDER BY rowid').pluck(),
          };
        }
        staging.insert.run(featureId, JSON.stringify(name));
      },
      stagedAlternateNames: (featureId) => (staging === null ? [] : (staging.select.all(featureId) as string[]).map((detail) => JSON.parse(detail) as AlternateName)),
      addUnitNames: (level, unitName, names, featureId = '') => {
        const unitKey = administrativeKey(unitName);
        for (const key of new Set([unitKey, ...names.map(administrativeKey)])) if (key !== '') s.insertUnitName.run(key, level, unitKey, sourceRowId, featureId);
      },
      commit: (source) => {
        if (!open) throw new Error('import already finished');
        if (staging !== null) db.exec('DROP TABLE import_staged_names');
        deletions.write();
        if (freshTokens) {
          // The postings come in token order: a token's count is complete when the next token's postings
          // start (token ids start at 1; every token has a posting). Tokens written before, when the
          // cache was full, have their count set; the waiting ones are written with it.
          const counts = new Int32Array(firstNewToken + newTokens.length);
          let token = 0;
          let df = 0;
          postings.write((next) => {
            if (next !== token) {
              if (token > 0 && token < firstNewToken) s.setTokenCount.run(df, token);
              counts[token] = df;
              token = next;
              df = 0;
            }
            df++;
          });
          if (token > 0 && token < firstNewToken) s.setTokenCount.run(df, token);
          counts[token] = df;
          writeNewTokens((id) => counts[id]);
        } else {
          postings.write();
        }
        names.write();
        for (const { sql } of laterIndexes) db.exec(sql);
        if (!freshTokens) this.refreshTokenCounts();
        s.completeSource.run(source.citation, source.licence, source.contentHash, source.format, count, sourceRowId);
        if (source.priority !== undefined) this.setPriority(sourceId, source.priority);
        // The commit's automatic checkpoint then copies the log into the file, as far as no reader holds it back.
        db.exec('COMMIT');
        finish();
        return toSource(s.sourceByName.get(sourceId) as SourceRow);
      },
      rollback: () => {
        if (!open) return;
        if (db.inTransaction) db.exec('ROLLBACK');
        finish();
      },
    };
  }

  close(): void {
    this.db.close();
  }

  private deleteSourceRows(sourceRowId: number): void {
    const s = this.statements;
    s.deleteSourcePostings.run(sourceRowId);
    s.deleteSourceNames.run(sourceRowId);
    s.deleteSourceUnitNames.run(sourceRowId);
    s.deleteSourceFeatures.run(sourceRowId);
    s.deleteSource.run(sourceRowId);
  }

  /** Document frequencies drive which query tokens are read first; tokens left with none are removed. */
  private refreshTokenCounts(): void {
    this.db.exec('UPDATE tokens SET df = (SELECT count(*) FROM postings p WHERE p.token = tokens.id)');
    // The deletion keys are not indexed by token: they are scanned only when a token has gone.
    if (this.statements.anyUnusedToken.get() !== undefined) {
      this.db.exec(`DELETE FROM deletions WHERE token IN (SELECT id FROM tokens WHERE df = 0);
        DELETE FROM tokens WHERE df = 0;`);
    }
  }
}

/**
 * Brings a store of an older schema version to SCHEMA_VERSION in one transaction (MIGRATIONS).
 * @example migrate(new Database('old.sqlite'), 'old.sqlite', 1)
 */
function migrate(db: Database.Database, path: string, version: number): void {
  try {
    // Several processes may open an old store at once (batch workers): the first migrates, the others
    // wait for its write lock and then find the file migrated.
    db.pragma('busy_timeout = 10000');
    db.exec('BEGIN IMMEDIATE');
    const now = db.pragma('user_version', { simple: true }) as number;
    const steps = Array.from({ length: SCHEMA_VERSION - now }, (_, i) => MIGRATIONS[now + i]).join('\n');
    db.exec(`${steps} PRAGMA user_version = ${SCHEMA_VERSION}; COMMIT;`);
  } catch (error) {
    if (db.inTransaction) db.exec('ROLLBACK');
    db.close();
    throw new Error(`${path}: gazetteer schema version ${version} must be migrated to version ${SCHEMA_VERSION}, which needs write access to the file: ${(error as Error).message}`);
  }
}

type Statements = ReturnType<typeof prepareStatements>;

/**
 * The row ids of the unit features a name or code of a level is tied to (NameIndex.unitFeatureIds): each once, and
 * none when one of its rows is tied to no feature held.
 * @example unitFeatureIds(s, 3, '2401701') // [17], the municipality of that IBGE code
 */
function unitFeatureIds(s: Statements, level: UnitLevel, key: string): number[] {
  const ids = s.unitFeatureIds.all(key, level) as (number | null)[];
  return ids.includes(null) ? [] : [...new Set(ids as number[])];
}

function attachGeometry(s: Statements, feature: Feature): void {
  if (feature.geometryType === 'Point' || feature.geometry !== undefined) return;
  const row = s.geometryBySourceId.get(feature.sourceId, feature.featureId) as { geometry: string | null } | undefined;
  if (row?.geometry) feature.geometry = JSON.parse(row.geometry) as Geometry;
}

/**
 * The store's answers to matching's questions: one prepared statement each, id lists passed as JSON
 * arrays (json_each), so a lookup costs a few statements whatever the number of ids.
 * @example new CandidateMatcher(sqliteNameIndex(prepareStatements(db), content)).lookup({ name: 'Alto', context: {} })
 */
function sqliteNameIndex(s: Statements, content: ContentVersion): NameIndex {
  return {
    version: () => content.current(),
    // LIMIT -1 is no limit in SQLite.
    featureIdsByName: (key, limit) => s.featuresByKey.all(key, limit ?? -1) as number[],
    feature: (id) => {
      const row = s.featureById.get(id) as FeatureRow | undefined;
      return row === undefined ? null : toFeature(row);
    },
    features: (ids) => new Map((s.featuresByIds.all(JSON.stringify(ids)) as FeatureRow[]).map((row) => [row[0], toFeature(row)])),
    // One text a row, the id and the names joined by NAME_SEPARATOR (see namesRow).
    namesOf: (ids) => (s.namesByIds.all(JSON.stringify(ids)) as string[]).map(namesRow),
    token: (token) => {
      const row = s.tokenByText.get(token) as TokenRow | undefined;
      return row === undefined ? undefined : { id: row.id, df: row.df };
    },
    // One statement: each distinct token once (a token shares many keys with a query), as one text a
    // row (see tokenRow). The keys sorted (idList): the deletion index is sought in key order, and
    // neighbouring seeks share pages (13 M names, the 4,647 reads of 3,808 benchmark lookups: 9 % less
    // CPU in four alternating rounds, load 9). The rows come by token id whatever the keys' order (the
    // tokens are read through the sorted list that 'IN (…)' builds).
    tokensByDeletionKeys: (keys) => (s.tokensByDeletion.all(idList(keys)) as string[]).map(tokenRow),
    // Unfiltered, one text a token (see postingGroups); filtered, one text a row, 'feature token' (see postingRow).
    postings: (tokenIds, countries, limit) => (countries === null
      ? postingGroups(s.postingsByToken.all(idList(tokenIds)) as (string | null)[], limit)
      : (s.postingsInCountries.all(JSON.stringify(tokenIds), JSON.stringify(countries), limit) as string[]).map(postingRow)),
    postingsWithPartner: (driver: IndexedToken, partners: readonly IndexedToken[], countries, limit) => {
      // Each partner on its cheaper side (one index seek a row read): one rarer than the driver has its
      // postings read, each probed for the driver; for the others the driver's postings are read, each
      // probed for them. Reading every partner on one side cost the sum of the partners' postings or
      // the driver's times the number of partners; this costs the sum of the smaller of the two.
      const ids = (side: readonly IndexedToken[]) => idList(side.map((token) => token.id));
      const parameters = {
        driver: driver.id, limit,
        rarer: ids(partners.filter((token) => token.df < driver.df)),
        commoner: ids(partners.filter((token) => token.df >= driver.df)),
      };
      const pairs = (countries === null
        ? s.postingsWithPartner.all(parameters) as string[]
        : s.postingsWithPartnerInCountries.all({ ...parameters, countries: JSON.stringify(countries) }) as string[]).map(postingRow);
      // The driver's posting before the first pair of each feature.
      const rows: Posting[] = [];
      const seen = new Set<number>();
      for (const pair of pairs) {
        if (!seen.has(pair.feature)) rows.push({ feature: pair.feature, token: driver.id });
        seen.add(pair.feature);
        rows.push(pair);
      }
      return rows;
    },
    postingsAmong: (tokenIds, featureIds) => (s.postingsAmong.all(idList(tokenIds), idList(featureIds)) as string[]).map(postingRow),
    attachGeometry: (feature) => attachGeometry(s, feature),
    sourceRanks: () => new Map((s.rankedSources.all() as string[]).map((name, rank) => [name, rank])),
    unitKeys: (level, key) => s.unitKeys.all(key, level) as string[],
    unitFeatureIds: (level, key) => unitFeatureIds(s, level, key),
    featureIdsInBox: (box) => s.featureIdsInBox.all(box.south, box.north, box.west, box.east) as number[],
  };
}


const FEATURE_COLUMNS = `f.id, s.name AS source_name, f.feature_id, f.name, f.alternate_names, f.feature_type, f.country_code,
  f.state_province, f.county, f.latitude, f.longitude, f.radius, f.radius_default, f.geometry_type, f.name_details`;

/**
 * The features holding the token @driver and one of the tokens @rarer or @commoner (JSON arrays of
 * ids, sorted, each once), as (feature, partner) pairs: the partners rarer than the driver read
 * through their postings, each probed for the driver; the commoner ones probed from the driver's
 * postings. A side with no partner reads nothing (its constant condition fails before its loop).
 */
const PARTNER_PAIRS = `SELECT q.feature AS feature, q.token AS partner FROM json_each(@rarer) k CROSS JOIN postings q ON q.token = k.value
    WHERE json_array_length(@rarer) > 0 AND EXISTS (SELECT 1 FROM postings p WHERE p.token = @driver AND p.feature = q.feature)
  UNION ALL
  SELECT p.feature, q.token FROM postings p CROSS JOIN json_each(@commoner) k CROSS JOIN postings q ON q.token = k.value AND q.feature = p.feature
    WHERE json_array_length(@commoner) > 0 AND p.token = @driver`;

/** Every statement the store runs, prepared once (write statements fail on a read-only file when run). */
function prepareStatements(db: Database.Database) {
  return {
    insertSource: db.prepare(`INSERT INTO sources (name, citation, licence, imported_at, content_hash, format, feature_count, priority)
      VALUES (?, '', NULL, ?, '', '', 0, ?)`),
    setPriority: db.prepare('UPDATE sources SET priority = ? WHERE name = ?'),
    rankedSources: db.prepare('SELECT name FROM sources ORDER BY priority IS NULL, priority, id').pluck(),
    completeSource: db.prepare('UPDATE sources SET citation = ?, licence = ?, content_hash = ?, format = ?, feature_count = ? WHERE id = ?'),
    deleteSource: db.prepare('DELETE FROM sources WHERE id = ?'),
    deleteSourceFeatures: db.prepare('DELETE FROM features WHERE source = ?'),
    deleteSourceNames: db.prepare('DELETE FROM names WHERE feature IN (SELECT id FROM features WHERE source = ?)'),
    deleteSourcePostings: db.prepare('DELETE FROM postings WHERE feature IN (SELECT id FROM features WHERE source = ?)'),
    insertFeature: db.prepare(`INSERT INTO features (source, feature_id, name, alternate_names, feature_type, country_code,
      state_province, county, latitude, longitude, radius, radius_default, geometry_type, geometry, name_details)
      VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`),
    insertUnitName: db.prepare('INSERT OR IGNORE INTO unit_names (key, level, unit_key, source, feature) VALUES (?, ?, ?, ?, ?)'),
    deleteSourceUnitNames: db.prepare('DELETE FROM unit_names WHERE source = ?'),
    unitKeys: db.prepare('SELECT DISTINCT unit_key FROM unit_names WHERE key = ? AND level = ?').pluck(),
    unitNamesAt: db.prepare('SELECT DISTINCT key, unit_key AS unitKey FROM unit_names WHERE level = ?'),
    unitNamesByKey: db.prepare('SELECT DISTINCT key, unit_key AS unitKey FROM unit_names WHERE key = ? AND level = ?'),
    // A name not tied to a feature, or tied to one the source no longer holds, gives a null.
    unitFeatureIds: db.prepare(`SELECT f.id FROM unit_names u LEFT JOIN features f ON u.feature <> '' AND f.source = u.source AND f.feature_id = u.feature
      WHERE u.key = ? AND u.level = ?`).pluck(),
    insertToken: db.prepare('INSERT INTO tokens (token, df) VALUES (?, 0)'),
    setTokenCount: db.prepare('UPDATE tokens SET df = ? WHERE id = ?'),
    allSources: db.prepare('SELECT * FROM sources ORDER BY name'),
    sourceByName: db.prepare('SELECT * FROM sources WHERE name = ?'),
    featureById: db.prepare(`SELECT ${FEATURE_COLUMNS} FROM features f JOIN sources s ON s.id = f.source WHERE f.id = ?`).raw(),
    featureBySourceId: db.prepare(`SELECT ${FEATURE_COLUMNS} FROM features f JOIN sources s ON s.id = f.source
      WHERE s.name = ? AND f.feature_id = ?`).raw(),
    countryPolygons: db.prepare(`SELECT ${FEATURE_COLUMNS} FROM features f JOIN sources s ON s.id = f.source
      WHERE ${COUNTRY_POLYGONS} ORDER BY s.name, f.feature_id`).raw(),
    geometryBySourceId: db.prepare(`SELECT f.geometry FROM features f JOIN sources s ON s.id = f.source
      WHERE s.name = ? AND f.feature_id = ?`),
    featureIdsInBox: db.prepare('SELECT id FROM features WHERE latitude BETWEEN ? AND ? AND longitude BETWEEN ? AND ?').pluck(),
    namesByIds: db.prepare(`SELECT id || char(31) || name || ifnull(char(31) || alternate_names, '') FROM features
      WHERE id IN (SELECT value FROM json_each(?))`).pluck(),
    featuresByIds: db.prepare(`SELECT ${FEATURE_COLUMNS} FROM features f JOIN sources s ON s.id = f.source
      WHERE f.id IN (SELECT value FROM json_each(?))`).raw(),
    featuresByKey: db.prepare('SELECT feature FROM names WHERE key = ? ORDER BY feature LIMIT ?').pluck(),
    dataVersion: db.prepare('PRAGMA data_version').pluck(),
    tokenByText: db.prepare('SELECT id, token, df FROM tokens WHERE token = ?'),
    anyToken: db.prepare('SELECT 1 FROM tokens LIMIT 1'),
    anyFeature: db.prepare('SELECT 1 FROM features LIMIT 1'),
    featureSecondaryIndexes: db.prepare(`SELECT name, sql FROM sqlite_schema
      WHERE type = 'index' AND tbl_name = 'features' AND sql IS NOT NULL AND sql NOT LIKE 'CREATE UNIQUE%'`),
    anyUnusedToken: db.prepare('SELECT 1 FROM tokens WHERE df = 0 LIMIT 1'),
    // The keys joined rather than read through 'hash IN (…)', which first copies them into a sorted
    // temporary index: each word's one-edit read took half the CPU at 1 M names (4,541 words, 116 ms against 234 ms).
    tokensByDeletion: db.prepare(`SELECT t.id || ' ' || t.df || ' ' || t.token FROM tokens t
      WHERE t.id IN (SELECT d.token FROM json_each(?) k CROSS JOIN deletions d ON d.hash = k.value)`).pluck(),
    // Joined for the same reason as tokensByDeletion; the ids come sorted and once each, so the rows
    // come in the order 'token IN (…)' gives them (by token, then feature) and LIMIT keeps the same ones.
    // A token's postings as one text, 'token feature feature …', in key order (by feature), the tokens in
    // the order given (sorted ids): rows come as 'token IN (…)' would give them. A text a token, not a
    // row a posting, because better-sqlite3 spends more on building a row than SQLite on reading it
    // (826,000 postings in 1,561 lookups at 13 M names: 0.52 s against 1.31 s, load 9). Each token
    // is read whole: the matcher asks only for tokens whose postings fit the limit (their df).
    postingsByToken: db.prepare(`SELECT k.value || ' ' || (SELECT group_concat(p.feature, ' ') FROM postings p WHERE p.token = k.value)
      FROM json_each(?) k`).pluck(),
    // The first pairs, the rarer partners' first (see PARTNER_PAIRS), one text a row, 'feature partner' (see postingRow).
    postingsWithPartner: db.prepare(`SELECT feature || ' ' || partner FROM (${PARTNER_PAIRS}) LIMIT @limit`).pluck(),
    postingsWithPartnerInCountries: db.prepare(`SELECT u.feature || ' ' || u.partner FROM (${PARTNER_PAIRS}) u JOIN features f ON f.id = u.feature
      WHERE f.country_code IS NULL OR f.country_code IN (SELECT value FROM json_each(@countries)) LIMIT @limit`).pluck(),
    // Each token's postings probed for each feature, in key order (sorted ids): neighbouring seeks share pages.
    postingsAmong: db.prepare(`SELECT p.feature || ' ' || p.token FROM json_each(?) t CROSS JOIN json_each(?) f
      CROSS JOIN postings p ON p.token = t.value AND p.feature = f.value`).pluck(),
    postingsInCountries: db.prepare(`SELECT p.feature || ' ' || p.token FROM postings p JOIN features f ON f.id = p.feature
      WHERE p.token IN (SELECT value FROM json_each(?))
        AND (f.country_code IS NULL OR f.country_code IN (SELECT value FROM json_each(?))) LIMIT ?`).pluck(),
  };
}

function toFeature(row: FeatureRow): Feature {
  const [, sourceName, featureId, name, alternateNames, featureType, countryCode, stateProvince, county, latitude, longitude,
    radius, radiusDefault, geometryType, nameDetails] = row;
  return {
    sourceId: sourceName,
    featureId,
    name,
    alternateNames: alternateNames === null ? [] : alternateNames.split(NAME_SEPARATOR),
    featureType,
    countryCode,
    stateProvince,
    county,
    latitude,
    longitude,
    radiusMeters: radius,
    radiusIsDefault: radiusDefault === 1,
    geometryType: GEOMETRY_TYPES[geometryType],
    ...(nameDetails === null ? {} : { nameDetails: JSON.parse(nameDetails) as AlternateName[] }),
  };
}

/**
 * Ids as the JSON array a statement joins (json_each), sorted and each once: rows then come in key
 * order, neighbouring seeks share pages, and LIMIT keeps the same rows as 'IN (…)' would.
 * @example idList([42, 7, 42]) // '[7,42]'
 */
function idList(ids: Iterable<number>): string {
  return JSON.stringify([...new Set(ids)].sort((a, b) => a - b));
}

/**
 * A stored token read as one text, 'id df token' (a token holds no space), as [id, token, df]:
 * better-sqlite3 returns a text a row in less time than it takes to build a row's array.
 * @example tokenRow('42 7 rosario') // [42, 'rosario', 7]
 */
function tokenRow(row: string): [number, string, number] {
  const first = row.indexOf(' ');
  const second = row.indexOf(' ', first + 1);
  return [Number(row.slice(0, first)), row.slice(second + 1), Number(row.slice(first + 1, second))];
}

/**
 * Postings read as one text a token, 'token feature feature …' (null for a token without postings), as
 * postings in the order read, at most `limit`; digits are read in place, without a substring a number.
 * @example postingGroups(['42 7 1200', null, '43 7'], 2) // [{ feature: 7, token: 42 }, { feature: 1200, token: 42 }]
 */
function postingGroups(rows: readonly (string | null)[], limit: number): Posting[] {
  const postings: Posting[] = [];
  for (const row of rows) {
    if (row === null) continue;
    let at = row.indexOf(' ');
    const token = Number(row.slice(0, at));
    while (at < row.length && postings.length < limit) {
      let feature = 0;
      for (at++; at < row.length; at++) {
        const digit = row.charCodeAt(at) - 48;
        if (digit < 0) break;
        feature = feature * 10 + digit;
      }
      postings.push({ feature, token });
    }
  }
  return postings;
}

/**
 * A posting read as one text, 'feature token' (see tokenRow).
 * @example postingRow('1200 42') // { feature: 1200, token: 42 }
 */
function postingRow(row: string): Posting {
  const space = row.indexOf(' ');
  return { feature: Number(row.slice(0, space)), token: Number(row.slice(space + 1)) };
}

/**
 * A feature's names read as one text, its id, name and alternate names joined by NAME_SEPARATOR (see tokenRow).
 * @example namesRow('1200\u001fRosario\u001fVilla del Rosario') // { id: 1200, names: ['Rosario', 'Villa del Rosario'] }
 */
function namesRow(row: string): { id: number; names: string[] } {
  const names = row.split(NAME_SEPARATOR);
  return { id: Number(names.shift()), names };
}

function toSource(row: SourceRow): Source {
  return {
    id: row.name,
    citation: row.citation,
    licence: row.licence,
    importedAt: row.imported_at,
    contentHash: row.content_hash,
    featureCount: row.feature_count,
    priority: row.priority ?? null,
  };
}
