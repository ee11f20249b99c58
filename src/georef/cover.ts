/**
 * One georeference that covers several alternatives, for a name the gazetteer cannot resolve when the
 * user asks for a single answer anyway [CHOICE: BP2020 gives no rule; the circle holds every
 * alternative's whole circle, so nothing any reading allows is left out].
 */
import { inverse } from '../geodesy/geodesic.ts';
import { enclosingCircle } from './feature-extent.ts';
import { circleWKT } from './footprint.ts';
import type { Georeference } from './types.ts';

/**
 * The smallest circle centred on the enclosing-circle center of the alternatives' points that holds
 * every alternative's circle: radius = max over i of (distance to point i + radius i).
 * Accuracy: geodesic distances to ~15 nm (geographiclib); the center is the geodesic minimax center of
 * the points to about 1 mm (see enclosingCircle), which may leave the radius up to the largest
 * alternative radius above the true minimum when the alternatives' radii differ much.
 * @example coverGeoreferences([a, b]).uncertaintyMeters // ≥ a.uncertaintyMeters and ≥ b.uncertaintyMeters
 */
export function coverGeoreferences(alternatives: Georeference[]): Georeference {
  if (alternatives.length === 0) throw new Error('coverGeoreferences: no alternatives');
  const center = enclosingCircle(alternatives.map((g) => [g.longitude, g.latitude]));
  let widest = alternatives[0];
  let radius = 0;
  for (const g of alternatives) {
    const reach = inverse(center.latitude, center.longitude, g.latitude, g.longitude).meters + g.uncertaintyMeters;
    if (reach > radius) [radius, widest] = [reach, g];
  }
  const { extent, offset } = widest.components;
  const otherTerms = widest.uncertaintyMeters - extent - offset;
  const components = { ...widest.components, extent: extent + (radius - widest.uncertaintyMeters) };
  return {
    latitude: center.latitude,
    longitude: center.longitude,
    uncertaintyMeters: radius,
    components,
    footprintWKT: circleWKT(center.latitude, center.longitude, radius),
    features: alternatives.flatMap((g) => g.features),
    remarks: [
      `one circle covers ${alternatives.length} alternative readings: centred on the smallest circle through their points, radius ${Math.ceil(radius)} m reaches the far edge of every alternative's circle [CHOICE]`,
      `terms other than extent and offset (${Math.round(otherTerms)} m) are those of the widest alternative; its extent is widened by the spread of the alternatives`,
    ],
  };
}
