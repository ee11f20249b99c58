/**
 * What a gazetteer says of the name a lookup matched, when that is not simply a current name: a
 * former (historic) name, or a colloquial one. Pure.
 */
import { foldName } from './fold.ts';
import type { Candidate } from './types.ts';

/**
 * Plain words for the matched name's kind ("former name 'Puerto Viejo' (es, until 1921)"), or null
 * when the source gives none or the name is a current one.
 * @example matchedNameKind({ name: 'Puerto Nuevo', nameDetails: [{ name: 'Puerto Viejo', language: 'es', historic: true, to: '1921' }], … }, 'Puerto Viejo')
 * // "former name 'Puerto Viejo' (es, until 1921)"
 */
export function matchedNameKind(feature: Candidate['feature'], matchedName: string): string | null {
  if (feature.nameDetails === undefined) return null;
  const key = foldName(matchedName);
  const detail = feature.nameDetails.find((name) => foldName(name.name) === key && (name.historic || name.colloquial));
  if (detail === undefined) return null;
  const period = detail.from !== undefined && detail.to !== undefined ? `${detail.from}–${detail.to}`
    : detail.to !== undefined ? `until ${detail.to}` : detail.from !== undefined ? `from ${detail.from}` : null;
  const about = [detail.language, period].filter((part) => part !== null).join(', ');
  return `${detail.historic ? 'former' : 'colloquial'} name '${detail.name}'${about === '' ? '' : ` (${about})`}`;
}

/**
 * The candidate with the kind of its matched name in `why` and in `feature.matchedAs` (for the
 * remarks), when it is a former or colloquial name; else the candidate as it was.
 * @example withNameKind(candidate).why // "exact alternate name 'Puerto Viejo'; a former name 'Puerto Viejo' (es, until 1921)"
 */
export function withNameKind(candidate: Candidate): Candidate {
  const kind = matchedNameKind(candidate.feature, candidate.matchedName);
  if (kind === null) return candidate;
  return { ...candidate, feature: { ...candidate.feature, matchedAs: kind }, why: `${candidate.why}; a ${kind}` };
}
