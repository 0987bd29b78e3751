/**
 * Adaptive Gauss–Kronrod quadrature of Cp dT and Cp/T dT together: both integrals share
 * the same Cp evaluations. An `Integrator` belongs to one request (one `evaluate()` or
 * `speciesProperties()` call): it owns the work budget, the segment being integrated, the
 * last result (`h`, `s`, to avoid an allocation per grid interval) and every scratch buffer,
 * so nothing is shared between requests. Single intervals use adaptive G7/K15
 * (`integrateCp`); a pass along a grid uses the batched tiers in integrate-batch.ts.
 */
import { refuse } from "./errors";

// Kronrod 15-point abscissae and weights, Gauss 7-point weights (QUADPACK qk15). Read only.
const XGK: readonly number[] = [
  0.991455371120812639206854697526329, 0.949107912342758524526189684047851, 0.864864423359769072789712788640926, 0.741531185599394439863864773280788,
  0.586087235467691130294144845693013, 0.405845151377397166906606412076961, 0.207784955007898467600689403773245,
];
const WGK: readonly number[] = [
  0.02293532201052922496373200805897, 0.063092092629978553290700663189204, 0.104790010322250183839876322541518, 0.140653259715525918745189590510238,
  0.16900472663926790282658342659855, 0.190350578064785409913256402421014, 0.204432940075298892414161999234649,
];
const WGK_CENTER = 0.209482141084727828012999174891714;
// Gauss weights for the odd Kronrod nodes (XGK[1], XGK[3], XGK[5]) and the centre.
const WG: readonly number[] = [0.12948496616886969327061143267908, 0.27970539148927666790146777142378, 0.381830050505118944950369775488975];
const WG_CENTER = 0.417959183673469387755102040816327;

/** Relative accuracy asked of each integral (against |K15 − G7|, a pessimistic estimate). */
export const REL_TOL = 1e-13;
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

export interface CpFunction {
  (tK: number): number;
}

/** Default work budget of one request, in Cp evaluations (weighted by IntegrationSite.cost). */
export const WORK_BUDGET = 1e8;

function fmtK(x: number): string {
  return Number.isFinite(x) ? String(Number(x.toPrecision(6))) : String(x);
}

/**
 * The integration state of one request. `budget` is the work allowed (Cp evaluations,
 * weighted by the site's cost); exceeding it refuses `integration-budget` naming the species
 * and range being integrated. Without a budget (a model built on its own) the work is unbounded.
 */
export class Integrator {
  /** ∫ Cp dT (J/mol) and ∫ Cp/T dT (J/(mol·K)) of the last `integrateCp`. */
  h = 0;
  s = 0;
  /** Cp evaluations so far (unweighted; for tests and the benchmark). */
  evaluations = 0;
  /** Work used so far (weighted by the site's cost). */
  used = 0;
  readonly budget: number;
  /** The segment being integrated; set by the caller before integrating. */
  site: IntegrationSite | null = null;

  // The last G7/K15 rule: integrals, error estimates and ∫|·| of one interval.
  private ruleH = 0;
  private ruleS = 0;
  private ruleErrH = 0;
  private ruleErrS = 0;
  private ruleAbsH = 0;
  private ruleAbsS = 0;
  private readonly stackA = new Float64Array(MAX_DEPTH + 2);
  private readonly stackB = new Float64Array(MAX_DEPTH + 2);
  private readonly stackD = new Int32Array(MAX_DEPTH + 2);
  /** Scratch of the batched tiers (integrate-batch.ts) and of the grid walk (chain.ts), grown on demand. */
  readonly scratch = new Scratch();

  constructor(budget = Infinity) {
    this.budget = budget;
  }

  /** "species "X": the g segment 200–1500 K", for messages. */
  where(): string {
    const c = this.site;
    return c ? `species "${c.species}": the ${c.phase} segment ${fmtK(c.tminK)}–${fmtK(c.tmaxK)} K` : "a Cp model";
  }

  /** Count n Cp evaluations on [a, b] against the budget. */
  charge(n: number, a: number, b: number): void {
    this.evaluations += n;
    this.used += n * (this.site?.cost ?? 1);
    if (this.used > this.budget) {
      const c = this.site;
      refuse(
        "integration-budget",
        `${this.where()}: integrating Cp between ${fmtK(a)} K and ${fmtK(b)} K exceeded the work budget of ${this.budget} Cp evaluations for one request; its Cp cannot be integrated to working accuracy with that work (check the model, or ask for fewer temperatures)`,
        c ? { species: c.species, phase: c.phase, tminK: c.tminK, tmaxK: c.tmaxK, fromK: a, toK: b, budget: this.budget } : { fromK: a, toK: b, budget: this.budget },
      );
    }
  }

  /** Refuse a non-finite Cp (or a non-finite integral of a finite one) on [a, b]. */
  refuseNonfinite(cp: CpFunction, a: number, b: number): never {
    const c = this.site;
    const probe = [a, b, 0.5 * (a + b)];
    for (let j = 0; j < 7; j++) {
      const dx = 0.5 * (b - a) * XGK[j];
      probe.push(0.5 * (a + b) - dx, 0.5 * (a + b) + dx);
    }
    for (const t of probe) {
      const v = cp(t);
      if (!Number.isFinite(v)) {
        refuse("nonfinite-cp", `${this.where()}: Cp is not finite at ${fmtK(t)} K (got ${v}); the model cannot be integrated there`, {
          ...(c ? { species: c.species, phase: c.phase } : {}),
          tK: t,
        });
      }
    }
    refuse(
      "nonfinite-cp",
      `${this.where()}: the integral of Cp between ${fmtK(a)} K and ${fmtK(b)} K is not finite in double precision; the model's coefficients are outside any physical range`,
      { ...(c ? { species: c.species, phase: c.phase } : {}), fromK: a, toK: b },
    );
  }

  /** Accept an interval's estimate: relative to the integral and to ∫|Cp|, or below the rounding floor of its terms. */
  acceptable(errH: number, errS: number, h: number, s: number, absH: number, absS: number, lo: number, hi: number): boolean {
    if (errH <= REL_TOL * Math.max(Math.abs(h), absH) + 1e-300 && errS <= REL_TOL * Math.max(Math.abs(s), absS) + 1e-300) return true;
    const mag = this.site?.magnitude;
    if (!mag) return false;
    const m = Math.max(mag(lo), mag(0.5 * (lo + hi)), mag(hi));
    const floorH = FLOOR_ULPS * EPS * m * (hi - lo);
    return errH <= floorH && errS <= floorH / lo;
  }

  private rule(cp: CpFunction, a: number, b: number): void {
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
    this.charge(15, a, b);
    this.ruleH = kh * half;
    this.ruleAbsH = ah * half;
    this.ruleAbsS = as * half;
    this.ruleS = ks * half;
    this.ruleErrH = Math.abs((kh - gh) * half);
    this.ruleErrS = Math.abs((ks - gs) * half);
  }

  /**
   * ∫ₐᵇ Cp dT → this.h and ∫ₐᵇ Cp/T dT → this.s, for 0 < a ≤ b. Bisects wherever the
   * G7/K15 difference exceeds the tolerance. Returns false if the depth limit was reached.
   */
  integrateCp(cp: CpFunction, a: number, b: number): boolean {
    let h = 0;
    let s = 0;
    let ok = true;
    if (b === a) {
      this.h = 0;
      this.s = 0;
      return true;
    }
    const stackA = this.stackA;
    const stackB = this.stackB;
    const stackD = this.stackD;
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
      this.rule(cp, lo, hi);
      const ruleH = this.ruleH;
      const ruleS = this.ruleS;
      if (!Number.isFinite(ruleH + ruleS)) this.refuseNonfinite(cp, lo, hi);
      if (meanAbs0 < 0) meanAbs0 = this.ruleAbsH / (hi - lo);
      const good = this.acceptable(this.ruleErrH, this.ruleErrS, ruleH, ruleS, this.ruleAbsH, this.ruleAbsS, lo, hi);
      if (good || depth >= MAX_DEPTH) {
        if (!good) {
          ok = false;
          // Still not converged on an interval of width (b − a)/2^40: a mean |Cp| far above the
          // first estimate's means Cp grows without bound here (a pole), not a kink or a step.
          if (this.ruleAbsH / (hi - lo) > SINGULAR_RATIO * Math.max(meanAbs0, 1e-300)) {
            const c = this.site;
            refuse("nonfinite-cp", `${this.where()}: Cp grows without bound near ${fmtK(0.5 * (lo + hi))} K and cannot be integrated across it`, {
              ...(c ? { species: c.species, phase: c.phase } : {}),
              tK: 0.5 * (lo + hi),
            });
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
    this.h = h;
    this.s = s;
    return ok;
  }
}

/** Growable scratch arrays of one integrator; a getter returns an array of at least n entries (contents undefined). */
export class Scratch {
  private f64 = new Map<string, Float64Array>();
  private i32 = new Map<string, Int32Array>();

  float(name: string, n: number): Float64Array {
    const a = this.f64.get(name);
    if (a && a.length >= n) return a;
    const b = new Float64Array(n);
    this.f64.set(name, b);
    return b;
  }

  int(name: string, n: number): Int32Array {
    const a = this.i32.get(name);
    if (a && a.length >= n) return a;
    const b = new Int32Array(n);
    this.i32.set(name, b);
    return b;
  }
}
