/**
 * Tabulated Cp: monotone piecewise-cubic Hermite interpolation (Fritsch–Carlson, the
 * "PCHIP" rule) or linear. Shape-preserving: no overshoot between points. Beyond the
 * points the end cubic is not extended; the value continues linearly along the end slope,
 * and the chain's range check reports the extrapolation.
 */
export interface TableInterpolant {
  (tK: number): number;
  /** The table temperatures, used by the integrator as break points. */
  knots: Float64Array;
}

export function makeTableInterpolant(points: readonly (readonly [number, number])[], kind: "pchip" | "linear"): TableInterpolant {
  const n = points.length;
  const x = new Float64Array(n);
  const y = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    x[i] = points[i][0];
    y[i] = points[i][1];
  }
  const h = new Float64Array(n - 1);
  const delta = new Float64Array(n - 1);
  for (let i = 0; i < n - 1; i++) {
    h[i] = x[i + 1] - x[i];
    delta[i] = (y[i + 1] - y[i]) / h[i];
  }
  const d = new Float64Array(n);
  if (kind === "linear" || n === 2) {
    for (let i = 0; i < n; i++) d[i] = i < n - 1 ? delta[i] : delta[n - 2];
  } else {
    for (let i = 1; i < n - 1; i++) {
      if (delta[i - 1] * delta[i] <= 0) d[i] = 0;
      else {
        // Weighted harmonic mean (Fritsch–Butland form used by PCHIP).
        const w1 = 2 * h[i] + h[i - 1];
        const w2 = h[i] + 2 * h[i - 1];
        d[i] = (w1 + w2) / (w1 / delta[i - 1] + w2 / delta[i]);
      }
    }
    d[0] = endSlope(h[0], h[1], delta[0], delta[1]);
    d[n - 1] = endSlope(h[n - 2], h[n - 3], delta[n - 2], delta[n - 3]);
  }
  const linear = kind === "linear";
  const f = ((t: number): number => {
    if (t <= x[0]) return y[0] + d[0] * (t - x[0]);
    if (t >= x[n - 1]) return y[n - 1] + d[n - 1] * (t - x[n - 1]);
    let lo = 0;
    let hi = n - 1;
    while (hi - lo > 1) {
      const mid = (lo + hi) >> 1;
      if (x[mid] <= t) lo = mid;
      else hi = mid;
    }
    if (linear) return y[lo] + delta[lo] * (t - x[lo]);
    const hh = h[lo];
    const s = (t - x[lo]) / hh;
    const s2 = s * s;
    const s3 = s2 * s;
    return (2 * s3 - 3 * s2 + 1) * y[lo] + (s3 - 2 * s2 + s) * hh * d[lo] + (-2 * s3 + 3 * s2) * y[lo + 1] + (s3 - s2) * hh * d[lo + 1];
  }) as TableInterpolant;
  f.knots = x;
  return f;
}

// Three-point end formula, kept shape-preserving.
function endSlope(h0: number, h1: number, del0: number, del1: number): number {
  let d = ((2 * h0 + h1) * del0 - h0 * del1) / (h0 + h1);
  if (Math.sign(d) !== Math.sign(del0)) d = 0;
  else if (Math.sign(del0) !== Math.sign(del1) && Math.abs(d) > Math.abs(3 * del0)) d = 3 * del0;
  return d;
}
