/**
 * Adaptive Gauss–Kronrod (G7/K15) quadrature of Cp dT and Cp/T dT together: both
 * integrals share the same Cp evaluations. Results are left in `quad.h` and `quad.s`
 * (J/mol and J/(mol·K)) to avoid an allocation per grid interval.
 */

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

export interface CpFunction {
  (tK: number): number;
}

export const quad = { h: 0, s: 0, evaluations: 0 };

let ruleH = 0;
let ruleS = 0;
let ruleErrH = 0;
let ruleErrS = 0;

function rule(cp: CpFunction, a: number, b: number): void {
  const c = 0.5 * (a + b);
  const half = 0.5 * (b - a);
  const fc = cp(c);
  const gc = fc / c;
  let kh = WGK_CENTER * fc;
  let ks = WGK_CENTER * gc;
  let gh = WG_CENTER * fc;
  let gs = WG_CENTER * gc;
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
    if (j & 1) {
      const w = WG[j >> 1];
      gh += w * sh;
      gs += w * ss;
    }
  }
  quad.evaluations += 15;
  ruleH = kh * half;
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
  while (top >= 0) {
    const lo = stackA[top];
    const hi = stackB[top];
    const depth = stackD[top];
    top--;
    rule(cp, lo, hi);
    const good =
      ruleErrH <= REL_TOL * Math.abs(ruleH) + 1e-300 && ruleErrS <= REL_TOL * Math.abs(ruleS) + 1e-300;
    if (good || depth >= MAX_DEPTH || !Number.isFinite(ruleH + ruleS)) {
      if (!good) ok = false;
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
