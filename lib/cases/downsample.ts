/**
 * Thin a series for drawing only: keep the first and last points and, in each bucket,
 * the points with the smallest and largest value of every listed key, so peaks,
 * crossings and tolerance stretches survive. Numbers tables and exports never use it.
 * Pure and client-safe.
 */

/** The rule's bucket count: room for both extremes of every key in every bucket, plus the two ends. */
const ruleBuckets = (maxPoints: number, keyCount: number) => Math.max(1, Math.floor((maxPoints - 2) / Math.max(2, 2 * keyCount)));

/**
 * Indices kept with `buckets` buckets: 0, n − 1 and each bucket's extremes of each series.
 * `value(k, i)` is series k at index i; NaN (or any non-finite number) is skipped.
 */
function keptIndices(n: number, keyCount: number, value: (k: number, i: number) => number, buckets: number): number[] {
  const keep = new Uint8Array(n);
  keep[0] = 1;
  keep[n - 1] = 1;
  const size = (n - 2) / buckets;
  for (let b = 0; b < buckets; b++) {
    const start = 1 + Math.floor(b * size);
    const end = Math.min(n - 1, 1 + Math.floor((b + 1) * size));
    for (let k = 0; k < keyCount; k++) {
      let lo = -1;
      let hi = -1;
      let loV = 0;
      let hiV = 0;
      for (let i = start; i < end; i++) {
        const v = value(k, i);
        if (!Number.isFinite(v)) continue;
        if (lo < 0 || v < loV) [lo, loV] = [i, v];
        if (hi < 0 || v > hiV) [hi, hiV] = [i, v];
      }
      if (lo >= 0) keep[lo] = 1;
      if (hi >= 0) keep[hi] = 1;
    }
  }
  const out: number[] = [];
  for (let i = 0; i < n; i++) if (keep[i]) out.push(i);
  return out;
}

export function downsample<T extends Record<string, unknown>>(rows: readonly T[], keys: readonly (keyof T)[], maxPoints = 1200): T[] {
  if (rows.length <= maxPoints) return rows.slice();
  const value = (k: number, i: number) => {
    const v = rows[i][keys[k]];
    return typeof v === "number" ? v : Number.NaN;
  };
  return keptIndices(rows.length, keys.length, value, ruleBuckets(maxPoints, keys.length)).map((i) => rows[i]);
}

/**
 * The columns variant: which indices of `n` points to draw, given the charted series (one
 * array per key, `n` entries each; a boolean counts as 0/1, so a stretch beyond tolerance keeps
 * a point inside every bucket it touches; null is skipped). Same rule as `downsample`, whose
 * bucket count always fits `maxPoints`; where the series share their extremes (smooth, monotone
 * curves put them at the bucket ends) that leaves room, so more buckets are used as long as the
 * kept points still fit. Ascending indices, at most `maxPoints` of them; every index when n fits.
 */
export function sampleIndices(n: number, series: readonly ArrayLike<unknown>[], maxPoints = 1200): number[] {
  if (n <= maxPoints) return Array.from({ length: n }, (_, i) => i);
  const value = (k: number, i: number) => {
    const v = series[k][i];
    return typeof v === "number" ? v : typeof v === "boolean" ? Number(v) : Number.NaN;
  };
  let fits = ruleBuckets(maxPoints, series.length);
  let best = keptIndices(n, series.length, value, fits);
  let over = n - 1;
  // A bounded search for the largest bucket count whose kept points fit.
  for (let pass = 0; pass < 6 && best.length < maxPoints && over - fits > 1; pass++) {
    const guess = Math.floor((fits * (maxPoints - 2)) / Math.max(1, best.length - 2));
    const next = Math.max(fits + 1, Math.min(over - 1, pass === 0 ? guess : Math.floor((fits + over) / 2)));
    const kept = keptIndices(n, series.length, value, next);
    if (kept.length <= maxPoints) [fits, best] = [next, kept];
    else over = next;
  }
  return best;
}
