/**
 * The ranking policy of candidate lookups, over any NameIndex: exact readings first; otherwise the
 * token index read rarest-first within a posting budget, a shortlist re-ranked by whole-name edits,
 * and fuse.js scoring of the best (fuzzy-score.ts); then the administrative filter (context.ts,
 * unit-polygons.ts). Pure: every row comes from the index, which the SQLite store implements.
 *
 * A name of several words is found through its rarer words: a word too common for the budget
 * ('santa', 'lake') is never read whole, nor are its neighbours when it is stored as written; its
 * features are read only together with another word's (commonTokenPostings), and the features the
 * rarer words found are checked for it one probe each, when the shortlist holds no name near the query.
 */
import { contextMismatch, resolveContext, UNIT_FIELD_LEVELS, type ResolvedContext } from './context.ts';
import { editDistance, maxTokenEdits, MIN_FUZZY_TOKEN_LENGTH, MIN_TWO_EDIT_LENGTH, oneEditQueryKeys, queryTokenKeys } from './edit-distance.ts';
import { ABBREVIATIONS, foldName, LEADING_ARTICLES, nameVariants, OPTIONAL_GENERIC_WORDS, type NameVariant } from './fold.ts';
import { scoreFuzzy } from './fuzzy-score.ts';
import { WordCache } from './word-cache.ts';
import type { Candidate, CandidateLookup, CandidateQuery, DroppedCandidate, Feature, IndexedToken, NameIndex, NearbyPlace, NearestPlaceQuery, Posting, UnitLevel } from './types.ts';
import { nearestPlace } from './nearest-place.ts';
import { withoutConnectors } from './connector-words.ts';
import { MAX_OLDER_SPELLINGS, olderSpellingReadings, spellingReforms, tilSpellingReadings } from './older-spelling.ts';
import { withNameKind } from './name-kind.ts';
import { mergeSamePlaces } from './same-place.ts';
import { honoreeCountry, honoreeLongForm } from './short-form.ts';
import { unitPolygonFilter } from './unit-polygons.ts';

const DEFAULT_LIMIT = 10;
/** Score of an exact match reached through a documented reading (an abbreviation, a left-out word, an older spelling), below a plain exact match. */
const READING_SCORE = 0.97;
/** At most this many postings are read for one fuzzy lookup (rarest query tokens first). */
const POSTING_BUDGET = 800;
/** At most this many features are loaded and scored with fuse.js for one fuzzy lookup. */
const FUZZY_POOL = 20;
/** At least this many, when the lookup asks for few candidates and filters none. */
const MIN_FUZZY_POOL = 10;
/**
 * Estimated bytes of the query words' stored neighbours kept between lookups (WordCache, cleared when
 * the index changes), by default: a 1,904-query benchmark batch at 13 M names keeps about 4,200 words
 * and 128,000 neighbours (about 13 MB) and forgets none.
 */
export const WORD_CACHE_BYTES = 32 * 1024 * 1024;
/**
 * The share of the word cache's bound that a stated unit's other names (NameIndex.unitKeys) may hold
 * besides it: a few short keys a unit, so 1/32 of the default keeps about ten thousand units. Common
 * practice, no source.
 */
const UNIT_KEYS_SHARE = 1 / 32;
/** A kept word's bytes besides its neighbours (its entry, key and arrays), estimated; from a V8 heap measurement. */
const WORD_BYTES = 200;
/** A kept neighbour's bytes besides its text (object, numbers, array slot): about 100 bytes a 10-letter token in V8's heap. */
const NEIGHBOUR_BYTES = 80;
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
/** At most this many closest-matching tokens of other query words are probed for a common token. */
const MAX_PARTNERS = 6;
/** At most this many tokens of other query words in all, farther neighbours included (one index range each). */
const MAX_FAR_PARTNERS = 24;
/**
 * Features of an exact reading loaded at once; an unfiltered lookup reads no further page once it
 * holds the candidates asked for (a page is one statement).
 */
const EXACT_PAGE = 100;
/** A lone word's neighbours too common for the posting budget whose features named by them alone are read. */
const WHOLE_NAME_TOKENS = 6;
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
  /** The token as stored (folded). */
  text: string;
}

/**
 * The stored tokens matching one query word, by what found them: the word (or its abbreviation's
 * words) as written, its one-deletion keys, the rest of its keys; each read once, when first needed.
 */
interface WordMatches {
  exact: TokenMatchRow[];
  oneEdit?: TokenMatchRow[];
  rest?: TokenMatchRow[];
}

/**
 * How far a lookup reads a query word's neighbours: as written when stored (else as 'one edit'),
 * within one edit (two when none comes within one), or every neighbour.
 */
type Reach = 'first' | 'one edit' | 'all';

/**
 * What one lookup has read, kept while it is repeated with more neighbours (which reads mostly the
 * same rows again): folded names by feature, postings by token, postings by common token and
 * partners, and which features were probed for which unread tokens (see heldAmong).
 */
interface LookupReads {
  foldedNames: Map<number, string[]>;
  postings: Map<number, Posting[]>;
  partnerPostings: Map<string, Posting[]>;
  /** By token, the features probed for it and whether they hold it. */
  held: Map<number, Map<number, boolean>>;
}

/** The matches a lookup reads for a word, and whether some of its deletion keys were left unread. */
interface WordView {
  matches: TokenMatchRow[];
  keysRead: 'none' | 'one edit' | 'all';
}

/** The countries a posting must lie in (or have none), or null when the context names none. */
const countryList = (context: ResolvedContext): string[] | null => (context.countryCodes.size === 0 ? null : [...context.countryCodes]);

/**
 * Ranked candidates for names, read through a NameIndex. Keeps the stored tokens matching recent
 * query words (at most `wordCacheBytes`, estimated; 0 keeps none) until the index's version changes.
 * What is kept never changes an answer: a word's matches are the rows the index gives for it.
 * @example new CandidateMatcher(index).lookup({ name: 'Rosario', context: { countryCode: 'AR' } }).candidates[0].why // 'exact name'
 */
export class CandidateMatcher {
  private readonly tokenMatches: WordCache<WordMatches>;
  /** A stated unit's keys by level and key (NameIndex.unitKeys), read for most lookups of a batch. */
  private readonly unitKeys: WordCache<string[]>;
  private keptVersion = -1;

  constructor(private readonly index: NameIndex, wordCacheBytes = WORD_CACHE_BYTES) {
    this.tokenMatches = new WordCache(wordCacheBytes, wordMatchBytes);
    this.unitKeys = new WordCache(wordCacheBytes * UNIT_KEYS_SHARE, (keys) => WORD_BYTES + keys.reduce((bytes, key) => bytes + NEIGHBOUR_BYTES + 2 * key.length, 0));
  }

  /** Candidates for a name, best first, with those the context dropped and notes on how it was read. */
  lookup(query: CandidateQuery): CandidateLookup {
    this.forgetWhenChanged();
    const notes: string[] = [];
    const context = this.resolve(query, notes);
    const dropped: DroppedCandidate[] = [];
    // A unit named through the unit names is looked up by its key: as a name first, then, when its key lacks a
    // word of the name ("rio grande norte"), with near spellings in the stated countries (no unit stated, so
    // that lookup asks for no polygon filter of its own).
    const byKey = (key: string, featureType: string) => {
      const exact = this.exactCandidates(key).filter((candidate) => candidate.feature.featureType === featureType);
      return exact.length > 0 ? exact : this.lookup({ name: key, context: { countryCode: query.context.countryCode, country: query.context.country }, featureTypes: [featureType] }).candidates;
    };
    const tiedUnits = (level: UnitLevel, key: string) => {
      const ids = this.index.unitFeatureIds?.(level, key) ?? [];
      return ids.length === 0 ? [] : [...this.index.features(ids).values()];
    };
    const constraint = unitPolygonFilter(query, context, notes, (name) => this.exactCandidates(name), (feature) => this.index.attachGeometry(feature), byKey, tiedUnits);
    const misfit = (feature: Feature): string | null => contextMismatch(feature, context, constraint.decided) ?? constraint.outside(feature);
    const fits = (candidate: Candidate): boolean => {
      const feature = candidate.feature;
      if (query.featureTypes !== undefined && (feature.featureType === null || !query.featureTypes.includes(feature.featureType))) return false;
      if (query.geometryTypes !== undefined && !query.geometryTypes.includes(feature.geometryType)) return false;
      const reason = misfit(feature);
      if (reason !== null) {
        if (dropped.length < MAX_DROPPED) dropped.push({ candidate, reason });
        return false;
      }
      return true;
    };
    const limit = query.limit ?? DEFAULT_LIMIT;
    // Scoring costs grow with the pool: a short list unfiltered needs a smaller pool than a filtered one.
    const filtered = query.featureTypes !== undefined || query.geometryTypes !== undefined
      || Object.values(query.context).some((value) => value !== undefined && value !== '');
    // Unfiltered, nothing is dropped and one source merges nothing: the first `limit` plain exact
    // matches are the answer, and a common name ('San') need not load its thousands of features.
    const exact = this.exactCandidates(query.name, filtered ? undefined : limit).filter(fits);
    const pool = filtered ? FUZZY_POOL : Math.min(FUZZY_POOL, Math.max(MIN_FUZZY_POOL, 2 * limit));
    const kept = (feature: Feature) => misfit(feature) === null;
    const candidates = exact.length > 0 ? exact : this.readingCandidates(query, context, kept, fits, pool);
    const result = mergeSamePlaces(candidates, this.sourceRank(), limit).map(withNameKind);
    if (query.withGeometry) for (const candidate of result) this.index.attachGeometry(candidate.feature);
    return { candidates: result, dropped, notes };
  }

  /** The loaded place nearest a point that lies in the query's stated units, read as a lookup reads them (see nearest-place.ts). */
  nearestPlace(query: NearestPlaceQuery): NearbyPlace | null {
    this.forgetWhenChanged();
    return nearestPlace(this.index, query, this.resolve({ name: '', context: query.context }, []));
  }

  /**
   * Forgets what lookups keep between them (query words' matches, stated units' keys) when the index has
   * changed since: asked once a lookup, which reads the index as of one moment when its caller asks
   * for one (the store's asOfOneMoment), as every caller that serves records does.
   */
  private forgetWhenChanged(): void {
    const version = this.index.version();
    if (version !== this.keptVersion) {
      this.tokenMatches.clear();
      this.unitKeys.clear();
      this.keptVersion = version;
    }
  }

  /** The keys of the units one of whose names has `key` (NameIndex.unitKeys), kept between lookups. */
  private unitKeysOf(level: UnitLevel, key: string): string[] {
    const cacheKey = `${level}${key}`;
    let keys = this.unitKeys.get(cacheKey);
    if (keys === undefined) {
      keys = this.index.unitKeys!(level, key);
      this.unitKeys.keep(cacheKey, keys);
    }
    return keys;
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
    // A state, county or municipality written in another language, by a former name or by a code: the units it names.
    if (this.index.unitKeys !== undefined) {
      if (context.stateProvinceKey !== undefined) context.stateProvinceAliases = new Set(this.unitKeysOf(UNIT_FIELD_LEVELS.stateProvince, context.stateProvinceKey));
      if (context.countyKey !== undefined) context.countyAliases = new Set(this.unitKeysOf(UNIT_FIELD_LEVELS.county, context.countyKey));
      if (context.municipalityKey !== undefined) context.municipalityAliases = new Set(this.unitKeysOf(UNIT_FIELD_LEVELS.municipality, context.municipalityKey));
      context.unitsNamed = (level, key) => this.unitKeysOf(level, key);
    }
    if (context.unresolvedCountry !== undefined) notes.push(`country '${context.unresolvedCountry}' not recognised: not used to filter`);
    return context;
  }

  /**
   * Features whose folded name, alternate name or one of their readings equals a reading of `name`,
   * plain matches (score 1) first. With `enough`, and one source in the index (so that no place is
   * merged with a later one), stops once `enough` plain matches are found: reading on could only add
   * candidates after them (see EXACT_PAGE).
   */
  private exactCandidates(name: string, enough?: number): Candidate[] {
    return this.candidatesByKeys(nameVariants(name), enough);
  }

  /**
   * Features whose name equals a reading of the query's name in the older spelling of its country
   * or language (older-spelling.ts), each reading of `name` (abbreviations…) read so in turn.
   */
  private olderSpellingCandidates(query: CandidateQuery, context: ResolvedContext): Candidate[] {
    const reforms = spellingReforms(context.countryCodes, query.language);
    const readings = [...tilSpellingReadings(query.name, reforms), ...nameVariants(query.name).flatMap((variant) => olderSpellingReadings(variant.key, reforms)
      .map((older) => ({ key: older.key, change: variant.change ? `${variant.change}, ${older.change}` : older.change })))];
    return this.candidatesByKeys(readings.slice(0, MAX_OLDER_SPELLINGS));
  }

  /**
   * Candidates of a name not found as written, through its documented readings and then its near spellings.
   * The readings are read in turn, each only when those before it find nothing: the short form of an official
   * long form (shortFormCandidates) together with the older spellings, then the words joining a name's parts,
   * then near spellings. A short form is read beside the older spellings, listed first, and never shadowed by
   * them: it keeps every letter written, where an older spelling changes some ("Xalapa" is Xalapa de Enríquez
   * before it is a Jalapa). Both score READING_SCORE, so neither outranks the other and the choice among them
   * is left to a person (Chapman & Wieczorek 2020, Georeferencing Best Practices, §The Georeferencing
   * Process: a locality that may name several places is not resolved by picking one silently; its words on
   * ambiguity from memory). Listing the short form first is common practice, no source. Without a stated state the short form of the name as written is read in the stated countries
   * only beside what the other readings found, at no higher a score than the best of them, so that it never
   * stands alone where its uniqueness inside a state could not be checked ([CHOICE honoreeShortForms]).
   * @example matcher.lookup({ name: 'Xalapa', context: { countryCode: 'MX' }, olderSpellings: 'on', honoreeShortForms: 'on' })
   * // Xalapa de Enríquez (short form) beside the towns Jalapa (older spelling), all at 0.97
   */
  private readingCandidates(query: CandidateQuery, context: ResolvedContext, kept: (feature: Feature) => boolean, fits: (candidate: Candidate) => boolean, pool: number): Candidate[] {
    const stated = context.stateProvinceKey !== undefined;
    const shortForms = () => (query.honoreeShortForms === 'on' ? this.shortFormCandidates(query, context, kept).filter(fits) : []);
    const older = query.olderSpellings === 'on' ? this.olderSpellingCandidates(query, context).filter(fits) : [];
    const documented = besideOthers(stated ? shortForms() : [], older);
    const read = documented.length > 0 || query.connectorReadings !== 'on' ? documented : this.connectorCandidates(query, context, kept).filter(fits);
    const found = read.length > 0 || query.nearSpellings === 'off' ? read : this.fuzzyCandidates(query.name, context, pool).filter(fits);
    if (stated || found.length === 0) return found;
    const best = Math.max(...found.map((candidate) => candidate.score));
    return besideOthers(shortForms().map((candidate) => ({ ...candidate, score: Math.min(candidate.score, best) })), found);
  }

  /**
   * Features named "<the name, or its older spelling> de|del <honoree>" in a Spanish-speaking country
   * (short-form.ts), read only when no other feature the context keeps (`kept`) begins with that name:
   * "Texcoco" for Texcoco de Mora, "Jalapa" for Xalapa de Enríquez. Inside a stated state the name and its
   * older spellings are read; without one, only the name as written, in the stated countries (none stated:
   * none read). The features beginning with a name are read through the postings of its rarest word; a word
   * too common for the posting budget leaves the name unread (its state could not be checked).
   */
  private shortFormCandidates(query: CandidateQuery, context: ResolvedContext, kept: (feature: Feature) => boolean): Candidate[] {
    const stated = context.stateProvinceKey !== undefined;
    if (!stated && context.countryCodes.size === 0) return [];
    const folded = foldName(query.name);
    const older = stated && query.olderSpellings === 'on' ? olderSpellingReadings(folded, spellingReforms(context.countryCodes, query.language)).slice(0, MAX_OLDER_SPELLINGS) : [];
    const found: Candidate[] = [];
    for (const reading of [{ key: folded } as NameVariant, ...older]) {
      const named = this.namesByRarestWord(reading.key, context);
      if (named === 'too common') return [];
      if (named === 'not indexed') continue;
      const longer = named.filter(({ names }) => names.some((name) => foldName(name).startsWith(`${reading.key} `)));
      const features = longer.length === 0 ? new Map<number, Feature>() : this.index.features(longer.map(({ id }) => id));
      for (const { id, names } of longer) {
        const feature = features.get(id);
        if (feature === undefined || !kept(feature)) continue;
        const long = names.find((name) => honoreeLongForm(name, reading.key));
        // Another place of the state begins with the name: which one the text means is for a person to say.
        if (long === undefined || !honoreeCountry(feature.countryCode)) return [];
        const which = long === feature.name ? 'name' : `alternate name '${long}'`;
        const changes = [reading.change && `${reading.change} in the query`, `'${reading.key}' read as the short form of the official long form "X de <honoree>" [CHOICE honoreeShortForms, src/georef/method-defaults.ts]`].filter(Boolean);
        found.push({ feature, score: READING_SCORE, matchedName: long, why: `exact ${which} with ${changes.join('; ')}` });
      }
    }
    return found;
  }

  /**
   * Features whose name is the query's with the words joining its parts left out, added or changed
   * (connector-words.ts: "San Manuel Colohete" for San Manuel de Colohete), read only inside a stated country and
   * state, each kept by the context (`kept`), through the postings of the rarest other word.
   */
  private connectorCandidates(query: CandidateQuery, context: ResolvedContext, kept: (feature: Feature) => boolean): Candidate[] {
    const folded = foldName(query.name);
    const bare = withoutConnectors(folded);
    if (bare === null || context.stateProvinceKey === undefined || context.countryCodes.size === 0) return [];
    const named = this.namesByRarestWord(bare, context);
    if (typeof named === 'string') return [];
    const joined = named.flatMap(({ id, names }) => {
      const written = names.find((name) => foldName(name) !== folded && withoutConnectors(foldName(name)) === bare);
      return written === undefined ? [] : [{ id, written }];
    });
    const features = joined.length === 0 ? new Map<number, Feature>() : this.index.features(joined.map(({ id }) => id));
    return joined.flatMap(({ id, written }) => {
      const feature = features.get(id);
      if (feature === undefined || !kept(feature)) return [];
      const which = written === feature.name ? 'name' : `alternate name '${written}'`;
      const change = `'${folded}' read as '${foldName(written)}', the words joining its parts left out, added or changed [CHOICE connectorReadings, src/georef/method-defaults.ts]`;
      return [{ feature, score: READING_SCORE, matchedName: written, why: `exact ${which} with ${change}` }];
    });
  }

  /**
   * The names of the features of the context's countries holding the rarest word of `key`, by their ids, read
   * through that word's postings: 'not indexed' when a word of the key is in no stored name, 'too common' when
   * the rarest word's postings exceed the posting budget (the names could not all be read).
   */
  private namesByRarestWord(key: string, context: ResolvedContext): { id: number; names: string[] }[] | 'not indexed' | 'too common' {
    const words = key.split(' ').map((word) => this.index.token(word));
    if (key === '' || words.some((word) => word === undefined)) return 'not indexed';
    const rarest = (words as IndexedToken[]).reduce((a, b) => (b.df < a.df ? b : a));
    if (rarest.df > POSTING_BUDGET) return 'too common';
    const ids = [...new Set(this.index.postings([rarest.id], countryList(context), POSTING_BUDGET).map((posting) => posting.feature))];
    return this.index.namesOf(ids);
  }

  /** Features whose folded name, alternate name or one of their readings equals one of the keys (`enough` as for exactCandidates). */
  private candidatesByKeys(variants: readonly NameVariant[], enough?: number): Candidate[] {
    const found = new Map<number, Candidate>();
    let plain = 0;
    let oneSource: boolean | undefined;
    const done = () => enough !== undefined && plain >= enough && (oneSource ??= (this.index.sourceRanks?.().size ?? 2) <= 1);
    for (const variant of variants) {
      // With `enough`, the first page of ids alone: most often it holds every feature asked for.
      let ids = this.index.featureIdsByName(variant.key, enough === undefined ? undefined : EXACT_PAGE);
      // One statement a page of a reading's features: a common name ('San') has thousands.
      for (let start = 0; start < ids.length; start += EXACT_PAGE) {
        if (done()) break;
        const page = ids.slice(start, start + EXACT_PAGE).filter((id) => !found.has(id));
        const features = page.length === 0 ? new Map<number, Feature>() : this.index.features(page);
        for (const id of page) {
          const feature = features.get(id);
          if (feature === undefined) continue;
          const stored = storedReading(feature, variant.key);
          const which = stored.written === feature.name ? 'name' : `alternate name '${stored.written}'`;
          const changes = [variant.change && `${variant.change} in the query`, stored.change && `${stored.change} in the gazetteer`].filter(Boolean);
          if (changes.length === 0) plain++;
          found.set(id, {
            feature,
            score: changes.length === 0 ? 1 : READING_SCORE,
            matchedName: stored.written,
            why: changes.length === 0 ? `exact ${which}` : `exact ${which} with ${changes.join('; ')}`,
          });
        }
        // The rest of the ids (the same order), when the first page was full and did not hold enough.
        if (start === 0 && ids.length === EXACT_PAGE && enough !== undefined && !done()) ids = this.index.featureIdsByName(variant.key);
      }
    }
    return [...found.values()].sort((a, b) => b.score - a.score);
  }

  /**
   * Fuzzy lookup through the token index: rarest query tokens first, within a fixed posting budget.
   * A query word that is itself a stored token is first taken as written, and a word of a longer name
   * found within one edit without its two-edit neighbours (see matchingTokens): most of a lookup's
   * index seeks are saved. Only when no shortlisted name then comes within RETRY_NAME_EDITS of the
   * query (the typing error made another stored word, say), not even once the features read are
   * checked for the closest words left unread (a name of several words), is the lookup repeated with
   * every word's neighbours within one edit, and when no name then comes within one edit, with all of them.
   */
  private fuzzyCandidates(name: string, context: ResolvedContext, poolSize: number, reach: Reach = 'first',
    reads: LookupReads = { foldedNames: new Map(), postings: new Map(), partnerPostings: new Map(), held: new Map() }): Candidate[] {
    const folded = foldName(name);
    const queryTokens = [...new Set(folded.split(' ').filter((token) => token !== ''))];
    if (queryTokens.length === 0) return [];
    // Every stored token that matches a query token, closest and rarest first, as many as the posting
    // budget holds. A token that does not fit (a common 'rio', 'do', 'sul') is read only through the
    // features the chosen tokens found, or, when no token fits at all, together with the next query token.
    const views = queryTokens.map((token) => this.matchingTokens(token, queryTokens.length > 1, reach, poolSize));
    const matched = closestRarestFirst(views.flatMap((view, index) => view.matches.map(({ id, edits, df, text }) => ({ id, edits, df, text, index }))));
    const chosen: typeof matched = [];
    let budget = POSTING_BUDGET;
    for (const match of matched) {
      if (match.df > budget) continue;
      chosen.push(match);
      budget -= match.df;
    }
    const byToken = new Map<number, { index: number; weight: number }[]>();
    const addWeight = (id: number, index: number, weight: number) => {
      const weights = byToken.get(id);
      if (weights === undefined) byToken.set(id, [{ index, weight }]);
      else weights.push({ index, weight });
    };
    const weigh = ({ id, edits, index }: TokenMatch) => {
      const optional = OPTIONAL_GENERIC_WORDS.has(queryTokens[index]) || LEADING_ARTICLES.has(queryTokens[index]);
      // About the number of letters the token contributes to the match: long tokens found with few
      // edits say most about which feature is meant.
      const weight = (optional ? 0.5 : 1) * Math.max(0.5, queryTokens[index].length - 1.5 * edits);
      addWeight(id, index, weight);
    };
    for (const match of chosen) weigh(match);
    const rows = this.postingsOf([...byToken.keys()], context, reads.postings);
    // A lone word: the features named by a neighbour too common for the budget ('santiago' for
    // 'santigao') are read through the names, a few of each, closest and rarest first.
    if (queryTokens.length === 1 && countryList(context) === null) {
      const read = new Set(chosen.map((match) => match.id));
      for (const match of matched.filter((m) => !read.has(m.id)).slice(0, WHOLE_NAME_TOKENS)) {
        weigh(match);
        rows.push(this.index.featureIdsByName(match.text, SHORTLIST_PER_TOKEN).map((feature) => ({ feature, token: match.id })));
      }
    }
    const common = this.commonTokenPostings(matched, chosen, context, reads.partnerPostings);
    for (const { id, index } of common.tokens) addWeight(id, index, queryTokens[index].length);
    // A partner counts for its word as a read token would: the feature holds both words.
    if (common.partners.length > 0) {
      const weighed = new Set(chosen.map((match) => `${match.id}:${match.index}`));
      for (const partner of common.partners) if (!weighed.has(`${partner.id}:${partner.index}`)) weigh(partner);
    }
    const pool = new Map<number, PoolEntry>();
    const credit = (postings: readonly Posting[]) => {
      // Postings come in runs of one token: its weights are looked up once a run.
      let runToken = -1;
      let tokenWeights: readonly { index: number; weight: number }[] = [];
      for (const { feature, token } of postings) {
        let entry = pool.get(feature);
        if (entry === undefined) {
          entry = { id: feature, weights: new Array<number>(queryTokens.length).fill(0), token, weight: 0 };
          pool.set(feature, entry);
        }
        if (token !== runToken) {
          runToken = token;
          tokenWeights = byToken.get(token) ?? [];
        }
        for (const { index, weight } of tokenWeights) {
          if (weight > entry.weights[index]) entry.weights[index] = weight;
          if (weight > entry.weight) {
            entry.token = token;
            entry.weight = weight;
          }
        }
      }
    };
    for (const postings of rows) credit(postings);
    credit(common.rows);
    // The token weights only shortlist, features of many different tokens before many features of one
    // token; a common token skipped above ("monte") counts for nobody, so the shortlist is re-ranked by
    // the edit distance of the whole name before fuse.js scores the best.
    let shortlist = shortlistByWeight(pool.values());
    let closest = this.closestNames(shortlist.map(([id]) => id), folded, reads.foldedNames);
    let fewestEdits = Math.min(...[...closest.values()].map((entry) => entry.edits));
    // A name of several words whose shortlist holds no name near the query: its features read so far
    // are checked for the words written as stored but left unread (too common for the budget, "santa"
    // for "santa salto castilco"), which count for them as read words would; one probe a feature and
    // word, fewer seeks than the repeated lookup that the shortlist would otherwise call for.
    if (queryTokens.length > 1 && fewestEdits >= RETRY_NAME_EDITS && pool.size > 0) {
      // Only words stored as written: checking the common neighbours of a misspelt word too found 10
      // more names of 1,904 two-error queries at 13 M names, but raised their 99th percentile by a sixth.
      const unread = closestUnread(matched, new Set(chosen.map((match) => match.id)), closestEdits(matched)).filter((match) => match.edits === 0).slice(0, MAX_PARTNERS);
      if (unread.length > 0) {
        for (const match of unread) weigh(match);
        credit(this.heldAmong(unread.map((match) => match.id), [...pool.keys()], reads.held));
        shortlist = shortlistByWeight(pool.values());
        closest = this.closestNames(shortlist.map(([id]) => id), folded, reads.foldedNames);
        fewestEdits = Math.min(...[...closest.values()].map((entry) => entry.edits));
      }
    }
    const keysRead = views.map((view) => view.keysRead);
    const neighboursLeftUnread = keysRead.some((read) => read !== 'all');
    // A lone word read within one edit: its two-edit neighbours could only come after the names
    // within one edit, so they are read only when those do not fill the pool (the answer is the same).
    const poolWithinOneEdit = queryTokens.length > 1 || keysRead[0] !== 'one edit'
      || [...closest.values()].filter((entry) => entry.edits <= 1).length >= poolSize;
    if (neighboursLeftUnread) {
      // Repeated within one edit of every word first: a name within one edit found then is closer
      // than any that two-edit neighbours add.
      const tooFar = fewestEdits >= RETRY_NAME_EDITS;
      if (reach === 'first' && tooFar && keysRead.includes('none')) return this.fuzzyCandidates(name, context, poolSize, 'one edit', reads);
      if ((reach === 'first' && (tooFar || !poolWithinOneEdit)) || (reach === 'one edit' && fewestEdits > 1)) {
        return this.fuzzyCandidates(name, context, poolSize, 'all', reads);
      }
    }
    const seen = new Map<string, number>();
    const best = shortlist
      .map(([id, weight]) => {
        const { edits, key } = closest.get(id) ?? { edits: Infinity, key: '' };
        return { id, weight, edits, key, repeat: 0 };
      })
      .sort((a, b) => a.edits - b.edits || b.weight - a.weight)
      .map((entry) => {
        entry.repeat = seen.get(entry.key) ?? 0;
        seen.set(entry.key, entry.repeat + 1);
        return entry;
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
   * ('bobaja' in a large gazetteer) together with a token matching another word of the query (the
   * partners), with the postings of both, read through the postings of whichever side is rarer for
   * each partner with an index probe for the other; none when
   * every query word's closest match was read already. The other words' closest matches are
   * partners, and then their farther neighbours, rarest first, as far as COMMON_TOKEN_LIMIT postings
   * allow ('corti' for 'cori' beside a common 'marina', which alone it would never meet).
   */
  private commonTokenPostings(matched: TokenMatch[], chosen: TokenMatch[], context: ResolvedContext, readBefore: Map<string, Posting[]>): {
    tokens: TokenMatch[]; partners: TokenMatch[]; rows: { feature: number; token: number }[];
  } {
    const closest = closestEdits(matched);
    const skipped = closestUnread(matched, new Set(chosen.map((match) => match.id)), closest);
    if (skipped.length === 0) return { tokens: [], partners: [], rows: [] };
    const driver = skipped.reduce((a, b) => (b.df < a.df ? b : a));
    const others = matched.filter((match) => match.index !== driver.index);
    const partners = others.filter((match) => match.edits === closest.get(match.index)).sort((a, b) => a.df - b.df).slice(0, MAX_PARTNERS);
    let partnerPostings = partners.reduce((sum, match) => sum + match.df, 0);
    for (const match of others.filter((m) => m.edits > closest.get(m.index)!).sort((a, b) => a.edits - b.edits || a.df - b.df)) {
      if (partners.length >= MAX_FAR_PARTNERS || partnerPostings + match.df > COMMON_TOKEN_LIMIT) break;
      partners.push(match);
      partnerPostings += match.df;
    }
    // Neither side rare enough to read: the common token stays unread.
    if (driver.df > COMMON_TOKEN_LIMIT && partnerPostings > COMMON_TOKEN_LIMIT) return { tokens: [], partners: [], rows: [] };
    if (partners.length === 0) return { tokens: [], partners: [], rows: [] };
    const key = `${driver.id}:${partners.map((partner) => partner.id).join(',')}`;
    let rows = readBefore.get(key);
    if (rows === undefined) {
      rows = this.index.postingsWithPartner(driver, partners, countryList(context), POSTING_BUDGET);
      readBefore.set(key, rows);
    }
    return { tokens: [driver], partners, rows };
  }

  /**
   * The postings of these tokens held by these features, one probe a feature and token; a pair
   * probed earlier in the same lookup (`probed`, by token) is not probed again.
   */
  private heldAmong(tokens: number[], features: number[], probed: Map<number, Map<number, boolean>>): Posting[] {
    const unprobed = features.filter((feature) => tokens.some((token) => probed.get(token)?.has(feature) !== true));
    if (unprobed.length > 0) {
      for (const token of tokens) {
        const byFeature = probed.get(token) ?? new Map<number, boolean>();
        probed.set(token, byFeature);
        for (const feature of unprobed) byFeature.set(feature, false);
      }
      for (const { feature, token } of this.index.postingsAmong(tokens, unprobed)) probed.get(token)!.set(feature, true);
    }
    // In the order of the store's answer, by token and feature: the few held features sorted, not all of them.
    return [...new Set(tokens)].sort((a, b) => a - b).flatMap((token) => {
      const held = probed.get(token)!;
      return features.filter((feature) => held.get(feature) === true).sort((a, b) => a - b).map((feature) => ({ feature, token }));
    });
  }

  /**
   * Every posting of these tokens (their postings together fit the budget), as one list a token in
   * token order; a token's postings read earlier in the same lookup (`read`) are not read again.
   */
  private postingsOf(tokens: number[], context: ResolvedContext, read: Map<number, Posting[]>): Posting[][] {
    const unread = tokens.filter((token) => !read.has(token));
    if (unread.length > 0) {
      for (const token of unread) read.set(token, []);
      for (const row of this.index.postings(unread, countryList(context), POSTING_BUDGET)) read.get(row.token)!.push(row);
    }
    return [...tokens].sort((a, b) => a - b).map((token) => read.get(token)!);
  }

  /**
   * Stored tokens within the allowed edits of a query token, plus the words its abbreviation stands
   * for, as far as `reach` says (a word of 6 letters or more within one edit, without its two-edit
   * neighbours, unless none is that close, or, for a lone word, those that close hold fewer features
   * than `poolSize`; a word of a longer name, or a common word, found within one edit is never read
   * further). Kept between lookups, by what found them: a lookup reaching further reads only
   * the deletion keys not read yet.
   */
  private matchingTokens(token: string, severalTokens: boolean, reach: Reach, poolSize: number): WordView {
    // Words such as 'san', 'rio' or 'santa' recur in most lookups; their matches hold until the file
    // changes (the index's version: another connection's commit or the store's own write; see forgetWhenChanged).
    const cacheKey = `${severalTokens ? '+' : '-'}${token}`;
    let word = this.tokenMatches.get(cacheKey);
    if (word === undefined) {
      word = { exact: this.exactTokens(token, severalTokens) };
      this.tokenMatches.keep(cacheKey, word);
    }
    if (token.length < MIN_FUZZY_TOKEN_LENGTH) return { matches: word.exact, keysRead: 'all' };
    // A word of a longer name stored as written and too common for the posting budget ('santa', 'lake')
    // is most likely written right: its neighbours (a thousand and more at 13 M names) are never read.
    // A name of it is found through its other words, checked against it (commonTokenPostings and the
    // shortlist check in fuzzyCandidates). At 13 M names lookups of several words read 18 % (one
    // typing error) and 11 % (two) fewer rows, with as many intended names in the first five.
    const common = word.exact.some((match) => match.df > POSTING_BUDGET);
    if (severalTokens && common) return { matches: word.exact, keysRead: 'all' };
    if (word.exact.length > 0 && reach === 'first') return { matches: word.exact, keysRead: 'none' };
    // Keys within one edit are all the keys of a word shorter than MIN_TWO_EDIT_LENGTH.
    if (word.oneEdit === undefined) {
      word.oneEdit = this.nearTokens(token, oneEditQueryKeys(token), word.exact);
      this.tokenMatches.keep(cacheKey, word);
    }
    const oneEdit = [...word.exact, ...word.oneEdit];
    if (token.length < MIN_TWO_EDIT_LENGTH) return { matches: oneEdit, keysRead: 'all' };
    // Two-edit neighbours are the most costly seeks (thousands of words in a world-size index, most of
    // them sharing only a common prefix or suffix with the query), and are not read for a common word
    // stored as written (most likely written right), nor for a word of a longer name found within one
    // edit (a name's two errors most likely lie in two of its words): at 13 M names the two-error
    // lookups' 99th percentile of words read fell by a third, and one in 1,904 lost its name from the
    // first five.
    const withinOneEdit = oneEdit.filter((match) => match.edits <= 1);
    // A lone word's names within one edit hold one of these words: too few to fill the pool, its
    // two-edit neighbours will be wanted (see fuzzyCandidates), and are read at once.
    const mayFillPool = severalTokens || withinOneEdit.reduce((sum, match) => sum + match.df, 0) >= poolSize;
    if ((reach !== 'all' || common || severalTokens) && withinOneEdit.length > 0 && mayFillPool) return { matches: oneEdit, keysRead: 'one edit' };
    if (word.rest === undefined) {
      const read = new Set(oneEditQueryKeys(token));
      word.rest = this.nearTokens(token, queryTokenKeys(token).filter((key) => !read.has(key)), oneEdit);
      this.tokenMatches.keep(cacheKey, word);
    }
    return { matches: [...oneEdit, ...word.rest], keysRead: 'all' };
  }

  /** The stored tokens written as `token` or as the words its abbreviation stands for. */
  private exactTokens(token: string, severalTokens: boolean): TokenMatchRow[] {
    const found = new Map<number, TokenMatchRow>();
    const exactWords = [token, ...(severalTokens && Object.hasOwn(ABBREVIATIONS, token) ? ABBREVIATIONS[token] : []).flatMap((words) => words.split(' '))];
    for (const word of exactWords) {
      const row = this.index.token(word);
      if (row !== undefined) found.set(row.id, { id: row.id, edits: 0, df: row.df, text: word });
    }
    return [...found.values()];
  }

  /** The stored tokens within the allowed edits of `token` that these deletion keys find, other than `known`. */
  private nearTokens(token: string, keys: number[], known: readonly TokenMatchRow[]): TokenMatchRow[] {
    const seen = new Set(known.map((match) => match.id));
    const found: TokenMatchRow[] = [];
    // One statement: each distinct token once (a token shares many keys with a query), as arrays.
    for (const [id, stored, df] of keys.length === 0 ? [] : this.index.tokensByDeletionKeys(keys)) {
      if (seen.has(id)) continue;
      const edits = editDistance(token, stored, maxTokenEdits(stored));
      if (edits <= maxTokenEdits(stored)) found.push({ id, edits, df, text: stored });
    }
    return found;
  }

  /**
   * For each feature, its folded name or alternate name closest to a folded query, with the edits.
   * `foldedNames` keeps the folded names read during one lookup: a repeated lookup (more neighbours)
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

/**
 * A kept word's estimated bytes in the heap (see WORD_CACHE_BYTES).
 * @example wordMatchBytes({ exact: [{ id: 1, edits: 0, df: 3, text: 'san' }] }) // 200 + 80 + 6
 */
function wordMatchBytes(word: WordMatches): number {
  let bytes = WORD_BYTES;
  for (const rows of [word.exact, word.oneEdit ?? [], word.rest ?? []]) for (const row of rows) bytes += NEIGHBOUR_BYTES + 2 * row.text.length;
  return bytes;
}

/** A feature found through the postings, with the weight of each query word's best token and its best token. */
interface PoolEntry {
  id: number;
  weights: number[];
  token: number;
  weight: number;
}

/**
 * The SHORTLIST features of the greatest total weight as [id, weight], best first; among equal
 * weights, the first SHORTLIST_PER_TOKEN of each best token before further ones of it, then in the
 * order found. The same order as sorting the whole pool, got by grouping it by weight (a few
 * distinct weights) and ordering only the groups that are taken.
 * @example shortlistByWeight([{ id: 7, weights: [6, 0], token: 3, weight: 6 }]) // [[7, 6]]
 */
function shortlistByWeight(entries: Iterable<PoolEntry>): [number, number][] {
  const byWeight = new Map<number, PoolEntry[]>();
  for (const entry of entries) {
    let weight = 0;
    for (const tokenWeight of entry.weights) weight += tokenWeight;
    const group = byWeight.get(weight);
    if (group === undefined) byWeight.set(weight, [entry]);
    else group.push(entry);
  }
  const shortlist: [number, number][] = [];
  const perToken = new Map<number, number>();
  for (const weight of [...byWeight.keys()].sort((a, b) => b - a)) {
    if (shortlist.length >= SHORTLIST) break;
    const group = byWeight.get(weight)!.map(({ id, token }) => {
      const repeat = perToken.get(token) ?? 0;
      perToken.set(token, repeat + 1);
      return { id, repeat: Math.floor(repeat / SHORTLIST_PER_TOKEN) };
    });
    // Array sort is stable: equal repeats stay in the order found.
    group.sort((a, b) => a.repeat - b.repeat);
    for (const { id } of group.slice(0, SHORTLIST - shortlist.length)) shortlist.push([id, weight]);
  }
  return shortlist;
}

/**
 * Matches by fewest edits, then fewest postings, then as given (a stable order): one whole-number key
 * a match, sorted without a callback, for the thousands of matches of words' two-edit neighbours.
 * @example closestRarestFirst([{ edits: 1, df: 3 }, { edits: 0, df: 9 }]) // [{ edits: 0, df: 9 }, { edits: 1, df: 3 }]
 */
function closestRarestFirst<T extends { edits: number; df: number }>(matches: T[]): T[] {
  let mostEdits = 0;
  let mostPostings = 0;
  for (const { edits, df } of matches) {
    if (edits > mostEdits) mostEdits = edits;
    if (df > mostPostings) mostPostings = df;
  }
  const span = (mostPostings + 1) * matches.length;
  if (!Number.isSafeInteger((mostEdits + 1) * span)) return matches.sort((a, b) => a.edits - b.edits || a.df - b.df);
  const keys = new Float64Array(matches.length);
  for (let i = 0; i < matches.length; i++) keys[i] = matches[i].edits * span + matches[i].df * matches.length + i;
  keys.sort();
  return Array.from(keys, (key) => matches[key % matches.length]);
}

/** The fewest edits of any match of each query word, by the word's index. */
function closestEdits(matches: readonly TokenMatch[]): Map<number, number> {
  const closest = new Map<number, number>();
  for (const match of matches) closest.set(match.index, Math.min(closest.get(match.index) ?? Infinity, match.edits));
  return closest;
}

/**
 * The matches as close as any of their word's (`closest`, see closestEdits), whose postings were not read (`read`), in the order given.
 * @example closestUnread(matches, new Set(), closestEdits(matches)) // for [{ id: 1, edits: 0, index: 0 }, { id: 2, edits: 1, index: 0 }]: [{ id: 1, … }]
 */
function closestUnread(matches: readonly TokenMatch[], read: ReadonlySet<number>, closest: ReadonlyMap<number, number>): TokenMatch[] {
  return matches.filter((match) => !read.has(match.id) && match.edits === closest.get(match.index));
}

/**
 * The candidates `first` and then `others`, each feature once (where both hold it, as in `first`).
 * @example besideOthers([xalapaDeEnriquez], [jalapaTabasco, jalapaGuerrero]) // [xalapaDeEnriquez, jalapaTabasco, jalapaGuerrero]
 */
function besideOthers(first: readonly Candidate[], others: readonly Candidate[]): Candidate[] {
  const held = new Set(first.map(({ feature }) => `${feature.sourceId}:${feature.featureId}`));
  return [...first, ...others.filter(({ feature }) => !held.has(`${feature.sourceId}:${feature.featureId}`))];
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
