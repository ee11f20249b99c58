/**
 * The gazetteer store: one SQLite file (better-sqlite3, WAL, prepared statements only) holding every
 * imported source, its features, the folded-name index and the deletion-neighbourhood token index that
 * fuzzy lookups use instead of scanning (see edit-distance.ts).
 */
import Database from 'better-sqlite3';
import type { Geometry, Polygon, MultiPolygon } from 'geojson';
import { booleanPointInPolygon } from '@turf/boolean-point-in-polygon';
import { contextMismatch, resolveContext, type ResolvedContext, type SpatiallyDecided } from './context.ts';
import { editDistance, maxTokenEdits, MIN_FUZZY_TOKEN_LENGTH, MIN_TWO_EDIT_LENGTH, oneEditQueryKeys, queryTokenKeys, storedTokenKeys } from './edit-distance.ts';
import { ABBREVIATIONS, foldName, LEADING_ARTICLES, nameVariants, OPTIONAL_GENERIC_WORDS } from './fold.ts';
import { scoreFuzzy } from './match.ts';
import type {
  Candidate, CandidateFinder, CandidateLookup, CandidateQuery, DroppedCandidate, Feature, GeometryType, Source,
} from './types.ts';

/** Schema version kept in PRAGMA user_version; a file of another version is refused, never guessed at. */
export const SCHEMA_VERSION = 1;

const SCHEMA = `
CREATE TABLE sources (
  id INTEGER PRIMARY KEY, name TEXT NOT NULL UNIQUE, citation TEXT NOT NULL, licence TEXT,
  imported_at TEXT NOT NULL, content_hash TEXT NOT NULL, format TEXT NOT NULL, feature_count INTEGER NOT NULL
);
CREATE TABLE features (
  id INTEGER PRIMARY KEY, source INTEGER NOT NULL, feature_id TEXT NOT NULL, name TEXT NOT NULL,
  alternate_names TEXT, feature_type TEXT, country_code TEXT, state_province TEXT, county TEXT,
  latitude REAL NOT NULL, longitude REAL NOT NULL, radius REAL NOT NULL, radius_default INTEGER NOT NULL,
  geometry_type INTEGER NOT NULL, geometry TEXT
);
CREATE UNIQUE INDEX features_by_source_id ON features (source, feature_id);
CREATE TABLE names (key TEXT NOT NULL, feature INTEGER NOT NULL, PRIMARY KEY (key, feature)) WITHOUT ROWID;
CREATE TABLE tokens (id INTEGER PRIMARY KEY, token TEXT NOT NULL UNIQUE, df INTEGER NOT NULL);
CREATE TABLE postings (token INTEGER NOT NULL, feature INTEGER NOT NULL, PRIMARY KEY (token, feature)) WITHOUT ROWID;
CREATE TABLE deletions (hash INTEGER NOT NULL, token INTEGER NOT NULL, PRIMARY KEY (hash, token)) WITHOUT ROWID;
`;

const GEOMETRY_TYPES: readonly GeometryType[] = ['Point', 'LineString', 'MultiLineString', 'Polygon', 'MultiPolygon'];
/** Alternate names are stored joined by the ASCII unit separator, which no name contains. */
const NAME_SEPARATOR = '\u001f';
const DEFAULT_LIMIT = 10;
/** Score of an exact match reached through an abbreviation or a left-out word, below a plain exact match. */
const READING_SCORE = 0.97;
/** At most this many postings are read for one fuzzy lookup (rarest query tokens first). */
const POSTING_BUDGET = 800;
/** At most this many features are loaded and scored with fuse.js for one fuzzy lookup. */
const FUZZY_POOL = 20;
/** At least this many, when the lookup asks for few candidates and filters none. */
const MIN_FUZZY_POOL = 10;
/** Query tokens whose matching stored tokens are kept between lookups (cleared when the file changes). */
const TOKEN_MATCH_CACHE = 20_000;
/** Whole-name edits counted exactly when re-ranking the shortlist; more are all alike (common practice, no source). */
const MAX_NAME_EDITS = 4;
/**
 * A lookup that left near neighbours of its words unread is repeated with them when no shortlisted
 * name is closer than this many whole-name edits (measured on the benchmark: 2 repeats most
 * two-error lookups for no gain in recall).
 */
const RETRY_NAME_EDITS = 3;
/** At most this many features are shortlisted by token weight and re-ranked by whole-name edits. */
const SHORTLIST = 60;
/** Features of one matching token taken into the shortlist before features of the next token. */
const SHORTLIST_PER_TOKEN = 2;
/** Administrative levels from the smallest up, for the spatial test. */
const UNIT_RANK: Readonly<Record<string, number>> = { county: 1, stateProvince: 2, country: 3 };
/** A common token is read with a partner only up to this many postings (the probe reads them all at worst). */
const COMMON_TOKEN_LIMIT = 5000;
/** At most this many tokens of another query word are probed for a common token. */
const MAX_PARTNERS = 6;
/** At most this many dropped candidates are reported. */
const MAX_DROPPED = 50;
const TOKEN_CACHE_LIMIT = 200_000;
/** Index pairs held before a sorted write: 8 MB for each index. */
const PAIR_BUFFER = 1_000_000;
/** Names held before a sorted write. */
const NAME_BUFFER = 200_000;
const IMPORT_CACHE_KIB = 98_304;
const QUERY_CACHE_KIB = 65_536;
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
}

/** One import in progress: a single transaction, rolled back unless committed. */
export interface ImportSession {
  /** Adds a feature; returns null, or the reason it was refused (a duplicate id, say). */
  add(record: FeatureRecord): string | null;
  commit(source: SourceRecord): Source;
  rollback(): void;
}

interface FeatureRow {
  id: number;
  source_name: string;
  feature_id: string;
  name: string;
  alternate_names: string | null;
  feature_type: string | null;
  country_code: string | null;
  state_province: string | null;
  county: string | null;
  latitude: number;
  longitude: number;
  radius: number;
  radius_default: number;
  geometry_type: number;
  geometry?: string | null;
}

/** Rows a multi-row INSERT writes at once: one statement of many rows costs far less than many statements. */
const ROWS_PER_INSERT = 100;

/**
 * INSERT OR IGNORE of rows into `table`, ROWS_PER_INSERT rows to a statement; `end` writes what is left.
 * @example const writer = new RowWriter(db, 'postings', 2); writer.add(1, 10); writer.end();
 */
class RowWriter {
  private readonly full: Database.Statement;
  private readonly single: Database.Statement;
  private readonly values: unknown[];
  private size = 0;

  constructor(db: Database.Database, table: string, private readonly columns: readonly string[]) {
    const statement = (rows: number) => db.prepare(`INSERT OR IGNORE INTO ${table} (${columns.join(', ')}) VALUES `
      + Array.from({ length: rows }, () => `(${columns.map(() => '?').join(', ')})`).join(', '));
    this.full = statement(ROWS_PER_INSERT);
    this.single = statement(1);
    this.values = new Array<unknown>(columns.length * ROWS_PER_INSERT);
  }

  add(first: unknown, second: unknown): void {
    this.values[this.size++] = first;
    this.values[this.size++] = second;
    if (this.size === this.values.length) {
      this.full.run(this.values);
      this.size = 0;
    }
  }

  end(): void {
    for (let at = 0; at < this.size; at += this.columns.length) this.single.run(this.values.slice(at, at + this.columns.length));
    this.size = 0;
  }
}

/**
 * Pairs of 32-bit integers waiting to be written to an index table (deletion keys, postings), sorted
 * before they go in: they arrive in random key order, and a B-tree fills faster in key order.
 * Holds at most PAIR_BUFFER.
 */
class PairBuffer {
  private pairs = new BigUint64Array(PAIR_BUFFER);
  /** The same memory as 32-bit halves, the low half first (Node runs on little-endian machines). */
  private halves = new Uint32Array(this.pairs.buffer);
  private size = 0;

  /** The first integer is written as a signed 32-bit value. */
  constructor(private readonly writer: RowWriter) {}

  add(first: number, second: number): void {
    this.halves[2 * this.size] = second;
    this.halves[2 * this.size + 1] = first;
    if (++this.size === PAIR_BUFFER) this.flush();
  }

  flush(): void {
    this.pairs.subarray(0, this.size).sort();
    for (let i = 0; i < this.size; i++) this.writer.add(this.halves[2 * i + 1] | 0, this.halves[2 * i]);
    this.writer.end();
    this.size = 0;
  }
}

/** Folded names waiting to be written to the names table in key order (see PairBuffer); at most NAME_BUFFER. */
class NameBuffer {
  private keys: string[] = [];
  private features: number[] = [];

  constructor(private readonly writer: RowWriter) {}

  add(key: string, feature: number): void {
    this.keys.push(key);
    this.features.push(feature);
    if (this.keys.length === NAME_BUFFER) this.flush();
  }

  flush(): void {
    const keys = this.keys;
    const order = Array.from(keys.keys()).sort((a, b) => (keys[a] < keys[b] ? -1 : keys[a] > keys[b] ? 1 : a - b));
    for (const index of order) this.writer.add(keys[index], this.features[index]);
    this.writer.end();
    this.keys = [];
    this.features = [];
  }
}

/** A stored token matching the query word at `index`. */
interface TokenMatch {
  id: number;
  edits: number;
  df: number;
  index: number;
}

/** A stored token within the allowed edits of a query token. */
interface TokenMatchRow {
  id: number;
  edits: number;
  df: number;
}

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
}

/** The SQLite gazetteer: CandidateFinder for the core, plus source management. */
export interface GazetteerStore extends CandidateFinder {
  lookupCandidates(query: CandidateQuery): CandidateLookup;
  getFeature(sourceId: string, featureId: string, options?: { withGeometry?: boolean }): Feature | null;
  sources(): Source[];
  /** Removes a source and all its features; returns false when there is no such source. */
  removeSource(id: string): boolean;
  /** Starts an import of a source (replacing it if it exists) in one transaction. */
  beginImport(sourceId: string): ImportSession;
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
}

export function openGazetteer(path: string, options: OpenOptions = {}): GazetteerStore {
  return new SqliteGazetteer(path, options.readonly === true, options.memoryMap !== false, options.cacheKiB ?? QUERY_CACHE_KIB);
}

class SqliteGazetteer implements GazetteerStore {
  private readonly db: Database.Database;
  private readonly statements: ReturnType<typeof prepareStatements>;
  private readonly tokenMatches = new Map<string, TokenMatchRow[]>();
  private tokenMatchVersion = -1;

  constructor(path: string, readonly: boolean, memoryMap: boolean, cacheKiB: number) {
    this.db = new Database(path, { readonly, fileMustExist: readonly });
    const version = this.db.pragma('user_version', { simple: true }) as number;
    if (version === 0 && !readonly) {
      this.db.pragma('journal_mode = WAL');
      this.db.exec(`BEGIN; ${SCHEMA} PRAGMA user_version = ${SCHEMA_VERSION}; COMMIT;`);
    } else if (version !== SCHEMA_VERSION) {
      this.db.close();
      throw new Error(`${path}: gazetteer schema version ${version}, this whereabouts reads version ${SCHEMA_VERSION}`);
    }
    if (!readonly) this.db.pragma('synchronous = NORMAL');
    this.db.pragma(`cache_size = -${Math.round(cacheKiB)}`);
    // Lookups seek into the token indexes at random: through a memory map a page costs no read call.
    if (memoryMap) this.db.pragma(`mmap_size = ${MMAP_BYTES}`);
    this.statements = prepareStatements(this.db);
  }

  findCandidates(query: CandidateQuery): Candidate[] {
    return this.lookupCandidates(query).candidates;
  }

  lookupCandidates(query: CandidateQuery): CandidateLookup {
    const notes: string[] = [];
    const context = this.resolve(query, notes);
    const dropped: DroppedCandidate[] = [];
    const constraint = this.spatialConstraint(query, context, notes);
    const fits = (candidate: Candidate): boolean => {
      const feature = candidate.feature;
      if (query.featureTypes !== undefined && (feature.featureType === null || !query.featureTypes.includes(feature.featureType))) return false;
      if (query.geometryTypes !== undefined && !query.geometryTypes.includes(feature.geometryType)) return false;
      const reason = contextMismatch(feature, context, constraint.decided) ?? constraint.outside(feature);
      if (reason !== null) {
        if (dropped.length < MAX_DROPPED) dropped.push({ candidate, reason });
        return false;
      }
      return true;
    };
    const limit = query.limit ?? DEFAULT_LIMIT;
    const exact = this.exactCandidates(query.name).filter(fits);
    // Scoring costs grow with the pool: a short list unfiltered needs a smaller pool than a filtered one.
    const filtered = query.featureTypes !== undefined || query.geometryTypes !== undefined
      || Object.values(query.context).some((value) => value !== undefined && value !== '');
    const pool = filtered ? FUZZY_POOL : Math.min(FUZZY_POOL, Math.max(MIN_FUZZY_POOL, 2 * limit));
    const candidates = exact.length > 0 ? exact : this.fuzzyCandidates(query.name, context, pool).filter(fits);
    const result = candidates.slice(0, limit);
    if (query.withGeometry) for (const candidate of result) this.attachGeometry(candidate.feature);
    return { candidates: result, dropped, notes };
  }

  countryOutlines(countryCode: string): Feature[] {
    const rows = this.statements.countryPolygons.all(countryCode.toUpperCase(), GEOMETRY_TYPES.indexOf('Polygon'), GEOMETRY_TYPES.indexOf('MultiPolygon')) as FeatureRow[];
    return rows.map((row) => {
      const feature = toFeature(row);
      this.attachGeometry(feature);
      return feature;
    });
  }

  getFeature(sourceId: string, featureId: string, options: { withGeometry?: boolean } = {}): Feature | null {
    const row = this.statements.featureBySourceId.get(sourceId, featureId) as FeatureRow | undefined;
    if (row === undefined) return null;
    const feature = toFeature(row);
    if (options.withGeometry) this.attachGeometry(feature);
    return feature;
  }

  sources(): Source[] {
    return (this.statements.allSources.all() as SourceRow[]).map(toSource);
  }

  removeSource(id: string): boolean {
    this.tokenMatches.clear();
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
    // synchronous stays NORMAL: in WAL mode it syncs only at checkpoints, so a large transaction costs
    // no syncs. Sorts for the index writes stay in memory.
    db.pragma(`cache_size = -${IMPORT_CACHE_KIB}`);
    db.pragma('temp_store = MEMORY');
    this.tokenMatches.clear();
    db.exec('BEGIN');
    const previous = s.sourceByName.get(sourceId) as SourceRow | undefined;
    if (previous !== undefined) this.deleteSourceRows(previous.id);
    const sourceRowId = Number(s.insertSource.run(sourceId, new Date().toISOString()).lastInsertRowid);
    const tokenIds = new Map<string, number>();
    const deletions = new PairBuffer(new RowWriter(db, 'deletions', ['hash', 'token']));
    const postings = new PairBuffer(new RowWriter(db, 'postings', ['token', 'feature']));
    const names = new NameBuffer(new RowWriter(db, 'names', ['key', 'feature']));
    let count = 0;
    let open = true;
    // Into an empty token table, a token the cache has not seen is new: no need to look it up.
    let everyTokenCached = s.anyToken.get() === undefined;
    const tokenId = (token: string): number => {
      const cached = tokenIds.get(token);
      if (cached !== undefined) return cached;
      const existing = everyTokenCached ? undefined : s.tokenByText.get(token) as TokenRow | undefined;
      let id: number;
      if (existing !== undefined) {
        id = existing.id;
      } else {
        id = Number(s.insertToken.run(token).lastInsertRowid);
        for (const hash of storedTokenKeys(token)) deletions.add(hash, id);
      }
      if (tokenIds.size >= TOKEN_CACHE_LIMIT) {
        tokenIds.clear();
        everyTokenCached = false;
      }
      tokenIds.set(token, id);
      return id;
    };
    const finish = () => {
      open = false;
      this.tokenMatches.clear();
      db.pragma(`cache_size = -${QUERY_CACHE_KIB}`);
    };
    return {
      add: (record) => {
        let rowId: number;
        try {
          rowId = Number(s.insertFeature.run(
            sourceRowId, record.featureId, record.name,
            record.alternateNames.length > 0 ? record.alternateNames.join(NAME_SEPARATOR) : null,
            record.featureType, record.countryCode, record.stateProvince, record.county,
            record.latitude, record.longitude, record.radiusMeters, record.radiusIsDefault ? 1 : 0,
            GEOMETRY_TYPES.indexOf(record.geometryType), record.geometry,
          ).lastInsertRowid);
        } catch (error) {
          if (error instanceof Database.SqliteError && error.code === 'SQLITE_CONSTRAINT_UNIQUE') return `duplicate id '${record.featureId}'`;
          throw error;
        }
        const keys = new Set<string>();
        for (const written of [record.name, ...record.alternateNames]) for (const variant of nameVariants(written)) keys.add(variant.key);
        const tokens = new Set<string>();
        for (const key of keys) {
          if (key === '') continue;
          names.add(key, rowId);
          for (const token of key.split(' ')) tokens.add(token);
        }
        for (const token of tokens) postings.add(tokenId(token), rowId);
        count++;
        return null;
      },
      commit: (source) => {
        if (!open) throw new Error('import already finished');
        deletions.flush();
        postings.flush();
        names.flush();
        this.refreshTokenCounts();
        s.completeSource.run(source.citation, source.licence, source.contentHash, source.format, count, sourceRowId);
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

  private resolve(query: CandidateQuery, notes: string[]): ResolvedContext {
    const country = query.context.country;
    const gazetteerCodes: string[] = [];
    if (country !== undefined && country.trim() !== '') {
      for (const id of this.featureIdsByKey(foldName(country))) {
        const feature = this.loadFeature(id);
        if (feature?.featureType === 'country' && feature.countryCode !== null) gazetteerCodes.push(feature.countryCode);
      }
    }
    const context = resolveContext(query.context, gazetteerCodes);
    if (context.unresolvedCountry !== undefined) notes.push(`country '${context.unresolvedCountry}' not recognised: not used to filter`);
    return context;
  }

  /**
   * Polygons of the stated county and state in the gazetteer: candidates whose center lies outside
   * every polygon of that unit are dropped, and that level's name no longer filters.
   */
  private spatialConstraint(query: CandidateQuery, context: ResolvedContext, notes: string[]): {
    decided: SpatiallyDecided; outside: (feature: Feature) => string | null;
  } {
    const levels: { level: 'county' | 'stateProvince'; written: string | undefined }[] = [
      { level: 'county', written: query.context.county },
      { level: 'stateProvince', written: query.context.stateProvince },
    ];
    const tests: { level: string; units: Feature[] }[] = [];
    const decided: SpatiallyDecided = {};
    for (const { level, written } of levels) {
      if (written === undefined || written.trim() === '' || query.featureTypes?.includes(level)) continue;
      const units = this.exactCandidates(written)
        .map((candidate) => candidate.feature)
        .filter((feature) => feature.featureType === level
          && (feature.geometryType === 'Polygon' || feature.geometryType === 'MultiPolygon')
          && (context.countryCodes.size === 0 || feature.countryCode === null || context.countryCodes.has(feature.countryCode)));
      if (units.length === 0) continue;
      for (const unit of units) this.attachGeometry(unit);
      decided[level] = true;
      tests.push({ level, units });
      notes.push(`${level === 'county' ? 'county' : 'state/province'} '${written}' checked against its polygon (${units.map((u) => `${u.sourceId}:${u.featureId}`).join(', ')})`);
    }
    return {
      decided,
      outside: (feature) => {
        for (const { level, units } of tests) {
          if (units.some((unit) => unit.sourceId === feature.sourceId && unit.featureId === feature.featureId)) continue;
          // A state is not inside its county: units above the tested level are not tested.
          if (UNIT_RANK[feature.featureType ?? ''] > UNIT_RANK[level]) continue;
          const inside = units.some((unit) => booleanPointInPolygon([feature.longitude, feature.latitude], unit.geometry as Polygon | MultiPolygon));
          if (!inside) {
            return `center outside the polygon of ${level === 'county' ? 'county' : 'state/province'} '${units[0].name}' (${units.map((u) => `${u.sourceId}:${u.featureId}`).join(', ')})`;
          }
        }
        return null;
      },
    };
  }

  /** Features whose folded name, alternate name or one of their readings equals a reading of `name`. */
  private exactCandidates(name: string): Candidate[] {
    const found = new Map<number, Candidate>();
    for (const variant of nameVariants(name)) {
      for (const id of this.featureIdsByKey(variant.key)) {
        if (found.has(id)) continue;
        const feature = this.loadFeature(id);
        if (feature === null) continue;
        const stored = storedReading(feature, variant.key);
        const which = stored.written === feature.name ? 'name' : `alternate name '${stored.written}'`;
        const changes = [variant.change && `${variant.change} in the query`, stored.change && `${stored.change} in the gazetteer`].filter(Boolean);
        found.set(id, {
          feature,
          score: changes.length === 0 ? 1 : READING_SCORE,
          matchedName: stored.written,
          why: changes.length === 0 ? `exact ${which}` : `exact ${which} with ${changes.join('; ')}`,
        });
      }
    }
    return [...found.values()].sort((a, b) => b.score - a.score);
  }

  /**
   * Fuzzy lookup through the token index: rarest query tokens first, within a fixed posting budget.
   * A query word that is itself a stored token is first taken as written, and a word of a longer name
   * found within one edit without its two-edit neighbours (see matchingTokens): most of a lookup's
   * index seeks are saved. Only when no shortlisted name then comes within RETRY_NAME_EDITS of the
   * query (the typing error made another stored word, say) is the lookup repeated with every word's
   * neighbours (`everyNeighbour`).
   */
  private fuzzyCandidates(name: string, context: ResolvedContext, poolSize: number, everyNeighbour = false): Candidate[] {
    const folded = foldName(name);
    const queryTokens = [...new Set(folded.split(' ').filter((token) => token !== ''))];
    if (queryTokens.length === 0) return [];
    // Every stored token that matches a query token, closest and rarest first, as many as the posting
    // budget holds. A token that does not fit (a common 'rio', 'do', 'sul') is read only through the
    // features the chosen tokens found, or, when no token fits at all, together with the next query token.
    const matched = queryTokens
      .flatMap((token, index) => this.matchingTokens(token, queryTokens.length > 1, everyNeighbour).map((match) => ({ ...match, index })))
      .sort((a, b) => a.edits - b.edits || a.df - b.df);
    const chosen: typeof matched = [];
    let budget = POSTING_BUDGET;
    for (const match of matched) {
      if (match.df > budget) continue;
      chosen.push(match);
      budget -= match.df;
    }
    const byToken = new Map<number, { index: number; weight: number }[]>();
    for (const { id, edits, index } of chosen) {
      const optional = OPTIONAL_GENERIC_WORDS.has(queryTokens[index]) || LEADING_ARTICLES.has(queryTokens[index]);
      // About the number of letters the token contributes to the match: long tokens found with few
      // edits say most about which feature is meant.
      const weight = (optional ? 0.5 : 1) * Math.max(0.5, queryTokens[index].length - 1.5 * edits);
      byToken.set(id, [...(byToken.get(id) ?? []), { index, weight }]);
    }
    const tokenIds = JSON.stringify([...byToken.keys()]);
    const rows = (context.countryCodes.size === 0
      ? this.statements.postings.all(tokenIds, POSTING_BUDGET)
      : this.statements.postingsInCountries.all(tokenIds, JSON.stringify([...context.countryCodes]), POSTING_BUDGET)) as { feature: number; token: number }[];
    const common = this.commonTokenPostings(matched, chosen, context);
    for (const { id, index } of common.tokens) byToken.set(id, [...(byToken.get(id) ?? []), { index, weight: queryTokens[index].length }]);
    const pool = new Map<number, { weights: number[]; token: number; weight: number }>();
    for (const { feature, token } of [...rows, ...common.rows]) {
      const entry = pool.get(feature) ?? { weights: new Array<number>(queryTokens.length).fill(0), token, weight: 0 };
      for (const { index, weight } of byToken.get(token) ?? []) {
        entry.weights[index] = Math.max(entry.weights[index], weight);
        if (weight > entry.weight) Object.assign(entry, { token, weight });
      }
      pool.set(feature, entry);
    }
    const total = (weights: number[]) => weights.reduce((sum, weight) => sum + weight, 0);
    // The token weights only shortlist, features of many different tokens before many features of one
    // token; a common token skipped above ("monte") counts for nobody, so the shortlist is re-ranked by
    // the edit distance of the whole name before fuse.js scores the best.
    const perToken = new Map<number, number>();
    const shortlist = [...pool.entries()]
      .map(([id, entry]) => ({ id, entry, weight: total(entry.weights) }))
      .sort((a, b) => b.weight - a.weight)
      .map(({ id, entry, weight }) => {
        const repeat = perToken.get(entry.token) ?? 0;
        perToken.set(entry.token, repeat + 1);
        return { id, weight, repeat: Math.floor(repeat / SHORTLIST_PER_TOKEN) };
      })
      .sort((a, b) => b.weight - a.weight || a.repeat - b.repeat)
      .slice(0, SHORTLIST)
      .map(({ id, weight }) => [id, weight] as const);
    const closest = this.closestNames(shortlist.map(([id]) => id), folded);
    const neighboursLeftUnread = !everyNeighbour && matched.some(({ edits, index }) => {
      const length = queryTokens[index].length;
      return length >= MIN_FUZZY_TOKEN_LENGTH && (edits === 0 || (edits === 1 && queryTokens.length > 1 && length >= MIN_TWO_EDIT_LENGTH));
    });
    if (neighboursLeftUnread && Math.min(...[...closest.values()].map((entry) => entry.edits)) >= RETRY_NAME_EDITS) {
      return this.fuzzyCandidates(name, context, poolSize, true);
    }
    const seen = new Map<string, number>();
    const best = shortlist
      .map(([id, weight]) => ({ id, weight, ...(closest.get(id) ?? { edits: Infinity, key: '' }) }))
      .sort((a, b) => a.edits - b.edits || b.weight - a.weight)
      .map((entry) => {
        const repeat = seen.get(entry.key) ?? 0;
        seen.set(entry.key, repeat + 1);
        return { ...entry, repeat };
      })
      // Distinct names before more features of a name already in: thirty places called 'Gamar' must
      // not crowd out the one 'Guamar' as close to the query.
      .sort((a, b) => a.edits - b.edits || a.repeat - b.repeat || b.weight - a.weight)
      .slice(0, poolSize)
      .map(({ id }) => id);
    return scoreFuzzy(folded, this.loadFeatures(best));
  }

  /**
   * Features holding the rarest closest-matching token that was too common for the posting budget
   * ('bobaja' in a large gazetteer) together with a token matching another word of the query, read
   * through the postings of the common token with an index probe for the other; none when every
   * query word's closest match was read already.
   */
  private commonTokenPostings(matched: TokenMatch[], chosen: TokenMatch[], context: ResolvedContext): {
    tokens: TokenMatch[]; rows: { feature: number; token: number }[];
  } {
    const read = new Set(chosen.map((match) => match.id));
    const closest = new Map<number, number>();
    for (const match of matched) closest.set(match.index, Math.min(closest.get(match.index) ?? Infinity, match.edits));
    const skipped = matched.filter((match) => !read.has(match.id) && match.edits === closest.get(match.index) && match.df <= COMMON_TOKEN_LIMIT);
    if (skipped.length === 0) return { tokens: [], rows: [] };
    const driver = skipped.reduce((a, b) => (b.df < a.df ? b : a));
    const partners = matched
      .filter((match) => match.index !== driver.index && match.edits === closest.get(match.index))
      .sort((a, b) => a.df - b.df)
      .slice(0, MAX_PARTNERS);
    if (partners.length === 0) return { tokens: [], rows: [] };
    const partnerIds = JSON.stringify(partners.map((match) => match.id));
    // Whichever side has fewer postings is read, each probed for the other side (one index seek a row).
    const partnerPostings = partners.reduce((sum, match) => sum + match.df, 0);
    const s = this.statements;
    const [plain, inCountries] = partnerPostings < driver.df * partners.length
      ? [s.partnerPostingsWithDriver, s.partnerPostingsWithDriverInCountries]
      : [s.postingsWithPartner, s.postingsWithPartnerInCountries];
    const rows = (context.countryCodes.size === 0
      ? plain.all({ driver: driver.id, partners: partnerIds, limit: POSTING_BUDGET })
      : inCountries.all({ driver: driver.id, partners: partnerIds, limit: POSTING_BUDGET, countries: JSON.stringify([...context.countryCodes]) })) as { feature: number; token: number }[];
    return { tokens: [driver], rows };
  }

  /**
   * Stored tokens within the allowed edits of a query token, plus the words its abbreviation stands
   * for. Unless `everyNeighbour`: a token stored as written (or its abbreviation's words) alone, and a
   * word of several found within one edit without its two-edit neighbours.
   */
  private matchingTokens(token: string, severalTokens: boolean, everyNeighbour: boolean): TokenMatchRow[] {
    // Words such as 'san', 'rio' or 'santa' recur in most lookups; their matches hold until the file
    // changes (data_version moves when another connection commits; this one's writes clear the cache).
    const version = this.statements.dataVersion.get() as number;
    if (version !== this.tokenMatchVersion || this.tokenMatches.size >= TOKEN_MATCH_CACHE) {
      this.tokenMatches.clear();
      this.tokenMatchVersion = version;
    }
    const cacheKey = `${severalTokens ? '+' : '-'}${everyNeighbour ? '*' : '='}${token}`;
    const cached = this.tokenMatches.get(cacheKey);
    if (cached !== undefined) return cached;
    const matches = this.readMatchingTokens(token, severalTokens, everyNeighbour);
    this.tokenMatches.set(cacheKey, matches);
    return matches;
  }

  private readMatchingTokens(token: string, severalTokens: boolean, everyNeighbour: boolean): TokenMatchRow[] {
    const found = new Map<number, TokenMatchRow>();
    const exactWords = [token, ...(severalTokens && Object.hasOwn(ABBREVIATIONS, token) ? ABBREVIATIONS[token] : []).flatMap((words) => words.split(' '))];
    for (const word of exactWords) {
      const row = this.statements.tokenByText.get(word) as TokenRow | undefined;
      if (row !== undefined) found.set(row.id, { id: row.id, edits: 0, df: row.df });
    }
    if (token.length < MIN_FUZZY_TOKEN_LENGTH || (found.size > 0 && !everyNeighbour)) return [...found.values()];
    const near = (keys: number[]) => {
      // One statement: each distinct token once (a token shares many keys with a query), as arrays.
      for (const [id, stored, df] of this.statements.tokensByDeletion.all(JSON.stringify(keys)) as [number, string, number][]) {
        if (found.has(id)) continue;
        const edits = editDistance(token, stored, maxTokenEdits(stored));
        if (edits <= maxTokenEdits(stored)) found.set(id, { id, edits, df });
      }
    };
    // A word of a longer name found within one edit is read without its two-edit neighbours (most of
    // the seeks): the other words of the name tell its features apart. A lone word keeps them all.
    const oneEditFirst = !everyNeighbour && severalTokens && token.length >= MIN_TWO_EDIT_LENGTH;
    if (oneEditFirst) near(oneEditQueryKeys(token));
    if (!oneEditFirst || ![...found.values()].some((match) => match.edits <= 1)) near(queryTokenKeys(token));
    return [...found.values()];
  }

  /** For each feature, its folded name or alternate name closest to a folded query, with the edits. */
  private closestNames(ids: number[], foldedQuery: string): Map<number, { edits: number; key: string }> {
    const limit = Math.min(MAX_NAME_EDITS, Math.max(2, foldedQuery.length >> 1));
    const closest = new Map<number, { edits: number; key: string }>();
    for (const row of this.statements.namesByIds.all(JSON.stringify(ids)) as { id: number; name: string; alternate_names: string | null }[]) {
      const names = row.alternate_names === null ? [row.name] : [row.name, ...row.alternate_names.split(NAME_SEPARATOR)];
      let best = { edits: Infinity, key: '' };
      for (const written of names) {
        const key = foldName(written);
        const edits = editDistance(foldedQuery, key, limit);
        if (edits < best.edits) best = { edits, key };
      }
      closest.set(row.id, best);
    }
    return closest;
  }

  /** Features by row id, in the order asked. */
  private loadFeatures(ids: number[]): Feature[] {
    const rows = new Map((this.statements.featuresByIds.all(JSON.stringify(ids)) as FeatureRow[]).map((row) => [row.id, row]));
    return ids.flatMap((id) => {
      const row = rows.get(id);
      return row === undefined ? [] : [toFeature(row)];
    });
  }

  private featureIdsByKey(key: string): number[] {
    return (this.statements.featuresByKey.all(key) as { feature: number }[]).map((row) => row.feature);
  }

  private loadFeature(id: number): Feature | null {
    const row = this.statements.featureById.get(id) as FeatureRow | undefined;
    return row === undefined ? null : toFeature(row);
  }

  private attachGeometry(feature: Feature): void {
    if (feature.geometryType === 'Point' || feature.geometry !== undefined) return;
    const row = this.statements.geometryBySourceId.get(feature.sourceId, feature.featureId) as { geometry: string | null } | undefined;
    if (row?.geometry) feature.geometry = JSON.parse(row.geometry) as Geometry;
  }
}

/** The name of a feature whose folded form, or one of whose readings, is `key` (with that reading). */
function storedReading(feature: Feature, key: string): { written: string; change?: string } {
  const names = [feature.name, ...feature.alternateNames];
  for (const written of names) if (foldName(written) === key) return { written };
  for (const written of names) {
    const variant = nameVariants(written).find((v) => v.key === key);
    if (variant !== undefined) return { written, change: variant.change };
  }
  return { written: feature.name };
}

const FEATURE_COLUMNS = `f.id, s.name AS source_name, f.feature_id, f.name, f.alternate_names, f.feature_type, f.country_code,
  f.state_province, f.county, f.latitude, f.longitude, f.radius, f.radius_default, f.geometry_type`;

/** Every statement the store runs, prepared once (write statements fail on a read-only file when run). */
function prepareStatements(db: Database.Database) {
  return {
    insertSource: db.prepare(`INSERT INTO sources (name, citation, licence, imported_at, content_hash, format, feature_count)
      VALUES (?, '', NULL, ?, '', '', 0)`),
    completeSource: db.prepare('UPDATE sources SET citation = ?, licence = ?, content_hash = ?, format = ?, feature_count = ? WHERE id = ?'),
    deleteSource: db.prepare('DELETE FROM sources WHERE id = ?'),
    deleteSourceFeatures: db.prepare('DELETE FROM features WHERE source = ?'),
    deleteSourceNames: db.prepare('DELETE FROM names WHERE feature IN (SELECT id FROM features WHERE source = ?)'),
    deleteSourcePostings: db.prepare('DELETE FROM postings WHERE feature IN (SELECT id FROM features WHERE source = ?)'),
    insertFeature: db.prepare(`INSERT INTO features (source, feature_id, name, alternate_names, feature_type, country_code,
      state_province, county, latitude, longitude, radius, radius_default, geometry_type, geometry)
      VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`),
    insertToken: db.prepare('INSERT INTO tokens (token, df) VALUES (?, 0)'),
    allSources: db.prepare('SELECT * FROM sources ORDER BY name'),
    sourceByName: db.prepare('SELECT * FROM sources WHERE name = ?'),
    featureById: db.prepare(`SELECT ${FEATURE_COLUMNS} FROM features f JOIN sources s ON s.id = f.source WHERE f.id = ?`),
    featureBySourceId: db.prepare(`SELECT ${FEATURE_COLUMNS} FROM features f JOIN sources s ON s.id = f.source
      WHERE s.name = ? AND f.feature_id = ?`),
    countryPolygons: db.prepare(`SELECT ${FEATURE_COLUMNS} FROM features f JOIN sources s ON s.id = f.source
      WHERE f.feature_type = 'country' AND f.country_code = ? AND f.geometry_type IN (?, ?) ORDER BY s.name, f.feature_id`),
    geometryBySourceId: db.prepare(`SELECT f.geometry FROM features f JOIN sources s ON s.id = f.source
      WHERE s.name = ? AND f.feature_id = ?`),
    namesByIds: db.prepare('SELECT id, name, alternate_names FROM features WHERE id IN (SELECT value FROM json_each(?))'),
    featuresByIds: db.prepare(`SELECT ${FEATURE_COLUMNS} FROM features f JOIN sources s ON s.id = f.source
      WHERE f.id IN (SELECT value FROM json_each(?))`),
    featuresByKey: db.prepare('SELECT feature FROM names WHERE key = ?'),
    dataVersion: db.prepare('PRAGMA data_version').pluck(),
    tokenByText: db.prepare('SELECT id, token, df FROM tokens WHERE token = ?'),
    anyToken: db.prepare('SELECT 1 FROM tokens LIMIT 1'),
    anyUnusedToken: db.prepare('SELECT 1 FROM tokens WHERE df = 0 LIMIT 1'),
    tokensByDeletion: db.prepare(`SELECT t.id, t.token, t.df FROM tokens t
      WHERE t.id IN (SELECT token FROM deletions WHERE hash IN (SELECT value FROM json_each(?)))`).raw(),
    postings: db.prepare('SELECT feature, token FROM postings WHERE token IN (SELECT value FROM json_each(?)) LIMIT ?'),
    postingsWithPartner: db.prepare(`SELECT p.feature, p.token FROM postings p WHERE p.token = @driver
      AND EXISTS (SELECT 1 FROM postings q WHERE q.feature = p.feature AND q.token IN (SELECT value FROM json_each(@partners))) LIMIT @limit`),
    postingsWithPartnerInCountries: db.prepare(`SELECT p.feature, p.token FROM postings p JOIN features f ON f.id = p.feature
      WHERE p.token = @driver
        AND EXISTS (SELECT 1 FROM postings q WHERE q.feature = p.feature AND q.token IN (SELECT value FROM json_each(@partners)))
        AND (f.country_code IS NULL OR f.country_code IN (SELECT value FROM json_each(@countries))) LIMIT @limit`),
    partnerPostingsWithDriver: db.prepare(`SELECT q.feature, @driver AS token FROM postings q
      WHERE q.token IN (SELECT value FROM json_each(@partners))
        AND EXISTS (SELECT 1 FROM postings p WHERE p.token = @driver AND p.feature = q.feature) LIMIT @limit`),
    partnerPostingsWithDriverInCountries: db.prepare(`SELECT q.feature, @driver AS token FROM postings q JOIN features f ON f.id = q.feature
      WHERE q.token IN (SELECT value FROM json_each(@partners))
        AND EXISTS (SELECT 1 FROM postings p WHERE p.token = @driver AND p.feature = q.feature)
        AND (f.country_code IS NULL OR f.country_code IN (SELECT value FROM json_each(@countries))) LIMIT @limit`),
    postingsInCountries: db.prepare(`SELECT p.feature, p.token FROM postings p JOIN features f ON f.id = p.feature
      WHERE p.token IN (SELECT value FROM json_each(?))
        AND (f.country_code IS NULL OR f.country_code IN (SELECT value FROM json_each(?))) LIMIT ?`),
  };
}

function toFeature(row: FeatureRow): Feature {
  return {
    sourceId: row.source_name,
    featureId: row.feature_id,
    name: row.name,
    alternateNames: row.alternate_names === null ? [] : row.alternate_names.split(NAME_SEPARATOR),
    featureType: row.feature_type,
    countryCode: row.country_code,
    stateProvince: row.state_province,
    county: row.county,
    latitude: row.latitude,
    longitude: row.longitude,
    radiusMeters: row.radius,
    radiusIsDefault: row.radius_default === 1,
    geometryType: GEOMETRY_TYPES[row.geometry_type],
  };
}

function toSource(row: SourceRow): Source {
  return {
    id: row.name,
    citation: row.citation,
    licence: row.licence,
    importedAt: row.imported_at,
    contentHash: row.content_hash,
    featureCount: row.feature_count,
  };
}
