/**
 * The ranking policy of candidate lookups, over any NameIndex: exact readings first; otherwise the
 * token index read rarest-first within a posting budget, a shortlist re-ranked by whole-name edits,
 * and fuse.js scoring of the best (fuzzy-score.ts); then the administrative filter (context.ts,
 * unit-polygons.ts). Pure: every row comes from the index, which the SQLite store implements.
 */
import { contextMismatch, resolveContext, type ResolvedContext } from './context.ts';
import { editDistance, maxTokenEdits, MIN_FUZZY_TOKEN_LENGTH, MIN_TWO_EDIT_LENGTH, oneEditQueryKeys, queryTokenKeys } from './edit-distance.ts';
import { ABBREVIATIONS, foldName, LEADING_ARTICLES, nameVariants, OPTIONAL_GENERIC_WORDS } from './fold.ts';
import { scoreFuzzy } from './fuzzy-score.ts';
import type { Candidate, CandidateLookup, CandidateQuery, DroppedCandidate, Feature, NameIndex, NearbyPlace, NearestPlaceQuery } from './types.ts';
import { nearestPlace } from './nearest-place.ts';
import { withNameKind } from './name-kind.ts';
import { mergeSamePlaces } from './same-place.ts';
import { unitPolygonFilter } from './unit-polygons.ts';

const DEFAULT_LIMIT = 10;
/** Score of an exact match reached through an abbreviation or a left-out word, below a plain exact match. */
const READING_SCORE = 0.97;
/** At most this many postings are read for one fuzzy lookup (rarest query tokens first). */
const POSTING_BUDGET = 800;
/** At most this many features are loaded and scored with fuse.js for one fuzzy lookup. */
const FUZZY_POOL = 20;
/** At least this many, when the lookup asks for few candidates and filters none. */
const MIN_FUZZY_POOL = 10;
/** Query tokens whose matching stored tokens are kept between lookups (cleared when the index changes). */
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
/** A common token is read with a partner only up to this many postings (the probe reads them all at worst). */
const COMMON_TOKEN_LIMIT = 5000;
/** At most this many tokens of another query word are probed for a common token. */
const MAX_PARTNERS = 6;
/** At most this many dropped candidates are reported. */
const MAX_DROPPED = 50;

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

/** The countries a posting must lie in (or have none), or null when the context names none. */
const countryList = (context: ResolvedContext): string[] | null => (context.countryCodes.size === 0 ? null : [...context.countryCodes]);

/**
 * Ranked candidates for names, read through a NameIndex. Keeps the stored tokens matching recent
 * query words until the index's version changes; an index's owner calls `forgetTokenMatches` after
 * its own writes (which do not move the version it reports).
 * @example new CandidateMatcher(index).lookup({ name: 'Rosario', context: { countryCode: 'AR' } }).candidates[0].why // 'exact name'
 */
export class CandidateMatcher {
  private readonly tokenMatches = new Map<string, TokenMatchRow[]>();
  private tokenMatchVersion = -1;

  constructor(private readonly index: NameIndex) {}

  forgetTokenMatches(): void {
    this.tokenMatches.clear();
  }

  /** Candidates for a name, best first, with those the context dropped and notes on how it was read. */
  lookup(query: CandidateQuery): CandidateLookup {
    const notes: string[] = [];
    const context = this.resolve(query, notes);
    const dropped: DroppedCandidate[] = [];
    const constraint = unitPolygonFilter(query, context, notes, (name) => this.exactCandidates(name), (feature) => this.index.attachGeometry(feature));
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
    const result = mergeSamePlaces(candidates, this.sourceRank(), limit).map(withNameKind);
    if (query.withGeometry) for (const candidate of result) this.index.attachGeometry(candidate.feature);
    return { candidates: result, dropped, notes };
  }

  /** The loaded place nearest a point that lies in the query's stated units, read as a lookup reads them (see nearest-place.ts). */
  nearestPlace(query: NearestPlaceQuery): NearbyPlace | null {
    return nearestPlace(this.index, query, this.resolve({ name: '', context: query.context }, []));
  }

  /** Where several sources hold one place, the rank of each source, read only when a place is merged. */
  private sourceRank(): (sourceId: string) => number {
    let ranks: ReadonlyMap<string, number> | undefined;
    return (sourceId) => {
      ranks ??= this.index.sourceRanks?.() ?? new Map<string, number>();
      return ranks.get(sourceId) ?? Number.MAX_SAFE_INTEGER;
    };
  }

  private resolve(query: CandidateQuery, notes: string[]): ResolvedContext {
    const country = query.context.country;
    const gazetteerCodes: string[] = [];
    if (country !== undefined && country.trim() !== '') {
      for (const id of this.index.featureIdsByName(foldName(country))) {
        const feature = this.index.feature(id);
        if (feature?.featureType === 'country' && feature.countryCode !== null) gazetteerCodes.push(feature.countryCode);
      }
    }
    const context = resolveContext(query.context, gazetteerCodes);
    // A state or county written in another language or by a former name: the units it names.
    if (this.index.unitKeys !== undefined) {
      if (context.stateProvinceKey !== undefined) context.stateProvinceAliases = new Set(this.index.unitKeys(1, context.stateProvinceKey));
      if (context.countyKey !== undefined) context.countyAliases = new Set(this.index.unitKeys(2, context.countyKey));
    }
    if (context.unresolvedCountry !== undefined) notes.push(`country '${context.unresolvedCountry}' not recognised: not used to filter`);
    return context;
  }

  /** Features whose folded name, alternate name or one of their readings equals a reading of `name`. */
  private exactCandidates(name: string): Candidate[] {
    const found = new Map<number, Candidate>();
    for (const variant of nameVariants(name)) {
      const ids = this.index.featureIdsByName(variant.key).filter((id) => !found.has(id));
      // One statement for a reading's features: a common name ('San') has hundreds.
      const features = ids.length === 0 ? new Map<number, Feature>() : this.index.features(ids);
      for (const id of ids) {
        const feature = features.get(id);
        if (feature === undefined) continue;
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
  private fuzzyCandidates(name: string, context: ResolvedContext, poolSize: number, everyNeighbour = false, foldedNames = new Map<number, string[]>()): Candidate[] {
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
    const rows = this.index.postings([...byToken.keys()], countryList(context), POSTING_BUDGET);
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
    const closest = this.closestNames(shortlist.map(([id]) => id), folded, foldedNames);
    const neighboursLeftUnread = !everyNeighbour && matched.some(({ edits, index }) => {
      const length = queryTokens[index].length;
      return length >= MIN_FUZZY_TOKEN_LENGTH && (edits === 0 || (edits === 1 && queryTokens.length > 1 && length >= MIN_TWO_EDIT_LENGTH));
    });
    if (neighboursLeftUnread && Math.min(...[...closest.values()].map((entry) => entry.edits)) >= RETRY_NAME_EDITS) {
      return this.fuzzyCandidates(name, context, poolSize, true, foldedNames);
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
    const rows = this.index.postingsWithPartner(driver, partners, countryList(context), POSTING_BUDGET);
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
    const version = this.index.version();
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
      const row = this.index.token(word);
      if (row !== undefined) found.set(row.id, { id: row.id, edits: 0, df: row.df });
    }
    if (token.length < MIN_FUZZY_TOKEN_LENGTH || (found.size > 0 && !everyNeighbour)) return [...found.values()];
    const near = (keys: number[]) => {
      // One statement: each distinct token once (a token shares many keys with a query), as arrays.
      for (const [id, stored, df] of this.index.tokensByDeletionKeys(keys)) {
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

  /**
   * For each feature, its folded name or alternate name closest to a folded query, with the edits.
   * `foldedNames` keeps the folded names read during one lookup: a repeated lookup (every neighbour)
   * shortlists mostly the same features.
   */
  private closestNames(ids: number[], foldedQuery: string, foldedNames: Map<number, string[]>): Map<number, { edits: number; key: string }> {
    const unread = ids.filter((id) => !foldedNames.has(id));
    if (unread.length > 0) for (const { id, names } of this.index.namesOf(unread)) foldedNames.set(id, names.map(foldName));
    const limit = Math.min(MAX_NAME_EDITS, Math.max(2, foldedQuery.length >> 1));
    const closest = new Map<number, { edits: number; key: string }>();
    for (const id of ids) {
      const keys = foldedNames.get(id);
      if (keys === undefined) continue;
      let best = { edits: Infinity, key: '' };
      for (const key of keys) {
        const edits = editDistance(foldedQuery, key, limit);
        if (edits < best.edits) best = { edits, key };
      }
      closest.set(id, best);
    }
    return closest;
  }

  /** Features by row id, in the order asked. */
  private loadFeatures(ids: number[]): Feature[] {
    const features = this.index.features(ids);
    return ids.flatMap((id) => {
      const feature = features.get(id);
      return feature === undefined ? [] : [feature];
    });
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
