import type { Interpretation, Offset } from '../../src/parse/index.ts';

/** One corpus entry: the invented text and what a curator reads in it. */
export interface CorpusEntry {
  text: string;
  /**
   * Hand-written reading: the locality type ("refused" for no-locality or unparseable), features, heading, the
   * line a path offset follows, what the feature is when the text says so ("summit of X": a mountain), a
   * second name of it written in brackets ("X (Y)", "X (formerly Y)"), and the two ends of each way a name may
   * be read as a route ("X to Y"; [] when it offers none), the whole text offered as one place's name beside a
   * reading of its words that names none ("Forks"), a kilometre post with no road start ("km 23"), and the slip
   * read as "até" ("X ato Y").
   */
  intent: { type: string; features: string[]; azimuth?: number; lineName?: string; featureKind?: string; secondName?: string; routeEnds?: string[][]; wholeName?: string; kilometrePost?: string; upToSlip?: string };
}

const round = (x: number | undefined, digits = 7): number | undefined => (x === undefined ? undefined : Number(x.toFixed(digits)));

/** An offset as the corpus fixes it: the written distance and heading, path, "by air", direction of travel. */
function summarizeOffset(o: Offset): Record<string, unknown> {
  return {
    distance: o.distance && {
      written: o.distance.written,
      value: o.distance.value,
      unit: o.distance.unit,
      precision: o.distance.precision,
      uncertainty: round(o.distance.uncertainty, 9),
      range: o.distance.range,
      unitAssumed: o.distance.unitAssumed,
      fromRoadStart: o.distance.fromRoadStart,
    },
    heading: o.heading && { written: o.heading.written, azimuth: o.heading.azimuth, halfWidth: o.heading.halfWidth, kind: o.heading.kind, toward: o.heading.toward },
    path: o.path,
    byAir: o.byAir,
    toward: o.toward,
    upToSlip: o.upToSlip,
  };
}

/** The part of an interpretation the corpus fixes: type, features, offsets, coordinates, administrative units, other clauses. */
export function summarize(r: Interpretation): Record<string, unknown> {
  return JSON.parse(
    JSON.stringify({
      type: r.type,
      features: r.features,
      language: r.language,
      approximate: r.approximate || undefined,
      offsets: r.offsets.map(summarizeOffset),
      featureKind: r.featureKind,
      route: r.route,
      secondName: r.secondName,
      wholeName: r.wholeName,
      kilometrePost: r.kilometrePost,
      unit: r.unit,
      otherClauses: r.otherClauses.length > 0 ? r.otherClauses.map((c) => ({ ...c, offsets: c.offsets.map(summarizeOffset) })) : undefined,
      coordinates: r.coordinates && {
        latitude: round(r.coordinates.latitude),
        longitude: round(r.coordinates.longitude),
        format: r.coordinates.format,
        precisionDegrees: round(r.coordinates.precisionDegrees, 12),
        datumWritten: r.coordinates.datumWritten,
        problems: r.coordinates.problems,
      },
      administrative: r.administrative,
      elevation: r.elevation,
      hasReason: r.reason !== undefined || undefined,
    }),
  );
}

/** Differences between an interpretation and the hand-written intent (empty when they agree). */
export function intentMismatches(entry: CorpusEntry, r: Interpretation): string[] {
  const problems: string[] = [];
  if (entry.intent.wholeName !== undefined && r.wholeName !== entry.intent.wholeName) problems.push(`whole name ${r.wholeName}, expected ${entry.intent.wholeName}`);
  if (entry.intent.kilometrePost !== undefined && r.kilometrePost !== entry.intent.kilometrePost) problems.push(`kilometre post ${r.kilometrePost}, expected ${entry.intent.kilometrePost}`);
  if (entry.intent.upToSlip !== undefined && r.offsets[0]?.upToSlip !== entry.intent.upToSlip) problems.push(`slip for "até" ${r.offsets[0]?.upToSlip}, expected ${entry.intent.upToSlip}`);
  const refused = r.type === 'no-locality' || r.type === 'unparseable';
  if (entry.intent.type === 'refused') {
    if (!refused) problems.push(`expected a refusal, got ${r.type}`);
    else if (!r.reason) problems.push('refusal without a reason');
    return problems;
  }
  if (r.type !== entry.intent.type) problems.push(`type ${r.type} (${r.reason ?? ''}), expected ${entry.intent.type}`);
  if (JSON.stringify(r.features) !== JSON.stringify(entry.intent.features)) problems.push(`features ${JSON.stringify(r.features)}, expected ${JSON.stringify(entry.intent.features)}`);
  if (entry.intent.azimuth !== undefined && r.offsets[0]?.heading?.azimuth !== entry.intent.azimuth) {
    problems.push(`azimuth ${r.offsets[0]?.heading?.azimuth}, expected ${entry.intent.azimuth}`);
  }
  if (entry.intent.lineName !== undefined && r.offsets[0]?.path?.lineName !== entry.intent.lineName) {
    problems.push(`line ${r.offsets[0]?.path?.lineName}, expected ${entry.intent.lineName}`);
  }
  if (entry.intent.routeEnds !== undefined && JSON.stringify(r.route?.ends ?? []) !== JSON.stringify(entry.intent.routeEnds)) {
    problems.push(`route ends ${JSON.stringify(r.route?.ends ?? [])}, expected ${JSON.stringify(entry.intent.routeEnds)}`);
  }
  if (entry.intent.featureKind !== undefined && r.featureKind !== entry.intent.featureKind) problems.push(`feature kind ${r.featureKind}, expected ${entry.intent.featureKind}`);
  if (entry.intent.secondName !== undefined && r.secondName !== entry.intent.secondName) problems.push(`second name ${r.secondName}, expected ${entry.intent.secondName}`);
  return problems;
}
