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
 * Scores features against a folded query with fuse.js (Bitap, location ignored) over each feature's
 * folded name and alternate names, keeping each feature's best name; best first. Score = 1 − fuse
 * score, at most MAX_FUZZY_SCORE; `why` gives the edit distance to the name that matched.
 * @example scoreFuzzy('rosraio', [rosario]) // [{ score: ≈0.8, why: "1 edit from 'Rosario'" … }]
 */
export function scoreFuzzy(foldedQuery: string, features: readonly Feature[]): Candidate[] {
  const entries: NameEntry[] = [];
  features.forEach((feature, index) => {
    entries.push({ key: foldName(feature.name), written: feature.name, alternate: false, feature: index });
    for (const alternate of feature.alternateNames) entries.push({ key: foldName(alternate), written: alternate, alternate: true, feature: index });
  });
  const fuse = new Fuse(entries, { keys: ['key'], includeScore: true, ignoreLocation: true, threshold: FUSE_THRESHOLD, isCaseSensitive: true });
  const best = new Map<number, { entry: NameEntry; fuseScore: number; edits: number }>();
  for (const result of fuse.search(foldedQuery)) {
    const fuseScore = result.score ?? 1;
    const edits = editDistance(foldedQuery, result.item.key);
    const previous = best.get(result.item.feature);
    if (previous === undefined || fuseScore < previous.fuseScore || (fuseScore === previous.fuseScore && edits < previous.edits)) {
      best.set(result.item.feature, { entry: result.item, fuseScore, edits });
    }
  }
  return [...best.entries()]
    .map(([index, { entry, fuseScore, edits }]) => ({
      candidate: {
        feature: features[index],
        score: Math.min(MAX_FUZZY_SCORE, Math.round((1 - fuseScore) * 1000) / 1000),
        matchedName: entry.written,
        why: `${edits} edit${edits === 1 ? '' : 's'} from ${entry.alternate ? 'alternate name' : 'name'} '${entry.written}'`,
      },
      edits,
    }))
    .sort((a, b) => b.candidate.score - a.candidate.score || a.edits - b.edits)
    .map(({ candidate }) => candidate);
}
