/**
 * Root of g(f) = level on [lo, hi] for a decreasing g, by 100 bisection steps (common practice); used to find the
 * expected f50/f10 of closed-form MTFs and the widths of closed-form profiles.
 */
export function bisect(g: (f: number) => number, level: number, lo: number, hi: number): number {
  for (let i = 0; i < 100; i++) {
    const mid = (lo + hi) / 2;
    if (g(mid) > level) lo = mid;
    else hi = mid;
  }
  return (lo + hi) / 2;
}
