/**
 * The batched tiers of the integrator, for a cumulative pass along a grid: a five-point
 * Lobatto rule per interval, then G3/K7, then adaptive G7/K15 (Integrator.integrateCp) where
 * the cheaper tier misses the tolerance. Scratch arrays belong to the request's Integrator.
 */
import { type CpFunction, type Integrator, REL_TOL as TOLERANCE } from "./integrate";

/** Read once: under a CommonJS transform an imported binding is an accessor, read on every use in the loops below. */
const REL_TOL = TOLERANCE + 0;

export interface CpBatch {
  /** f[i] = Cp(x[i]) for i < n. */
  (x: Float64Array, f: Float64Array, n: number): void;
}

// Kronrod 7-point extension of the 3-point Gauss rule (abscissae and weights on [−1, 1]).
const X7: readonly number[] = [0.9604912687080202834235071, 0.7745966692414833770358531, 0.4342437493468025580020715];
const W7: readonly number[] = [0.1046562260264672651938239, 0.2684880898683334407285692, 0.4013974147759622229050518];
const W7_CENTER = 0.4509165386584741423451498;
const W3 = 5 / 9; // Gauss 3-point weight at ±X7[1]
const W3_CENTER = 8 / 9;

// Five-point Gauss–Lobatto rule (nodes 0, ±√(3/7), ±1; exact to degree 7) with Simpson's rule
// on three of its nodes (0, ±1; degree 3) as the error estimate. The end nodes are the grid
// temperatures, so neighbouring intervals share them and the grid's own Cp values come free.
const XL = Math.sqrt(3 / 7);
const WL_END = 1 / 10;
const WL_IN = 49 / 90;
const WL_CENTER = 32 / 45;
const WS_END = 1 / 3;
const WS_CENTER = 4 / 3;

/**
 * ∫ Cp dT and ∫ Cp/T dT over many intervals [a[k], b[k]] (a[k] ≤ b[k]) at once, for a
 * cumulative pass along a grid. First tier: a five-point Lobatto rule per interval, its
 * three interior nodes and the interval ends evaluated in one batch call (an end shared with
 * the previous interval, a[k] = b[k−1], is evaluated once); the Simpson rule on the same nodes
 * is the error estimate. Intervals above the tolerance (either integral) go to the G3/K7
 * batch tier, and from there to adaptive G7/K15. Results go to outH[k], outS[k]; Cp at the
 * ends to outCpA[k], outCpB[k] when given.
 */
export function integrateIntervals(
  ig: Integrator,
  cpBatch: CpBatch,
  cp: CpFunction,
  a: Float64Array,
  b: Float64Array,
  m: number,
  outH: Float64Array,
  outS: Float64Array,
  outCpA?: Float64Array,
  outCpB?: Float64Array,
): void {
  // One batch: the 3 interior nodes of every interval, then the distinct ends in order.
  const X = ig.scratch.float("lobX", 5 * m);
  const F = ig.scratch.float("lobF", 5 * m);
  let redoA: Float64Array | null = null;
  let redoB: Float64Array | null = null;
  let redoIndex: Int32Array | null = null;
  let ne = 3 * m;
  for (let k = 0; k < m; k++) {
    if (k === 0 || a[k] !== b[k - 1]) X[ne++] = a[k];
    X[ne++] = b[k];
    const c = 0.5 * (a[k] + b[k]);
    const dx = 0.5 * (b[k] - a[k]) * XL;
    X[3 * k] = c - dx;
    X[3 * k + 1] = c;
    X[3 * k + 2] = c + dx;
  }
  cpBatch(X, F, ne);
  if (m > 0) ig.charge(ne, a[0], b[m - 1]);
  let nr = 0;
  let e = 3 * m;
  for (let k = 0; k < m; k++) {
    const ia = k === 0 || a[k] !== b[k - 1] ? e++ : e - 1;
    const ib = e++;
    const xa = X[ia];
    const xb = X[ib];
    const fa = F[ia];
    const fb = F[ib];
    if (outCpA) outCpA[k] = fa;
    if (outCpB) outCpB[k] = fb;
    const half = 0.5 * (xb - xa);
    if (half === 0) {
      outH[k] = 0;
      outS[k] = 0;
      continue;
    }
    const o = 3 * k;
    const f1 = F[o];
    const fc = F[o + 1];
    const f2 = F[o + 2];
    const ends = fa + fb;
    const endsS = fa / xa + fb / xb;
    const gc = fc / X[o + 1];
    const lh = WL_END * ends + WL_IN * (f1 + f2) + WL_CENTER * fc;
    const ls = WL_END * endsS + WL_IN * (f1 / X[o] + f2 / X[o + 2]) + WL_CENTER * gc;
    const sh = WS_END * ends + WS_CENTER * fc;
    const ss = WS_END * endsS + WS_CENTER * gc;
    const h = lh * half;
    const sv = ls * half;
    if (!Number.isFinite(h + sv)) ig.refuseNonfinite(cp, xa, xb);
    let good = Math.abs((lh - sh) * half) <= REL_TOL * Math.abs(h) + 1e-300 && Math.abs((ls - ss) * half) <= REL_TOL * Math.abs(sv) + 1e-300;
    if (!good) {
      const ah = (WL_END * (Math.abs(fa) + Math.abs(fb)) + WL_IN * (Math.abs(f1) + Math.abs(f2)) + WL_CENTER * Math.abs(fc)) * half;
      const as = (WL_END * (Math.abs(fa / xa) + Math.abs(fb / xb)) + WL_IN * (Math.abs(f1 / X[o]) + Math.abs(f2 / X[o + 2])) + WL_CENTER * Math.abs(gc)) * half;
      good = ig.acceptable(Math.abs((lh - sh) * half), Math.abs((ls - ss) * half), h, sv, ah, as, xa, xb);
    }
    if (good) {
      outH[k] = h;
      outS[k] = sv;
    } else {
      if (redoA === null) {
        redoA = ig.scratch.float("redoA", m);
        redoB = ig.scratch.float("redoB", m);
        redoIndex = ig.scratch.int("redoIndex", m);
      }
      redoA[nr] = xa;
      redoB![nr] = xb;
      redoIndex![nr++] = k;
    }
  }
  if (nr === 0) return;
  // The redo arrays may be reused by a nested call only after these results are copied out.
  const ra = redoA!.slice(0, nr);
  const rb = redoB!.slice(0, nr);
  const ri = redoIndex!.slice(0, nr);
  const rh = new Float64Array(nr);
  const rs = new Float64Array(nr);
  integrateIntervalsK7(ig, cpBatch, cp, ra, rb, nr, rh, rs);
  for (let q = 0; q < nr; q++) {
    outH[ri[q]] = rh[q];
    outS[ri[q]] = rs[q];
  }
}

/**
 * The second tier: G3/K7 per interval, the 7 Kronrod nodes of every interval in one batch
 * call; an interval whose K7 − G3 difference is above the tolerance is redone by adaptive
 * G7/K15.
 */
function integrateIntervalsK7(ig: Integrator, cpBatch: CpBatch, cp: CpFunction, a: Float64Array, b: Float64Array, m: number, outH: Float64Array, outS: Float64Array): void {
  const need = 7 * m;
  const X = ig.scratch.float("k7X", need);
  const F = ig.scratch.float("k7F", need);
  for (let k = 0; k < m; k++) {
    const c = 0.5 * (a[k] + b[k]);
    const half = 0.5 * (b[k] - a[k]);
    const o = 7 * k;
    X[o] = c;
    for (let j = 0; j < 3; j++) {
      const dx = half * X7[j];
      X[o + 1 + 2 * j] = c - dx;
      X[o + 2 + 2 * j] = c + dx;
    }
  }
  cpBatch(X, F, need);
  if (m > 0) ig.charge(need, a[0], b[m - 1]);
  for (let k = 0; k < m; k++) {
    const half = 0.5 * (b[k] - a[k]);
    if (half === 0) {
      outH[k] = 0;
      outS[k] = 0;
      continue;
    }
    const o = 7 * k;
    const fc = F[o];
    const gc = fc / X[o];
    const f1 = F[o + 1] + F[o + 2];
    const s1 = F[o + 1] / X[o + 1] + F[o + 2] / X[o + 2];
    const f2 = F[o + 3] + F[o + 4];
    const s2 = F[o + 3] / X[o + 3] + F[o + 4] / X[o + 4];
    const f3 = F[o + 5] + F[o + 6];
    const s3 = F[o + 5] / X[o + 5] + F[o + 6] / X[o + 6];
    const kh = W7_CENTER * fc + W7[0] * f1 + W7[1] * f2 + W7[2] * f3;
    const ks = W7_CENTER * gc + W7[0] * s1 + W7[1] * s2 + W7[2] * s3;
    const gh = W3_CENTER * fc + W3 * f2;
    const gs = W3_CENTER * gc + W3 * s2;
    const h = kh * half;
    const s = ks * half;
    if (!Number.isFinite(h + s)) ig.refuseNonfinite(cp, a[k], b[k]);
    let good = Math.abs((kh - gh) * half) <= REL_TOL * Math.abs(h) + 1e-300 && Math.abs((ks - gs) * half) <= REL_TOL * Math.abs(s) + 1e-300;
    if (!good) {
      let ah = W7_CENTER * Math.abs(fc);
      let as = W7_CENTER * Math.abs(gc);
      for (let j = 0; j < 3; j++) {
        const w = W7[j];
        const p = F[o + 1 + 2 * j];
        const q = F[o + 2 + 2 * j];
        ah += w * (Math.abs(p) + Math.abs(q));
        as += w * (Math.abs(p / X[o + 1 + 2 * j]) + Math.abs(q / X[o + 2 + 2 * j]));
      }
      good = ig.acceptable(Math.abs((kh - gh) * half), Math.abs((ks - gs) * half), h, s, ah * half, as * half, a[k], b[k]);
    }
    if (good) {
      outH[k] = h;
      outS[k] = s;
    } else {
      ig.integrateCp(cp, a[k], b[k]);
      outH[k] = ig.h;
      outS[k] = ig.s;
    }
  }
}

/** The batch form of a pointwise Cp, for forms without their own. */
export function batchOf(cp: CpFunction): CpBatch {
  return (x, f, n) => {
    for (let i = 0; i < n; i++) f[i] = cp(x[i]);
  };
}
