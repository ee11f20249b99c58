/**
 * The deletion-neighbourhood index keys and the edit distance that checks what they find. Pure.
 *
 * Two strings within k edits (insertion, deletion, substitution, adjacent transposition) share a
 * string reachable by at most k deletions from each. Stored tokens keep the hashes of their variants
 * with up to one letter deleted (3 letters and more), up to two (6 to 9 letters), and tokens of 10
 * letters or more a front and a back half, each with up to one letter deleted and keyed by the
 * token's length and the side (two edits leave one half within one edit; whole-token two-deletion
 * sets would be too large there). A query looks up its own zero-, one- and (from 6 letters)
 * two-deletion variants and the halves it would share with tokens of each length within two of its
 * own (queryTokenKeys says which). So a query finds every stored token within one edit, and every
 * stored token of 6 letters or more within two. Keys are never shorter than 4 letters for two-edit
 * matches, which keeps each lookup selective in a vocabulary of hundreds of thousands of tokens.
 */

/** Tokens shorter than this are found only exactly: one deletion of a 2-letter token matches too much. */
export const MIN_FUZZY_TOKEN_LENGTH = 3;
/** Tokens of at least this length are found within two edits. */
export const MIN_TWO_EDIT_LENGTH = 6;
/** Stored tokens of at least this length are indexed by halves instead of two-deletion variants. */
export const MIN_HALVES_LENGTH = 10;

const FNV_OFFSET = 0x811c9dc5;
const FNV_PRIME = 0x01000193;

/**
 * 32-bit FNV-1a hash of a string's UTF-16 code units (collisions only add candidates that the edit
 * distance check then removes).
 * @example hashKey('abc') // 440920331
 */
export function hashKey(text: string): number {
  let hash = FNV_OFFSET;
  for (let i = 0; i < text.length; i++) hash = Math.imul(hash ^ text.charCodeAt(i), FNV_PRIME);
  return hash | 0;
}

/**
 * Adds to `into` hashKey(tag + variant) for `text` and every variant of it with up to `deletions`
 * (0, 1 or 2) letters deleted and fewer than `shorterThan` letters, hashing in place: no variant
 * string is built (a million-name import hashes tens of millions of them).
 */
function addDeletionKeys(text: string, deletions: number, into: Set<number>, tag = '', shorterThan = Infinity): void {
  let start = FNV_OFFSET;
  for (let i = 0; i < tag.length; i++) start = Math.imul(start ^ tag.charCodeAt(i), FNV_PRIME);
  const n = text.length;
  if (n < shorterThan) into.add(hashSkipping(text, start, -1, -1));
  if (deletions >= 1 && n - 1 < shorterThan) for (let i = 0; i < n; i++) into.add(hashSkipping(text, start, i, -1));
  if (deletions >= 2 && n - 2 < shorterThan) for (let i = 0; i < n; i++) for (let j = i + 1; j < n; j++) into.add(hashSkipping(text, start, i, j));
}

/**
 * The FNV-1a hash, from `start`, of `text` but its letters at `first` and `second` (-1 for none). A
 * function of its own, not a closure made a call: an import makes millions of calls.
 */
function hashSkipping(text: string, start: number, first: number, second: number): number {
  let hash = start;
  for (let i = 0; i < text.length; i++) if (i !== first && i !== second) hash = Math.imul(hash ^ text.charCodeAt(i), FNV_PRIME);
  return hash | 0;
}

/** Keys of one half ('<' front, '>' back) of a token of `length` letters, with up to `deletions` letters deleted. */
function halfKeys(length: number, side: '<' | '>', half: string, into: Set<number>, deletions = 1): void {
  addDeletionKeys(half, deletions, into, String.fromCharCode(length) + side);
}

/**
 * Hashes a stored token is indexed by (see the module comment); none below MIN_FUZZY_TOKEN_LENGTH.
 * @example storedTokenKeys('abc').length // 4: 'abc', 'bc', 'ac', 'ab'
 */
export function storedTokenKeys(token: string): number[] {
  const keys = new Set<number>();
  if (token.length < MIN_FUZZY_TOKEN_LENGTH) return [];
  const twoEdits = token.length >= MIN_TWO_EDIT_LENGTH && token.length < MIN_HALVES_LENGTH;
  addDeletionKeys(token, twoEdits ? 2 : 1, keys);
  if (token.length >= MIN_HALVES_LENGTH) {
    const half = token.length >> 1;
    halfKeys(token.length, '<', token.slice(0, half), keys);
    halfKeys(token.length, '>', token.slice(half), keys);
  }
  return [...keys];
}

/**
 * Hashes a query token looks up: its zero-, one- and (from MIN_TWO_EDIT_LENGTH letters) two-deletion
 * variants, and for each stored length within two of its own (from MIN_HALVES_LENGTH), the front and
 * back halves such a token would share with it.
 * @example queryTokenKeys('rosario').length > 0 // true
 */
export function queryTokenKeys(token: string): number[] {
  const keys = new Set<number>();
  // A variant of MIN_HALVES_LENGTH letters or more can only meet a stored token that long, which its
  // halves find (within two edits, as the variant would): such variants are left out.
  if (token.length < MIN_HALVES_LENGTH + 2) addDeletionKeys(token, token.length >= MIN_TWO_EDIT_LENGTH ? 2 : 1, keys, '', MIN_HALVES_LENGTH);
  for (let length = Math.max(MIN_HALVES_LENGTH, token.length - 2); length <= token.length + 2; length++) {
    const half = length >> 1;
    // The half within one edit is shorter in the query only when the query lost letters (a stored
    // token longer than the query), longer only when it gained some.
    const lowest = length < token.length ? 0 : -1;
    const highest = length > token.length ? 0 : 1;
    // Fronts with a letter deleted, backs whole, are enough: a stored token within two edits has its
    // front within one edit of one of these fronts, or its back untouched, or (two letters swapped
    // across its middle) its back but the first letter, which is the back one letter shorter. A query
    // shorter than the stored token lost letters, and its fronts too are looked up whole. Backs with a
    // letter deleted would find the thousands of words sharing a common ending ('-ville') for nothing.
    const frontDeletions = length > token.length ? 0 : 1;
    for (let shift = lowest; shift <= highest; shift++) {
      const frontLength = half + shift;
      const backLength = length - half + shift;
      if (frontLength > 0 && frontLength <= token.length) halfKeys(length, '<', token.slice(0, frontLength), keys, frontDeletions);
      if (backLength > 0 && backLength <= token.length) halfKeys(length, '>', token.slice(token.length - backLength), keys, 0);
    }
  }
  return [...keys];
}

/**
 * Hashes of a query token's zero- and one-deletion variants, whatever its length: they meet the keys
 * of every stored token within one edit (every stored token keeps its own one-deletion variants), at
 * a fraction of queryTokenKeys's seeks for a token of 6 letters or more.
 * @example oneEditQueryKeys('rosario').length // 8: 'rosario' and its 7 one-deletion variants
 */
export function oneEditQueryKeys(token: string): number[] {
  const keys = new Set<number>();
  addDeletionKeys(token, 1, keys);
  return [...keys];
}

const rows = [new Int32Array(64), new Int32Array(64), new Int32Array(64)];
/**
 * The second string's code units, copied once a call, and the first's read once a row: the inner loop
 * reads numbers instead of calling charCodeAt on strings of many internal kinds (a stored token sliced
 * from a row, a folded name), which V8 dispatched through its slowest property lookup, four times a cell.
 */
let codesB = new Uint16Array(64);

/**
 * Edit distance with adjacent transpositions (optimal string alignment), exact up to `max`: any
 * larger distance is reported as max + 1. With a finite `max` only the cells within `max` of the
 * diagonal are computed (an alignment of cost at most `max` never leaves them; the cells beside the
 * band stand for "more than max"), and the rows stop early. O(|a|·min(|b|, 2·max + 1)).
 * @example editDistance('rosario', 'rosraio') // 1
 * @example editDistance('rosario', 'lima', 2) // 3
 */
export function editDistance(a: string, b: string, max = Infinity): number {
  if (a === b) return 0;
  const n = a.length;
  const m = b.length;
  if (Math.abs(n - m) > max) return max + 1;
  if (m + 2 > rows[0].length) for (let i = 0; i < 3; i++) rows[i] = new Int32Array(m + 2);
  if (m > codesB.length) codesB = new Uint16Array(m);
  const y = codesB;
  for (let j = 0; j < m; j++) y[j] = b.charCodeAt(j);
  // Cells more than `band` from the diagonal cost more than max; `over` stands for them (above max,
  // and above every distance when max is not finite).
  const band = Math.min(max, Math.max(n, m));
  const over = Math.min(max, n + m) + 1;
  let previous2 = rows[0];
  let previous = rows[1];
  let current = rows[2];
  const firstRowEnd = Math.min(band, m);
  for (let j = 0; j <= firstRowEnd; j++) previous[j] = j;
  previous[firstRowEnd + 1] = over;
  let letterBefore = -1;
  for (let i = 1; i <= n; i++) {
    const first = i - band > 1 ? i - band : 1;
    const last = i + band < m ? i + band : m;
    current[first - 1] = first === 1 ? i : over;
    let rowMinimum = first === 1 ? i : over;
    const letter = a.charCodeAt(i - 1);
    for (let j = first; j <= last; j++) {
      const cost = letter === y[j - 1] ? 0 : 1;
      let best = Math.min(previous[j] + 1, current[j - 1] + 1, previous[j - 1] + cost);
      if (j > 1 && letter === y[j - 2] && letterBefore === y[j - 1]) {
        best = Math.min(best, previous2[j - 2] + 1);
      }
      current[j] = best;
      if (best < rowMinimum) rowMinimum = best;
    }
    // The next row reads one cell past this row's band.
    current[last + 1] = over;
    if (rowMinimum > max) return max + 1;
    letterBefore = letter;
    const oldest = previous2;
    previous2 = previous;
    previous = current;
    current = oldest;
  }
  return Math.min(previous[m], max + 1);
}

/**
 * Largest edit distance accepted between a query token and a stored token: 2 for stored tokens of
 * MIN_TWO_EDIT_LENGTH letters or more, 1 for shorter ones (common practice, no source).
 * @example maxTokenEdits('rio') // 1
 */
export function maxTokenEdits(storedToken: string): number {
  return storedToken.length >= MIN_TWO_EDIT_LENGTH ? 2 : 1;
}
