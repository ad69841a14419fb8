/**
 * Rim search along one ray of the circular-edge method (disk-locate.ts): the falling zero crossing of a signed profile
 * (inside minus mid level, times the polarity) that lies nearest to the current radius estimate.
 *
 * The result is that of scanning every sample from the inner end and keeping the nearest crossing (ties → the
 * innermost), but the scan starts at the estimate and works outwards in both directions, stopping once no unscanned
 * segment can hold a nearer crossing: a handful of samples per ray instead of the whole radial range.
 */

/**
 * Sample radii r₀, r₀ + Δ, … up to r₁ + Δ (mm), accumulated step by step exactly as a `for (r = r₀; r ≤ r₁ + Δ;
 * r += Δ)` loop would produce them. Never throws; empty when r₀ > r₁ + Δ.
 */
export function rayRadii(startMm: number, endMm: number, stepMm: number): Float64Array {
  const radii: number[] = [];
  for (let r = startMm; r <= endMm + stepMm; r += stepMm) radii.push(r);
  return Float64Array.from(radii);
}

/**
 * Radius (mm) of the falling crossing nearest to `targetMm`: segment j (samples j−1, j) crosses when
 * v[j−1] > 0 ≥ v[j], at r_j − Δ + Δ·v[j−1]/(v[j−1] − v[j]) (linear interpolation). NaN when no segment crosses.
 * @param valueAt signed profile value at radii[j]; NaN outside the image region. The region must be convex and the
 *   samples inside it must form one run starting at sample 0 (true for a ray from a point inside a rectangle, whose
 *   coordinates are monotone in r); a scan from sample 0 stops at the first NaN, so only that run counts.
 * @param radii sample radii from {@link rayRadii}, spacing `stepMm`.
 * Never throws.
 */
export function nearestFallingCrossing(valueAt: (j: number) => number, radii: Float64Array, stepMm: number, targetMm: number): number {
  const n = radii.length;
  if (n < 2 || Number.isNaN(valueAt(0))) return NaN;
  // A crossing of segment j lies in [r_j − Δ, r_j]; the slack absorbs the rounding of that bound.
  const slack = 1e-6 * stepMm;
  let outer = 1;
  while (outer < n && radii[outer]! < targetMm) outer++;
  let inner = outer - 1;
  let outerOpen = true;
  let best = NaN;
  let bestDistance = Infinity;
  let bestSegment = n;
  for (;;) {
    const outerBound = outerOpen && outer < n ? radii[outer]! - stepMm - targetMm : Infinity;
    const innerBound = inner >= 1 ? targetMm - radii[inner]! : Infinity;
    const bound = Math.min(outerBound, innerBound);
    if (bound === Infinity || bound - slack > bestDistance) return best;
    const fromOuter = outerBound <= innerBound;
    const j = fromOuter ? outer++ : inner--;
    const value = valueAt(j);
    if (Number.isNaN(value)) {
      // Outside the region: so is every sample beyond it on this ray.
      if (fromOuter) outerOpen = false;
      continue;
    }
    const previous = valueAt(j - 1);
    if (!(previous > 0 && value <= 0)) continue;
    const crossing = radii[j]! - stepMm + (stepMm * previous) / (previous - value);
    const distance = Math.abs(crossing - targetMm);
    if (distance < bestDistance || (distance === bestDistance && j < bestSegment)) {
      best = crossing;
      bestDistance = distance;
      bestSegment = j;
    }
  }
}
