/**
 * A named place that may also be a route between two places ("Ipala to Amatillo", "estrada X - Y", "de X a Y"),
 * judged where the gazetteer is known [CHOICE routeReading, src/georef/method-choices.ts]: the whole found as one
 * name (as written or by a documented reading of it) stays one name; else the one split whose two ends are both
 * found is read as the route between them, georeferenced by the 'between' rule (midpoint of the two places, radius
 * half their distance plus the larger extent: the whole segment and both ends' extents, docs/method.md §3). One
 * end alone never places a route. A road kilometre post beside it cannot be placed without the road's line: the
 * answer is the route's circle, or a decline [CHOICE routeKilometrePost]. Pure: the gazetteer is reached only
 * through the finder and the caller's `resolve`.
 */
import type { AdministrativeContext, Interpretation } from '../parse/types.ts';
import type { CandidateFinder } from '../match/types.ts';
import type { MethodOptions } from '../georef/types.ts';
import { METHOD_DEFAULTS } from '../georef/method-defaults.ts';

/** What the route judgement decided: keep the reading as it is, use the route, or decline (`final`: whatever the whole name gives). */
export type RouteJudgement<R> = { keep: true } | { route: Interpretation; resolved: R } | { decline: string; final?: 'ambiguous' | 'not-found' };

/**
 * Judges an interpretation's route reading. `resolve` finds the features of a reading (ok when every name is found).
 * @example
 *   routeJudgement(store, parseLocality('Ipala to Amatillo'), {}, {}, 0.95, resolve)
 *   // { route: { type: 'between', features: ['Ipala', 'Amatillo'], notes: [… '[CHOICE routeReading, …]'] }, resolved }
 */
export function routeJudgement<R extends { ok: boolean; guessed?: boolean }>(
  finder: CandidateFinder,
  interpretation: Interpretation,
  context: AdministrativeContext,
  options: MethodOptions,
  readingScore: number,
  resolve: (reading: Interpretation) => R,
): RouteJudgement<R> {
  const route = interpretation.route;
  const whole = interpretation.features[0];
  if (!route || interpretation.type !== 'named-place' || !whole) return { keep: true };
  if (finder.findCandidates({ name: whole, context }).some((c) => c.score >= readingScore)) return { keep: true };
  const tried = route.ends.map((ends) => {
    const reading: Interpretation = { ...interpretation, type: 'between', features: [...ends], offsets: [], featureKind: undefined, route: undefined };
    return { ends, reading, resolved: resolve(reading) };
  });
  // Each end as written or by a documented reading of it: a near spelling of an end is another place too often.
  const both = tried.filter((t) => t.resolved.ok && !t.resolved.guessed);
  const rule = '[CHOICE routeReading, src/georef/method-choices.ts]';
  if (both.length > 1) {
    return { decline: `"${route.written}" splits into two places in ${both.length} ways (${both.map((t) => t.ends.join(' | ')).join('; ')}): which route is meant is for a person to say ${rule}`, final: 'ambiguous' };
  }
  if (both.length === 0) {
    const found = route.ends.flat().filter((name, k, all) => all.indexOf(name) === k && finder.findCandidates({ name, context }).some((c) => c.score >= readingScore));
    const which = found.length ? `only ${found.map((f) => `"${f}"`).join(', ')} found` : 'neither end found';
    return { decline: `"${whole}" is not a loaded name; read as a route (${route.ends.map((e) => e.join(' to ')).join('; ')}), ${which}: one end alone does not place a route ${rule}` };
  }
  const [{ ends, reading, resolved }] = both as [(typeof both)[number]];
  const post = route.kilometrePost;
  if (post && (options.routeKilometrePost ?? METHOD_DEFAULTS.routeKilometrePost) === 'decline') {
    return { decline: `"${route.written}" read as the route between ${ends[0]} and ${ends[1]}, but "${post}" is measured along the road from its own origin, which cannot be placed without the road's line [CHOICE routeKilometrePost, src/georef/method-defaults.ts]`, final: 'not-found' };
  }
  const postNote = post ? `; "${post}" not placed (measured along the road from its own origin, no road line loaded): the circle covers the whole route [CHOICE routeKilometrePost, src/georef/method-defaults.ts]` : '';
  const note = `"${whole}" is not a loaded name; read as the route between ${ends[0]} and ${ends[1]}, both found: georeferenced on the route between them${postNote} ${rule}`;
  return { route: { ...reading, notes: [...reading.notes, note] }, resolved };
}
