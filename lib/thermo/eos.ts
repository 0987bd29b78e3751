/**
 * Peng–Robinson equation of state (Peng & Robinson, Ind. Eng. Chem. Fundam. 15 (1976) 59),
 * with van der Waals one-fluid mixing: a = ΣΣ y_i y_j (1 − k_ij) √(a_i a_j), b = Σ y_i b_i.
 * Pure numerics: compressibility factor and fugacity coefficients of a gas mixture.
 *
 *   P = RT/(v − b) − a(T)/(v² + 2bv − b²)
 *   a_i = 0.45724 R²Tc²/Pc · [1 + κ(1 − √(T/Tc))]², b_i = 0.07780 R Tc/Pc
 *   κ = 0.37464 + 1.54226 ω − 0.26992 ω²   (ω ≤ 0.49; the 1978 form above)
 *   Z³ − (1 − B) Z² + (A − 3B² − 2B) Z − (AB − B² − B³) = 0, A = aP/(RT)², B = bP/(RT)
 *   ln φ_i = (b_i/b)(Z − 1) − ln(Z − B)
 *            − A/(2√2 B) · (2 Σ_j y_j a_ij / a − b_i/b) · ln[(Z + (1+√2)B)/(Z + (1−√2)B)]
 */
import { R } from "./constants";

export interface CriticalConstants {
  /** Critical temperature, K. */
  tcK: number;
  /** Critical pressure, bar. */
  pcBar: number;
  /** Acentric factor (dimensionless). */
  omega: number;
}

const SQRT2 = Math.SQRT2;
const OMEGA_A = 0.45724;
const OMEGA_B = 0.0778;

/** κ of the α function: the 1976 correlation, and the 1978 one for ω above 0.49. */
export function prKappa(omega: number): number {
  if (omega <= 0.49) return 0.37464 + 1.54226 * omega - 0.26992 * omega * omega;
  return 0.379642 + 1.48503 * omega - 0.164423 * omega * omega + 0.016666 * omega ** 3;
}

/** a_i (Pa·m⁶/mol²) and b_i (m³/mol) of one species at T. */
export function prPureParameters(c: CriticalConstants, tK: number): { a: number; b: number } {
  const pc = c.pcBar * 1e5;
  const k = prKappa(c.omega);
  const alpha = (1 + k * (1 - Math.sqrt(tK / c.tcK))) ** 2;
  return { a: (OMEGA_A * (R * c.tcK) ** 2 * alpha) / pc, b: (OMEGA_B * R * c.tcK) / pc };
}

/** Real roots of the PR cubic in Z above B, ascending. */
export function prCubicRoots(A: number, B: number): number[] {
  // Z³ + c2 Z² + c1 Z + c0 = 0
  const c2 = -(1 - B);
  const c1 = A - 3 * B * B - 2 * B;
  const c0 = -(A * B - B * B - B * B * B);
  const p = c1 - (c2 * c2) / 3;
  const q = (2 * c2 ** 3) / 27 - (c2 * c1) / 3 + c0;
  const disc = (q * q) / 4 + (p * p * p) / 27;
  let roots: number[];
  if (disc > 0) {
    const s = Math.sqrt(disc);
    roots = [Math.cbrt(-q / 2 + s) + Math.cbrt(-q / 2 - s) - c2 / 3];
  } else {
    const r = Math.sqrt(-p / 3);
    const phi = Math.acos(Math.max(-1, Math.min(1, (3 * q) / (2 * p * r))));
    roots = [0, 1, 2].map((k) => 2 * r * Math.cos(phi / 3 - (2 * Math.PI * k) / 3) - c2 / 3);
  }
  // Newton polish: the trigonometric/Cardano forms lose digits near a double root.
  const f = (z: number) => ((z + c2) * z + c1) * z + c0;
  const df = (z: number) => (3 * z + 2 * c2) * z + c1;
  const polished = roots.map((z) => {
    for (let i = 0; i < 4; i++) {
      const d = df(z);
      if (d === 0) break;
      const step = f(z) / d;
      z -= step;
      if (Math.abs(step) < 1e-16 * Math.abs(z)) break;
    }
    return z;
  });
  return polished.filter((z) => z > B && Number.isFinite(z)).sort((a, b) => a - b);
}

/** Residual G/RT of the mixture at root Z (the root of lowest value is the stable one). */
function residualG(Z: number, A: number, B: number): number {
  return Z - 1 - Math.log(Z - B) - (A / (2 * SQRT2 * B)) * Math.log((Z + (1 + SQRT2) * B) / (Z + (1 - SQRT2) * B));
}

export interface PRMixtureResult {
  /** Compressibility factor of the chosen root. */
  z: number;
  /** ln φ_i per species, in the order given. */
  lnPhi: number[];
  /** Every real root above B (ascending); more than one means the cubic has a liquid-like root too. */
  roots: number[];
  /** The chosen root is the smallest of several (liquid-like): a phase split may be possible. */
  liquidLike: boolean;
}

/**
 * Z and ln φ_i of a mixture at T (K) and P (bar). `kij[i][j]` binary interaction parameters
 * (symmetric, zero on the diagonal; omitted means 0). Of several real roots the one of
 * lowest residual Gibbs energy is taken.
 */
export function prMixture(tK: number, pBar: number, y: ArrayLike<number>, crit: readonly CriticalConstants[], kij?: readonly (readonly number[])[]): PRMixtureResult {
  const n = crit.length;
  const pars = crit.map((c) => prPureParameters(c, tK));
  const P = pBar * 1e5;
  const RT = R * tK;
  let ysum = 0;
  for (let i = 0; i < n; i++) ysum += y[i];
  const x = Array.from({ length: n }, (_, i) => (ysum > 0 ? y[i] / ysum : 0));
  const aij = (i: number, j: number) => (1 - (kij?.[i]?.[j] ?? 0)) * Math.sqrt(pars[i].a * pars[j].a);
  const sumA = new Array<number>(n).fill(0);
  let a = 0;
  let b = 0;
  for (let i = 0; i < n; i++) {
    b += x[i] * pars[i].b;
    for (let j = 0; j < n; j++) sumA[i] += x[j] * aij(i, j);
    a += x[i] * sumA[i];
  }
  const A = (a * P) / (RT * RT);
  const B = (b * P) / RT;
  const roots = prCubicRoots(A, B);
  let Z = roots[roots.length - 1];
  if (roots.length > 1) {
    let best = Infinity;
    for (const r of roots) {
      const g = residualG(r, A, B);
      if (g < best) {
        best = g;
        Z = r;
      }
    }
  }
  const L = Math.log((Z + (1 + SQRT2) * B) / (Z + (1 - SQRT2) * B));
  const lnPhi = pars.map((pi, i) => {
    const bi = pi.b / b;
    return bi * (Z - 1) - Math.log(Z - B) - (A / (2 * SQRT2 * B)) * ((2 * sumA[i]) / a - bi) * L;
  });
  return { z: Z, lnPhi, roots, liquidLike: roots.length > 1 && Z === roots[0] };
}

/** Compressibility factor of a pure gas (largest root unless a lower one has lower G). */
export function prZPure(c: CriticalConstants, tK: number, pBar: number): number {
  return prMixture(tK, pBar, [1], [c]).z;
}
