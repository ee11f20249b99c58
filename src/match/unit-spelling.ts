/**
 * Whether a name written in a label is a near spelling of one of the record's own units ("Hitamalco" for the
 * county Hueytamalco): both one word of at least 8 letters once folded, beginning with the same letter, at most a
 * third of the longer one's letters differing (edit distance with transpositions). Looser than the matcher's
 * near spellings (at most 2 edits a word), since the record's own field corroborates it; the bounds are common
 * practice for misspelt names, no source [CHOICE countyNearSpellings]. Pure.
 */
import { editDistance } from './edit-distance.ts';
import { foldName } from './fold.ts';

/** Fewest letters a name must have for a spelling a third different to still be the same name. */
const MIN_LETTERS = 8;

/**
 * True when `written` is not `unit` as folded but a near spelling of it (the bounds above).
 * @example isNearSpellingOfUnit('Hitamalco', 'HUEYTAMALCO') // true (3 edits of 11 letters)
 * @example isNearSpellingOfUnit('Ixtapan', 'Ixtapaluca') // false (shorter than 8 letters)
 */
export function isNearSpellingOfUnit(written: string, unit: string): boolean {
  const a = foldName(written);
  const b = foldName(unit);
  if (a === b || a.includes(' ') || b.includes(' ') || a.length < MIN_LETTERS || b.length < MIN_LETTERS || a[0] !== b[0]) return false;
  const allowed = Math.floor(Math.max(a.length, b.length) / 3);
  return editDistance(a, b, allowed) <= allowed;
}
