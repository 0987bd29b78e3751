/**
 * Equilibrium composition from a feed: ideal-gas activities (x_i·p/p°, p° = 1 bar), pure
 * condensed phases at unit activity. One reaction: a bounded, monotone root search on the
 * extent, carried out in ln(distance to the nearer bound) so that an extreme K (10^±300)
 * lands exactly at, or a representable distance from, the bound. Several reactions: Newton
 * on the extents (the Hessian of G/RT) with a line search that keeps every amount positive.
 * Pure numerics: the caller supplies μ°/RT of every species at each temperature.
 */
import { refuse } from "./errors";
import { brent } from "./roots";

/** One temperature's problem. Species are indexed 0..S−1, reactions 0..R−1. */
export interface EquilibriumProblem {
  /** Feed amounts (any unit of amount; results come back in the same unit). */
  n0: Float64Array;
  /** nu[j][i]: coefficient of species i in reaction j (products positive). */
  nu: number[][];
  /** Species i is in the gas phase at this temperature (else pure condensed, unit activity). */
  gas: boolean[];
  /** μ°_i/(RT) at this temperature (standard state 1 bar); inert species carry 0. */
  g: Float64Array;
  /** ln(p / 1 bar). */
  lnP: number;
}

export interface EquilibriumSolution {
  extents: number[];
  moles: Float64Array;
  converged: boolean;
  iterations: number;
  /** max_j |Σ_i ν_ji μ_i/RT| at the solution (dimensionless; 0 at an exact equilibrium). */
  residual: number;
  /** Reactions whose extent sits at a bound of the feasible range (an amount exactly 0). */
  atBound: boolean[];
  /** d(extents)/d(g): R × S sensitivity of the extents to μ°/RT, for uncertainty propagation. */
  sensitivity: number[][];
}

/** Smallest positive double's logarithm: below this a distance to a bound is exactly 0. */
const LN_TINY = Math.log(Number.MIN_VALUE);

function gasTotal(n: Float64Array, gas: boolean[]): number {
  let t = 0;
  for (let i = 0; i < n.length; i++) if (gas[i]) t += n[i];
  return t;
}

/** Σ_i ν_i μ_i/RT for reaction `nu` at amounts `n` (ΔrG/RT at the composition). */
function reactionAffinity(nu: number[], n: Float64Array, p: EquilibriumProblem, lnNg: number): number {
  let f = 0;
  for (let i = 0; i < nu.length; i++) {
    const v = nu[i];
    if (v === 0) continue;
    f += v * p.g[i];
    if (p.gas[i]) f += v * (Math.log(n[i]) - lnNg + p.lnP);
  }
  return f;
}

/** Hessian of G/RT in the extents: Σ_gas ν_j ν_k / n_i − Δν_j Δν_k / n_gas. */
function hessian(p: EquilibriumProblem, n: Float64Array): number[][] {
  const R = p.nu.length;
  const ng = gasTotal(n, p.gas);
  const dnu = p.nu.map((row) => row.reduce((a, v, i) => a + (p.gas[i] ? v : 0), 0));
  const J: number[][] = [];
  for (let j = 0; j < R; j++) {
    J.push(new Array(R).fill(0));
    for (let k = 0; k < R; k++) {
      let s = 0;
      for (let i = 0; i < n.length; i++) {
        if (!p.gas[i]) continue;
        const a = p.nu[j][i];
        const b = p.nu[k][i];
        if (a !== 0 && b !== 0) s += (a * b) / n[i];
      }
      J[j][k] = s - (ng > 0 ? (dnu[j] * dnu[k]) / ng : 0);
    }
  }
  return J;
}

/** Solve A x = b (small dense, partial pivoting); null when A is singular to working precision. */
export function solveDense(A: number[][], b: number[]): number[] | null {
  const m = A.length;
  const M = A.map((row, i) => [...row, b[i]]);
  let scale = 0;
  for (const row of A) for (const v of row) scale = Math.max(scale, Math.abs(v));
  if (!(scale > 0) || !Number.isFinite(scale)) return null;
  for (let c = 0; c < m; c++) {
    let piv = c;
    for (let r = c + 1; r < m; r++) if (Math.abs(M[r][c]) > Math.abs(M[piv][c])) piv = r;
    if (!(Math.abs(M[piv][c]) > 1e-14 * scale)) return null;
    [M[c], M[piv]] = [M[piv], M[c]];
    for (let r = c + 1; r < m; r++) {
      const f = M[r][c] / M[c][c];
      if (f === 0) continue;
      for (let k = c; k <= m; k++) M[r][k] -= f * M[c][k];
    }
  }
  const x = new Array(m).fill(0);
  for (let r = m - 1; r >= 0; r--) {
    let s = M[r][m];
    for (let k = r + 1; k < m; k++) s -= M[r][k] * x[k];
    x[r] = s / M[r][r];
  }
  return x;
}

/** d(extents)/d(g) = −J⁻¹ Nᵀ at an interior solution; zero rows for reactions pinned at a bound. */
function sensitivityOf(p: EquilibriumProblem, n: Float64Array, atBound: boolean[]): number[][] {
  const R = p.nu.length;
  const S = n.length;
  const free = [...Array(R).keys()].filter((j) => !atBound[j]);
  const out = Array.from({ length: R }, () => new Array(S).fill(0));
  if (free.length === 0) return out;
  const Jfull = hessian(p, n);
  const J = free.map((j) => free.map((k) => Jfull[j][k]));
  for (let i = 0; i < S; i++) {
    const rhs = free.map((j) => -p.nu[j][i]);
    if (rhs.every((v) => v === 0)) continue;
    const x = solveDense(J, rhs);
    if (!x) continue;
    free.forEach((j, q) => (out[j][i] = Number.isFinite(x[q]) ? x[q] : 0));
  }
  return out;
}

/**
 * One reaction. f(ξ) = ΔrG/RT + ln Q(ξ) is non-decreasing in ξ (Cauchy–Schwarz on the gas
 * terms), so the root is bracketed by the feasible range [ξlo, ξhi]. The search runs on
 * t = ln d, d = distance from the nearer bound, with the amounts built from that bound, so
 * that a species close to exhaustion keeps full relative precision.
 */
export function solveSingle(p: EquilibriumProblem): EquilibriumSolution {
  const nu = p.nu[0];
  const S = p.n0.length;
  let lo = -Infinity;
  let hi = Infinity;
  for (let i = 0; i < S; i++) {
    if (nu[i] > 0) lo = Math.max(lo, -p.n0[i] / nu[i]);
    else if (nu[i] < 0) hi = Math.min(hi, p.n0[i] / -nu[i]);
  }
  if (!Number.isFinite(lo) || !Number.isFinite(hi)) {
    // Only possible for a reaction with species on one side only, which parseReaction forbids
    // unless every term is inert: nothing moves.
    return finish(p, [0], Float64Array.from(p.n0), true, 0, [true]);
  }
  const base = (xi: number): Float64Array => {
    const n = new Float64Array(S);
    for (let i = 0; i < S; i++) {
      n[i] = p.n0[i] + nu[i] * xi;
      // The species that defines the bound is exhausted there exactly.
      if (nu[i] !== 0 && Math.abs(n[i]) <= 1e-15 * Math.max(p.n0[i], Math.abs(nu[i] * xi))) n[i] = 0;
      if (n[i] < 0) n[i] = 0;
    }
    return n;
  };
  if (hi - lo <= 0) return finish(p, [lo], base(lo), true, 0, [true]);

  const nLo = base(lo);
  const nHi = base(hi);
  const amounts = (fromLo: boolean, d: number, out: Float64Array): Float64Array => {
    const b = fromLo ? nLo : nHi;
    const sgn = fromLo ? 1 : -1;
    for (let i = 0; i < S; i++) out[i] = Math.max(0, b[i] + sgn * nu[i] * d);
    return out;
  };
  const work = new Float64Array(S);
  const fAt = (n: Float64Array): number => {
    const ng = gasTotal(n, p.gas);
    return reactionAffinity(nu, n, p, Math.log(ng));
  };
  const half = 0.5 * (hi - lo);
  let iterations = 0;
  const fMid = fAt(amounts(true, half, work));
  if (fMid === 0) return finish(p, [lo + half], amounts(true, half, new Float64Array(S)), true, 1, [false]);
  const fromLo = fMid > 0;
  const sgn = fromLo ? 1 : -1;
  // φ(t) has the sign of f at distance e^t from the chosen bound, oriented so that φ(tmax) > 0.
  const phi = (t: number) => {
    iterations++;
    const v = sgn * fAt(amounts(fromLo, Math.exp(t), work));
    return Number.isNaN(v) ? -1 : v;
  };
  const tMax = Math.log(half);
  const pMin = phi(LN_TINY);
  let d: number;
  if (pMin >= 0) {
    d = 0; // the equilibrium is at the bound (or closer to it than a double can say)
  } else {
    const t = brent(phi, LN_TINY, tMax, pMin, sgn * fMid, 1e-15, 400);
    d = Math.exp(t);
    // Newton polish in d: f' = Σ_gas ν²/n − Δν²/n_gas along ξ.
    for (let k = 0; k < 3; k++) {
      const n = amounts(fromLo, d, work);
      const f = fAt(n);
      const J = hessian(p, n)[0][0];
      if (!(J > 0) || !Number.isFinite(J)) break;
      const dNew = d - (sgn * f) / J;
      if (!(dNew > 0) || dNew > half || Math.abs(dNew - d) >= 0.5 * d) break;
      iterations++;
      if (dNew === d) break;
      d = dNew;
    }
  }
  const n = amounts(fromLo, d, new Float64Array(S));
  const xi = fromLo ? lo + d : hi - d;
  return finish(p, [xi], n, true, iterations, [d === 0]);
}

function finish(
  p: EquilibriumProblem,
  extents: number[],
  moles: Float64Array,
  converged: boolean,
  iterations: number,
  atBound: boolean[],
): EquilibriumSolution {
  const ng = gasTotal(moles, p.gas);
  const lnNg = Math.log(ng);
  let residual = 0;
  p.nu.forEach((row, j) => {
    if (atBound[j]) return;
    const f = reactionAffinity(row, moles, p, lnNg);
    residual = Math.max(residual, Number.isFinite(f) ? Math.abs(f) : Infinity);
  });
  return { extents, moles, converged, iterations, residual, atBound, sensitivity: sensitivityOf(p, moles, atBound) };
}

/**
 * A starting point with every species of the set present: pass over the reactions and move
 * each one that can make an absent species from species that are present, by a quarter of
 * what would exhaust its first reactant. Returns the indices still absent when none can move.
 */
function interiorStart(p: EquilibriumProblem): { xi: number[]; n: Float64Array; absent: number[] } {
  const R = p.nu.length;
  const S = p.n0.length;
  const xi = new Array(R).fill(0);
  const n = Float64Array.from(p.n0);
  const involved = (i: number) => p.nu.some((row) => row[i] !== 0);
  for (let pass = 0; pass < R + 1; pass++) {
    let moved = false;
    for (let j = 0; j < R; j++) {
      const row = p.nu[j];
      for (const dir of [1, -1]) {
        const makes = row.some((v, i) => v * dir > 0 && n[i] <= 0);
        const needs = row.every((v, i) => !(v * dir < 0) || n[i] > 0);
        if (!makes || !needs) continue;
        let step = Infinity;
        for (let i = 0; i < S; i++) if (row[i] * dir < 0) step = Math.min(step, n[i] / -(row[i] * dir));
        step = 0.25 * step;
        if (!(step > 0) || !Number.isFinite(step)) continue;
        xi[j] += dir * step;
        for (let i = 0; i < S; i++) n[i] += dir * step * row[i];
        moved = true;
      }
    }
    if (!moved) break;
  }
  const absent: number[] = [];
  for (let i = 0; i < S; i++) if (involved(i) && !(n[i] > 0)) absent.push(i);
  return { xi, n, absent };
}

/** G/RT of the mixture at amounts n (inert and condensed terms included; constants cancel in differences). */
function gibbs(p: EquilibriumProblem, n: Float64Array): number {
  const ng = gasTotal(n, p.gas);
  const lnNg = Math.log(ng);
  let G = 0;
  for (let i = 0; i < n.length; i++) {
    G += n[i] * p.g[i];
    if (p.gas[i] && n[i] > 0) G += n[i] * (Math.log(n[i]) - lnNg + p.lnP);
  }
  return G;
}

/**
 * Several simultaneous reactions: minimise G/RT over the extents. Newton steps on the Hessian
 * with a fraction-to-the-boundary rule (no amount may fall to or below zero) and Armijo
 * backtracking on G/RT. Converged when every reaction's ΔrG/RT at the composition is below
 * 1e-10 in magnitude.
 */
export function solveSet(p: EquilibriumProblem, maxIter = 200): EquilibriumSolution {
  const R = p.nu.length;
  const S = p.n0.length;
  const start = interiorStart(p);
  let xi = start.xi;
  let n = start.n;
  const scale = Math.max(...Array.from(p.n0));
  let G = gibbs(p, n);
  let iterations = 0;
  let converged = false;
  const affinities = (m: Float64Array) => {
    const lnNg = Math.log(gasTotal(m, p.gas));
    return p.nu.map((row) => reactionAffinity(row, m, p, lnNg));
  };
  for (; iterations < maxIter; iterations++) {
    const F = affinities(n);
    if (F.every((f) => Math.abs(f) < 1e-10)) {
      converged = true;
      break;
    }
    let J = hessian(p, n);
    let d = solveDense(J, F.map((f) => -f));
    for (let mu = 1e-12; !d && mu < 1e6; mu *= 100) {
      // A reaction among condensed species only has no curvature; regularise the step.
      const trace = J.reduce((a, row, j) => a + Math.abs(row[j]), 0) / R || 1;
      J = J.map((row, j) => row.map((v, k) => (j === k ? v + mu * trace : v)));
      d = solveDense(J, F.map((f) => -f));
    }
    if (!d) break;
    const dn = new Float64Array(S);
    for (let i = 0; i < S; i++) for (let j = 0; j < R; j++) dn[i] += p.nu[j][i] * d[j];
    let aMax = Infinity;
    for (let i = 0; i < S; i++) if (dn[i] < 0 && n[i] > 0) aMax = Math.min(aMax, n[i] / -dn[i]);
    let a = Math.min(1, 0.99 * aMax);
    const slope = F.reduce((s, f, j) => s + f * d![j], 0);
    let accepted = false;
    const trial = new Float64Array(S);
    for (let k = 0; k < 60; k++) {
      for (let i = 0; i < S; i++) trial[i] = n[i] + a * dn[i];
      if (trial.every((v, i) => v > 0 || (v === 0 && dn[i] === 0 && n[i] === 0))) {
        const Gt = gibbs(p, trial);
        if (Gt <= G + 1e-4 * a * slope || Math.abs(Gt - G) <= 1e-15 * Math.abs(G)) {
          G = Gt;
          accepted = true;
          break;
        }
      }
      a *= 0.5;
    }
    if (!accepted) {
      // Rounding floor: accept a full step only if it lowers the residual.
      break;
    }
    xi = xi.map((x, j) => x + a * d![j]);
    // Amounts from the extents, so the element balance is the feed's to rounding.
    const fresh = new Float64Array(S);
    for (let i = 0; i < S; i++) {
      let v = p.n0[i];
      for (let j = 0; j < R; j++) v += p.nu[j][i] * xi[j];
      fresh[i] = v > 0 ? v : trial[i];
    }
    n = fresh;
    if (Math.abs(a) * Math.max(...d.map(Math.abs)) < 1e-16 * scale) {
      const Fn = affinities(n);
      converged = Fn.every((f) => Math.abs(f) < 1e-8);
      iterations++;
      break;
    }
  }
  return finish(p, xi, n, converged, iterations, new Array(R).fill(false));
}

/**
 * Rank test of the reaction set (rows of ν over the species): refuses the first reaction
 * that is a linear combination of the ones before it.
 */
export function checkIndependent(nu: number[][], texts: string[], field: string): void {
  // Modified Gram–Schmidt: a row with nothing left after removing the earlier rows' span is dependent.
  const basis: number[][] = [];
  nu.forEach((row, j) => {
    const r = [...row];
    const norm0 = Math.hypot(...r);
    for (let pass = 0; pass < 2; pass++) {
      for (const b of basis) {
        let dot = 0;
        for (let i = 0; i < r.length; i++) dot += r[i] * b[i];
        for (let i = 0; i < r.length; i++) r[i] -= dot * b[i];
      }
    }
    const norm = Math.hypot(...r);
    if (!(norm > 1e-9 * norm0)) {
      refuse(
        "dependent-reactions",
        `${field}[${j}] ("${texts[j]}") is a linear combination of the reactions before it; give linearly independent reactions`,
        { index: j },
      );
    }
    basis.push(r.map((v) => v / norm));
  });
}

export function solveEquilibrium(p: EquilibriumProblem): EquilibriumSolution {
  return p.nu.length === 1 ? solveSingle(p) : solveSet(p);
}

export { interiorStart };
