/** The answer for a record that could not be georeferenced at all, with the reason in plain words. */
import type { LocateResult } from './locate.ts';

/**
 * A result for a row that was not georeferenced, with the reason in plain words.
 * @example unreadableResult('', 'line 4: the row has 3 fields where the header has 5').status // 'unparseable'
 */
export function unreadableResult(verbatim: string, reason: string): LocateResult {
  return {
    status: 'unparseable',
    interpretation: { verbatim, clauses: [], chosenClause: null, type: 'unparseable', features: [], offsets: [], approximate: false, administrative: {}, otherClauses: [], reason, notes: [] },
    candidates: [],
    reason,
  };
}
