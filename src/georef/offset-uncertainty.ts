/** The offset terms of the point-radius method (docs/method.md §3 and §5.2), in whatever unit d and δ are given. */

const RADIANS = Math.PI / 180;

/**
 * Offset at a heading: the furthest point of the annular sector r ∈ [d−δ, d+δ], φ ∈ [θ−Δ, θ+Δ] from the
 * nominal point, `sqrt((d+δ)² + d² − 2·d·(d+δ)·cos Δ)` (docs/method.md §5.2). Δ = 0 gives δ; δ = 0 gives the
 * direction-only term 2·d·sin(Δ/2). Exact up to floating-point rounding (written in a form that keeps
 * full relative precision for small Δ).
 * @example offsetUncertainty(10, 0.5, 22.5) // ≈ 4.029 (10 km NE, δ 0.5 km)
 */
export function offsetUncertainty(distance: number, distanceUncertainty: number, halfWidthDegrees: number): number {
  if (!(distance >= 0) || !(distanceUncertainty >= 0) || !(halfWidthDegrees >= 0 && halfWidthDegrees <= 180)) {
    throw new Error(`offset terms must be d ≥ 0, δ ≥ 0 and 0 ≤ Δ ≤ 180°, got d=${distance}, δ=${distanceUncertainty}, Δ=${halfWidthDegrees}`);
  }
  const far = distance + distanceUncertainty;
  // (d+δ)² + d² − 2d(d+δ)cosΔ = δ² + 4d(d+δ)sin²(Δ/2): no cancellation when Δ is small.
  const halfSine = Math.sin((halfWidthDegrees * RADIANS) / 2);
  return Math.sqrt(distanceUncertainty ** 2 + 4 * distance * far * halfSine ** 2);
}

/**
 * Two orthogonal offsets ("3 km N and 2 km E"): headings are exact by convention, so only the two
 * distance uncertainties count, `sqrt(δx² + δy²)` (docs/method.md §3). Exact.
 * @example orthogonalOffsetUncertainty(0.5, 0.5) // ≈ 0.7071
 */
export function orthogonalOffsetUncertainty(northSouthUncertainty: number, eastWestUncertainty: number): number {
  return Math.hypot(northSouthUncertainty, eastWestUncertainty);
}

/**
 * Distance without a heading ("5 km from X"): the place may lie anywhere up to d + δ from the feature's
 * edge, so the term is d + δ (docs/method.md §3 [CHOICE]). Exact.
 * @example distanceOnlyUncertainty(5, 0.5) // 5.5
 */
export function distanceOnlyUncertainty(distance: number, distanceUncertainty: number): number {
  return distance + distanceUncertainty;
}
