/**
 * Thin a series for drawing only: keep the first and last points and, in each bucket,
 * the points with the smallest and largest value of every listed key, so peaks,
 * crossings and tolerance stretches survive. Numbers tables and exports never use it.
 */
export function downsample<T extends Record<string, unknown>>(rows: readonly T[], keys: readonly (keyof T)[], maxPoints = 1200): T[] {
  if (rows.length <= maxPoints) return rows.slice();
  const perBucket = Math.max(2, 2 * keys.length);
  const buckets = Math.max(1, Math.floor((maxPoints - 2) / perBucket));
  const size = (rows.length - 2) / buckets;
  const keep = new Set<number>([0, rows.length - 1]);
  for (let b = 0; b < buckets; b++) {
    const start = 1 + Math.floor(b * size);
    const end = Math.min(rows.length - 1, 1 + Math.floor((b + 1) * size));
    for (const key of keys) {
      let lo = -1;
      let hi = -1;
      for (let i = start; i < end; i++) {
        const v = rows[i][key];
        if (typeof v !== "number" || !Number.isFinite(v)) continue;
        if (lo < 0 || v < (rows[lo][key] as number)) lo = i;
        if (hi < 0 || v > (rows[hi][key] as number)) hi = i;
      }
      if (lo >= 0) keep.add(lo);
      if (hi >= 0) keep.add(hi);
    }
  }
  return [...keep].sort((a, b) => a - b).map((i) => rows[i]);
}
