/**
 * The deletion-neighbourhood index keys and the edit distance that checks what they find. Pure.
 *
 * Two strings within one edit (insertion, deletion, substitution, adjacent transposition) share a
 * string reachable by at most one deletion from each. The store keeps the hashes of every one-deletion
 * variant of each distinct folded name token; a query looks up the hashes of its tokens' zero-, one- and
 * two-deletion variants, so it finds every token within one edit, and within two edits whenever at most
 * one of the two is on the stored side (an extra letter typed, plus any one other error).
 */

/** Tokens shorter than this are found only exactly: one deletion of a 2-letter token matches too much. */
export const MIN_FUZZY_TOKEN_LENGTH = 3;
/** Query tokens of at least this length also look up their two-deletion variants. */
export const MIN_TWO_DELETION_LENGTH = 5;

/**
 * 32-bit FNV-1a hash of a string's UTF-16 code units (collisions only add candidates that the edit
 * distance check then removes).
 * @example hashKey('abc') // 440920331
 */
export function hashKey(text: string): number {
  let hash = 0x811c9dc5;
  for (let i = 0; i < text.length; i++) {
    hash ^= text.charCodeAt(i);
    hash = Math.imul(hash, 0x01000193);
  }
  return hash | 0;
}

/**
 * Hashes of a token and of every variant with one letter deleted (distinct values), as stored.
 * @example storedDeletionHashes('abc').length // 4: 'abc', 'bc', 'ac', 'ab'
 */
export function storedDeletionHashes(token: string): number[] {
  const hashes = new Set<number>([hashKey(token)]);
  for (let i = 0; i < token.length; i++) hashes.add(hashKey(token.slice(0, i) + token.slice(i + 1)));
  return [...hashes];
}

/**
 * Hashes a query token looks up: itself, one deletion, and two deletions for tokens of
 * MIN_TWO_DELETION_LENGTH letters or more.
 * @example queryDeletionHashes('abcde').length // 1 + 5 + 10 (fewer when letters repeat)
 */
export function queryDeletionHashes(token: string): number[] {
  const hashes = new Set<number>([hashKey(token)]);
  const ones = new Set<string>();
  for (let i = 0; i < token.length; i++) ones.add(token.slice(0, i) + token.slice(i + 1));
  for (const one of ones) {
    hashes.add(hashKey(one));
    if (token.length >= MIN_TWO_DELETION_LENGTH) {
      for (let j = 0; j < one.length; j++) hashes.add(hashKey(one.slice(0, j) + one.slice(j + 1)));
    }
  }
  return [...hashes];
}

/**
 * Edit distance with adjacent transpositions (optimal string alignment), exact; O(|a|·|b|).
 * @example editDistance('rosario', 'rosraio') // 1
 */
export function editDistance(a: string, b: string): number {
  if (a === b) return 0;
  const n = a.length;
  const m = b.length;
  let previous2 = new Array<number>(m + 1).fill(0);
  let previous = Array.from({ length: m + 1 }, (_, j) => j);
  let current = new Array<number>(m + 1).fill(0);
  for (let i = 1; i <= n; i++) {
    current[0] = i;
    for (let j = 1; j <= m; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      let best = Math.min(previous[j] + 1, current[j - 1] + 1, previous[j - 1] + cost);
      if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1]) best = Math.min(best, previous2[j - 2] + 1);
      current[j] = best;
    }
    [previous2, previous, current] = [previous, current, previous2];
  }
  return previous[m];
}

/**
 * Largest edit distance a query token may be from a stored token: 1 for short tokens, 2 from
 * MIN_TWO_DELETION_LENGTH letters (common practice, no source).
 * @example maxTokenEdits('rio') // 1
 */
export function maxTokenEdits(token: string): number {
  return token.length >= MIN_TWO_DELETION_LENGTH ? 2 : 1;
}
