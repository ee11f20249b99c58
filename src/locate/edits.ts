/**
 * The georeferencer's edits to one record, as `locate` applies them inside the pipeline: a feature
 * chosen for a name of the text (instead of the chooser's pick), and a distance precision. The other
 * edits (datum, map scale, measurement error) are method settings and go to the method as they are.
 */
import type { Candidate, FeatureKey } from '../match/types.ts';
import type { Interpretation, Offset } from '../parse/types.ts';

export type { FeatureKey };

/** The feature the georeferencer chose for one name of the text. */
export interface ChosenFeature extends FeatureKey {
  /** The name as the interpretation lists it; may be left out when the text names one place. */
  name?: string;
}

export interface LocateEdits {
  /**
   * One chosen feature per name at most; each must be among the candidates of a reading the answer tries: the
   * text's first name, its second name in brackets, or a later clause standing in for a missing place.
   */
  chosenFeatures?: ChosenFeature[];
  /** Distance precision in the written unit of the distance (method §5.1: δ = precision / 2). */
  distancePrecision?: number;
}

/** Why an edit cannot be applied to this record. */
export type EditProblem =
  | { kind: 'names-no-place' | 'names-several-places'; namesInText: number }
  | { kind: 'not-offered'; chosen: ChosenFeature }
  | { kind: 'unknown-name'; chosen: ChosenFeature; names: string[] };

/**
 * An edit that does not fit the record (a feature that was not offered, a name the text does not
 * hold). The caller's input is wrong, so the caller is told which edit and why; the edges turn it into
 * their own error (the HTTP API: a 400 naming the field).
 */
export class EditRefused extends Error {
  constructor(readonly problem: EditProblem) {
    super(describeProblem(problem));
    this.name = 'EditRefused';
  }
}

function describeProblem(problem: EditProblem): string {
  switch (problem.kind) {
    case 'names-no-place':
    case 'names-several-places':
      return `a chosen feature without a name applies to a locality that names one feature; this one names ${problem.namesInText}`;
    case 'not-offered':
      return `${problem.chosen.sourceId}:${problem.chosen.featureId} is not among the candidates for this locality`;
    case 'unknown-name':
      return `the chosen feature's name "${problem.chosen.name}" is not a name of this locality (${problem.names.map((n) => JSON.stringify(n)).join(', ')})`;
  }
}

/**
 * The candidate the georeferencer chose for `name`, or undefined when no edit names it.
 * @example chosenFeatureFor('Santa Rosa', ['Santa Rosa'], found, [{ sourceId: 'demo', featureId: 'qv-0015' }])?.feature.featureId // 'qv-0015'
 */
export function chosenFeatureFor(name: string, names: string[], found: Candidate[], chosen: ChosenFeature[] = []): Candidate | undefined {
  for (const c of chosen) {
    if (c.name === undefined && names.length !== 1) throw new EditRefused({ kind: 'names-several-places', namesInText: names.length });
    if (c.name !== undefined && !names.includes(c.name)) throw new EditRefused({ kind: 'unknown-name', chosen: c, names });
  }
  const edit = chosen.find((c) => (c.name ?? names[0]) === name);
  if (!edit) return undefined;
  const offered = found.find((c) => c.feature.sourceId === edit.sourceId && c.feature.featureId === edit.featureId);
  if (offered) return offered;
  // Another source's copy of an offered place (src/match/same-place.ts) may be chosen instead.
  for (const c of found) {
    const copy = c.feature.alsoIn?.find((f) => f.sourceId === edit.sourceId && f.featureId === edit.featureId);
    if (copy) {
      const { distanceMeters: _distance, ...feature } = copy;
      return { ...c, feature };
    }
  }
  throw new EditRefused({ kind: 'not-offered', chosen: edit });
}

/**
 * Method §5.1 with the georeferencer's precision: δ = precision / 2 (+ half a written range), in the
 * written unit of each distance.
 * @example withDistancePrecision(parseLocality('10 km N of Alba'), 10).offsets[0].distance.uncertainty // 5
 */
export function withDistancePrecision(interpretation: Interpretation, precision: number): Interpretation {
  const offsets = interpretation.offsets.map((offset): Offset => {
    const d = offset.distance;
    if (!d || d.value <= 0) return offset;
    const uncertainty = precision / 2 + (d.range ? (d.range.high - d.range.low) / 2 : 0);
    return { ...offset, distance: { ...d, precision, uncertainty, uncertaintyMeters: uncertainty * (d.meters / d.value) } };
  });
  const unit = interpretation.offsets.find((o) => o.distance)?.distance?.unit ?? '';
  return { ...interpretation, offsets, notes: [...interpretation.notes, `distance precision set by the georeferencer to ${precision} ${unit}`.trim()] };
}
