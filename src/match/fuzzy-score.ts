/**
 * Scoring of fuzzy candidates that the store's index found: fuse.js over those few features only,
 * with the edit distance to say why. Pure, no I/O.
 */
import Fuse from 'fuse.js';
import { editDistance } from './edit-distance.ts';
import { foldName } from './fold.ts';
import type { Candidate, Feature } from './types.ts';

/** Fuzzy candidates never score as high as an exact folded match (1) or an abbreviation reading. */
export const MAX_FUZZY_SCORE = 0.95;
/** fuse.js score (0 perfect, 1 nothing alike) above which a name is not a plausible reading; common practice, no source. */
export const FUSE_THRESHOLD = 0.5;

interface NameEntry {
  key: string;
  written: string;
  alternate: boolean;
  feature: number;
}

/**
 * Half the fuse.js similarity (1 − fuse score), half the edit similarity (1 − edits / longer length),
 * at most MAX_FUZZY_SCORE: fuse.js alone ranks a name with more letters in common above one fewer edits
 * away, which misorders typing errors. Rounded to 0.001.
 * @example blendedScore(0.2, 1, 10, 10) // 0.85
 */
export function blendedScore(fuseScore: number, edits: number, queryLength: number, nameLength: number): number {
  const editSimilarity = Math.max(0, 1 - edits / Math.max(queryLength, nameLength, 1));
  return Math.min(MAX_FUZZY_SCORE, Math.round(((1 - fuseScore) / 2 + editSimilarity / 2) * 1000) / 1000);
}

/**
 * Scores features against a folded query with fuse.js (Bitap, location ignored) over each feature's
 * folded name and alternate names, keeping each feature's best name; best first. The score blends
 * fuse.js with the edit distance (blendedScore); `why` gives the edit distance to the name that matched.
 * @example scoreFuzzy('rosraio', [rosario]) // [{ score: ≈0.8, why: "1 edit from 'Rosario'" … }]
 */
export function scoreFuzzy(foldedQuery: string, features: readonly Feature[]): Candidate[] {
  const entries: NameEntry[] = [];
  features.forEach((feature, index) => {
    entries.push({ key: foldName(feature.name), written: feature.name, alternate: false, feature: index });
    for (const alternate of feature.alternateNames) entries.push({ key: foldName(alternate), written: alternate, alternate: true, feature: index });
  });
  const fuse = new Fuse(entries, { keys: ['key'], includeScore: true, ignoreLocation: true, threshold: FUSE_THRESHOLD, isCaseSensitive: true });
  const best = new Map<number, { entry: NameEntry; score: number; edits: number }>();
  for (const result of fuse.search(foldedQuery)) {
    const edits = editDistance(foldedQuery, result.item.key);
    const score = blendedScore(result.score ?? 1, edits, foldedQuery.length, result.item.key.length);
    const previous = best.get(result.item.feature);
    if (previous === undefined || score > previous.score) best.set(result.item.feature, { entry: result.item, score, edits });
  }
  const readings = new Map<string, number>();
  return [...best.entries()]
    .map(([index, { entry, score, edits }]) => ({
      candidate: {
        feature: features[index],
        score,
        matchedName: entry.written,
        why: `${edits} edit${edits === 1 ? '' : 's'} from ${entry.alternate ? 'alternate name' : 'name'} '${entry.written}'`,
      },
      edits,
      key: entry.key,
    }))
    .sort((a, b) => b.candidate.score - a.candidate.score || a.edits - b.edits)
    // Among equal scores, distinct names before more features of a name already listed: a short list
    // then shows every reading the index found, not five places of one name. The same reading is the
    // same score and folded name: counted in one pass, by that pair.
    .map(({ candidate, key }, rank) => {
      const reading = `${candidate.score} ${key}`;
      const repeat = readings.get(reading) ?? 0;
      readings.set(reading, repeat + 1);
      return { candidate, rank, repeat };
    })
    .sort((a, b) => b.candidate.score - a.candidate.score || a.repeat - b.repeat || a.rank - b.rank)
    .map(({ candidate }) => candidate);
}
