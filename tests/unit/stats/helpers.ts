/**
 * Independent numerical references for the statistics tests, written without jStat so that
 * they can catch a wrong call into it.
 */

/** Composite Simpson integral of f on [a, b] with an even number of panels. */
export function simpson(f: (x: number) => number, a: number, b: number, panels = 20000): number {
  const h = (b - a) / panels;
  let s = f(a) + f(b);
  for (let i = 1; i < panels; i++) s += f(a + i * h) * (i % 2 === 1 ? 4 : 2);
  return (s * h) / 3;
}

/**
 * Two-sided Student t tail P(|T| ≥ |t|) by direct integration. With x = √ν·tan u the t density
 * (1 + x²/ν)^(−(ν+1)/2) dx becomes √ν·cos^(ν−1)(u) du, so the tail is the ratio
 * ∫_{atan(|t|/√ν)}^{π/2} cos^(ν−1) u du / ∫_0^{π/2} cos^(ν−1) u du — no gamma function needed.
 */
export function tTwoSidedTailByIntegration(t: number, df: number): number {
  const g = (u: number) => Math.pow(Math.cos(u), df - 1);
  const u0 = Math.atan(Math.abs(t) / Math.sqrt(df));
  return simpson(g, u0, Math.PI / 2) / simpson(g, 0, Math.PI / 2);
}

/** Upper quantile t with P(|T| ≥ t) = tail, by bisection on the integral above. */
export function tCriticalByIntegration(twoSidedTail: number, df: number): number {
  let lo = 0;
  let hi = 1000;
  for (let i = 0; i < 60; i++) {
    const mid = (lo + hi) / 2;
    if (tTwoSidedTailByIntegration(mid, df) > twoSidedTail) lo = mid;
    else hi = mid;
  }
  return (lo + hi) / 2;
}
