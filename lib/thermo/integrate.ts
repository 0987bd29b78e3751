/**
 * Adaptive Gauss–Kronrod quadrature of Cp dT and Cp/T dT together: both integrals share
 * the same Cp evaluations. Single intervals use adaptive G7/K15; a pass along a grid uses
 * a batched G3/K7 rule per interval with the same error check, falling back to G7/K15. Results are left in `quad.h` and `quad.s`
 * (J/mol and J/(mol·K)) to avoid an allocation per grid interval.
 */
import { refuse } from "./errors";

// Kronrod 15-point abscissae and weights, Gauss 7-point weights (QUADPACK qk15).
const XGK = new Float64Array([
  0.991455371120812639206854697526329, 0.949107912342758524526189684047851,
  0.864864423359769072789712788640926, 0.741531185599394439863864773280788,
  0.586087235467691130294144845693013, 0.405845151377397166906606412076961,
  0.207784955007898467600689403773245,
]);
const WGK = new Float64Array([
  0.02293532201052922496373200805897, 0.063092092629978553290700663189204,
  0.104790010322250183839876322541518, 0.140653259715525918745189590510238,
  0.16900472663926790282658342659855, 0.190350578064785409913256402421014,
  0.204432940075298892414161999234649,
]);
const WGK_CENTER = 0.209482141084727828012999174891714;
// Gauss weights for the odd Kronrod nodes (XGK[1], XGK[3], XGK[5]) and the centre.
const WG = new Float64Array([0.12948496616886969327061143267908, 0.27970539148927666790146777142378, 0.381830050505118944950369775488975]);
const WG_CENTER = 0.417959183673469387755102040816327;

/** Relative accuracy asked of each integral (against |K15 − G7|, a pessimistic estimate). */
const REL_TOL = 1e-13;
const MAX_DEPTH = 40;
/**
 * Rounding floor: an error estimate below FLOOR_ULPS machine epsilons of the size of Cp's
 * terms (times the interval) is rounding noise, not truncation error, and is accepted. A
 * polynomial whose terms are 1e4 times its value (NASA-9 liquid water) cannot meet 1e-13
 * relative; without the floor bisection ran to its depth limit on every interval.
 */
const FLOOR_ULPS = 64;
const EPS = Number.EPSILON;
/** At the depth limit, a mean |Cp| this many times the interval's first estimate means Cp grows without bound there. */
const SINGULAR_RATIO = 1e8;

/** The segment being integrated, for the work budget, the rounding floor and messages. */
export interface IntegrationSite {
  species: string;
  phase: string;
  tminK: number;
  tmaxK: number;
  /** Work units per Cp evaluation (1 for a polynomial; more for an expression). */
  cost?: number;
  /** Σ|terms| of Cp at T (J/(mol·K)): the size of what is summed, for the rounding floor. Default |Cp|. */
  magnitude?: (tK: number) => number;
}

export const site: { current: IntegrationSite | null } = { current: null };

/** Default work budget of one request, in Cp evaluations (weighted by IntegrationSite.cost). */
export const WORK_BUDGET = 1e8;
let workUsed = 0;
let workLimit = Infinity;

/**
 * Run fn with a budget on the integration work (Cp evaluations, weighted); exceeding it
 * refuses `integration-budget` naming the species and range being integrated. Nested budgets
 * never exceed what is left of the enclosing one, and their work counts towards it.
 */
export function withWorkBudget<T>(limit: number, fn: () => T): T {
  const used = workUsed;
  const lim = workLimit;
  workUsed = 0;
  workLimit = Math.min(limit, lim - used);
  try {
    return fn();
  } finally {
    workUsed = used + workUsed;
    workLimit = lim;
  }
}

/** Work used so far inside the innermost withWorkBudget (for tests and the benchmark). */
export function workSoFar(): number {
  return workUsed;
}

function where(): string {
  const c = site.current;
  return c ? `species "${c.species}": the ${c.phase} segment ${fmtK(c.tminK)}–${fmtK(c.tmaxK)} K` : "a Cp model";
}

function fmtK(x: number): string {
  return Number.isFinite(x) ? String(Number(x.toPrecision(6))) : String(x);
}

function charge(n: number, a: number, b: number): void {
  quad.evaluations += n;
  workUsed += n * (site.current?.cost ?? 1);
  if (workUsed > workLimit) {
    const c = site.current;
    refuse(
      "integration-budget",
      `${where()}: integrating Cp between ${fmtK(a)} K and ${fmtK(b)} K exceeded the work budget of ${workLimit} Cp evaluations for one request; its Cp cannot be integrated to working accuracy with that work (check the model, or ask for fewer temperatures)`,
      c ? { species: c.species, phase: c.phase, tminK: c.tminK, tmaxK: c.tmaxK, fromK: a, toK: b, budget: workLimit } : { fromK: a, toK: b, budget: workLimit },
    );
  }
}

/** Refuse a non-finite Cp (or a non-finite integral of a finite one) on [a, b]. */
function refuseNonfinite(cp: CpFunction, a: number, b: number): never {
  const c = site.current;
  const probe = [a, b, 0.5 * (a + b)];
  for (let j = 0; j < 7; j++) {
    const dx = 0.5 * (b - a) * XGK[j];
    probe.push(0.5 * (a + b) - dx, 0.5 * (a + b) + dx);
  }
  for (const t of probe) {
    const v = cp(t);
    if (!Number.isFinite(v)) {
      refuse("nonfinite-cp", `${where()}: Cp is not finite at ${fmtK(t)} K (got ${v}); the model cannot be integrated there`, {
        ...(c ? { species: c.species, phase: c.phase } : {}), tK: t,
      });
    }
  }
  refuse(
    "nonfinite-cp",
    `${where()}: the integral of Cp between ${fmtK(a)} K and ${fmtK(b)} K is not finite in double precision; the model's coefficients are outside any physical range`,
    { ...(c ? { species: c.species, phase: c.phase } : {}), fromK: a, toK: b },
  );
}

/** Accept an interval's estimate: relative to the integral and to ∫|Cp|, or below the rounding floor of its terms. */
function acceptable(errH: number, errS: number, h: number, s: number, absH: number, absS: number, lo: number, hi: number): boolean {
  if (errH <= REL_TOL * Math.max(Math.abs(h), absH) + 1e-300 && errS <= REL_TOL * Math.max(Math.abs(s), absS) + 1e-300) return true;
  const mag = site.current?.magnitude;
  if (!mag) return false;
  const m = Math.max(mag(lo), mag(0.5 * (lo + hi)), mag(hi));
  const floorH = FLOOR_ULPS * EPS * m * (hi - lo);
  return errH <= floorH && errS <= floorH / lo;
}

export interface CpFunction {
  (tK: number): number;
}

export const quad = { h: 0, s: 0, evaluations: 0 };

let ruleH = 0;
let ruleS = 0;
let ruleErrH = 0;
let ruleErrS = 0;
let ruleAbsH = 0;
let ruleAbsS = 0;

function rule(cp: CpFunction, a: number, b: number): void {
  const c = 0.5 * (a + b);
  const half = 0.5 * (b - a);
  const fc = cp(c);
  const gc = fc / c;
  let kh = WGK_CENTER * fc;
  let ks = WGK_CENTER * gc;
  let gh = WG_CENTER * fc;
  let gs = WG_CENTER * gc;
  let ah = WGK_CENTER * Math.abs(fc);
  let as = WGK_CENTER * Math.abs(gc);
  for (let j = 0; j < 7; j++) {
    const dx = half * XGK[j];
    const x1 = c - dx;
    const x2 = c + dx;
    const f1 = cp(x1);
    const f2 = cp(x2);
    const sh = f1 + f2;
    const ss = f1 / x1 + f2 / x2;
    kh += WGK[j] * sh;
    ks += WGK[j] * ss;
    ah += WGK[j] * (Math.abs(f1) + Math.abs(f2));
    as += WGK[j] * (Math.abs(f1 / x1) + Math.abs(f2 / x2));
    if (j & 1) {
      const w = WG[j >> 1];
      gh += w * sh;
      gs += w * ss;
    }
  }
  charge(15, a, b);
  ruleH = kh * half;
  ruleAbsH = ah * half;
  ruleAbsS = as * half;
  ruleS = ks * half;
  ruleErrH = Math.abs((kh - gh) * half);
  ruleErrS = Math.abs((ks - gs) * half);
}

const stackA = new Float64Array(MAX_DEPTH + 2);
const stackB = new Float64Array(MAX_DEPTH + 2);
const stackD = new Int32Array(MAX_DEPTH + 2);

/**
 * ∫ₐᵇ Cp dT → quad.h and ∫ₐᵇ Cp/T dT → quad.s, for 0 < a ≤ b. Bisects wherever the
 * G7/K15 difference exceeds the tolerance. Returns false if the depth limit was reached.
 */
export function integrateCp(cp: CpFunction, a: number, b: number): boolean {
  let h = 0;
  let s = 0;
  let ok = true;
  if (b === a) {
    quad.h = 0;
    quad.s = 0;
    return true;
  }
  let top = 0;
  stackA[0] = a;
  stackB[0] = b;
  stackD[0] = 0;
  let meanAbs0 = -1;
  while (top >= 0) {
    const lo = stackA[top];
    const hi = stackB[top];
    const depth = stackD[top];
    top--;
    rule(cp, lo, hi);
    if (!Number.isFinite(ruleH + ruleS)) refuseNonfinite(cp, lo, hi);
    if (meanAbs0 < 0) meanAbs0 = ruleAbsH / (hi - lo);
    const good = acceptable(ruleErrH, ruleErrS, ruleH, ruleS, ruleAbsH, ruleAbsS, lo, hi);
    if (good || depth >= MAX_DEPTH) {
      if (!good) {
        ok = false;
        // Still not converged on an interval of width (b − a)/2^40: a mean |Cp| far above the
        // first estimate's means Cp grows without bound here (a pole), not a kink or a step.
        if (ruleAbsH / (hi - lo) > SINGULAR_RATIO * Math.max(meanAbs0, 1e-300)) {
          const c = site.current;
          refuse(
            "nonfinite-cp",
            `${where()}: Cp grows without bound near ${fmtK(0.5 * (lo + hi))} K and cannot be integrated across it`,
            { ...(c ? { species: c.species, phase: c.phase } : {}), tK: 0.5 * (lo + hi) },
          );
        }
      }
      h += ruleH;
      s += ruleS;
      continue;
    }
    const mid = 0.5 * (lo + hi);
    // Push the upper half first so the lower half is summed first (left-to-right order).
    top++;
    stackA[top] = mid;
    stackB[top] = hi;
    stackD[top] = depth + 1;
    top++;
    stackA[top] = lo;
    stackB[top] = mid;
    stackD[top] = depth + 1;
  }
  quad.h = h;
  quad.s = s;
  return ok;
}

export interface CpBatch {
  /** f[i] = Cp(x[i]) for i < n. */
  (x: Float64Array, f: Float64Array, n: number): void;
}

// Kronrod 7-point extension of the 3-point Gauss rule (abscissae and weights on [−1, 1]).
const X7 = new Float64Array([0.9604912687080202834235071, 0.7745966692414833770358531, 0.4342437493468025580020715]);
const W7 = new Float64Array([0.1046562260264672651938239, 0.2684880898683334407285692, 0.4013974147759622229050518]);
const W7_CENTER = 0.4509165386584741423451498;
const W3 = 5 / 9; // Gauss 3-point weight at ±X7[1]
const W3_CENTER = 8 / 9;

let scratchX = new Float64Array(0);
let scratchF = new Float64Array(0);

// Five-point Gauss–Lobatto rule (nodes 0, ±√(3/7), ±1; exact to degree 7) with Simpson's rule
// on three of its nodes (0, ±1; degree 3) as the error estimate. The end nodes are the grid
// temperatures, so neighbouring intervals share them and the grid's own Cp values come free.
const XL = Math.sqrt(3 / 7);
const WL_END = 1 / 10;
const WL_IN = 49 / 90;
const WL_CENTER = 32 / 45;
const WS_END = 1 / 3;
const WS_CENTER = 4 / 3;

let lobX = new Float64Array(0);
let lobF = new Float64Array(0);
let redoA = new Float64Array(0);
let redoB = new Float64Array(0);
let redoH = new Float64Array(0);
let redoS = new Float64Array(0);
let redoIndex = new Int32Array(0);

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
  if (lobX.length < 5 * m) {
    lobX = new Float64Array(5 * m);
    lobF = new Float64Array(5 * m);
  }
  const X = lobX;
  const F = lobF;
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
  if (m > 0) charge(ne, a[0], b[m - 1]);
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
    if (!Number.isFinite(h + sv)) refuseNonfinite(cp, xa, xb);
    let good =
      Math.abs((lh - sh) * half) <= REL_TOL * Math.abs(h) + 1e-300 && Math.abs((ls - ss) * half) <= REL_TOL * Math.abs(sv) + 1e-300;
    if (!good) {
      const ah = (WL_END * (Math.abs(fa) + Math.abs(fb)) + WL_IN * (Math.abs(f1) + Math.abs(f2)) + WL_CENTER * Math.abs(fc)) * half;
      const as =
        (WL_END * (Math.abs(fa / xa) + Math.abs(fb / xb)) + WL_IN * (Math.abs(f1 / X[o]) + Math.abs(f2 / X[o + 2])) + WL_CENTER * Math.abs(gc)) * half;
      good = acceptable(Math.abs((lh - sh) * half), Math.abs((ls - ss) * half), h, sv, ah, as, xa, xb);
    }
    if (good) {
      outH[k] = h;
      outS[k] = sv;
    } else {
      if (redoA.length < m) {
        redoA = new Float64Array(m);
        redoB = new Float64Array(m);
        redoH = new Float64Array(m);
        redoS = new Float64Array(m);
        redoIndex = new Int32Array(m);
      }
      redoA[nr] = xa;
      redoB[nr] = xb;
      redoIndex[nr++] = k;
    }
  }
  if (nr === 0) return;
  // The redo arrays may be reused by a nested call only after these results are copied out.
  const ra = redoA.slice(0, nr);
  const rb = redoB.slice(0, nr);
  const ri = redoIndex.slice(0, nr);
  const rh = redoH.length >= nr ? redoH : new Float64Array(nr);
  const rs = redoS.length >= nr ? redoS : new Float64Array(nr);
  integrateIntervalsK7(cpBatch, cp, ra, rb, nr, rh, rs);
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
function integrateIntervalsK7(
  cpBatch: CpBatch,
  cp: CpFunction,
  a: Float64Array,
  b: Float64Array,
  m: number,
  outH: Float64Array,
  outS: Float64Array,
): void {
  const need = 7 * m;
  if (scratchX.length < need) {
    scratchX = new Float64Array(need);
    scratchF = new Float64Array(need);
  }
  const X = scratchX;
  const F = scratchF;
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
  if (m > 0) charge(need, a[0], b[m - 1]);
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
    if (!Number.isFinite(h + s)) refuseNonfinite(cp, a[k], b[k]);
    let good =
      Math.abs((kh - gh) * half) <= REL_TOL * Math.abs(h) + 1e-300 && Math.abs((ks - gs) * half) <= REL_TOL * Math.abs(s) + 1e-300;
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
      good = acceptable(Math.abs((kh - gh) * half), Math.abs((ks - gs) * half), h, s, ah * half, as * half, a[k], b[k]);
    }
    if (good) {
      outH[k] = h;
      outS[k] = s;
    } else {
      integrateCp(cp, a[k], b[k]);
      outH[k] = quad.h;
      outS[k] = quad.s;
    }
  }
}

/** The batch form of a pointwise Cp, for forms without their own. */
export function batchOf(cp: CpFunction): CpBatch {
  return (x, f, n) => {
    for (let i = 0; i < n; i++) f[i] = cp(x[i]);
  };
}
