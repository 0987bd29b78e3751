/**
 * Equilibrium composition from a feed: ideal-gas activities (x_i·p/p°, p° = 1 bar), pure
 * condensed phases at unit activity. One reaction: a bounded, monotone root search on the
 * extent, carried out in ln(distance to the nearer bound) so that an extreme K (10^±300)
 * lands exactly at, or a representable distance from, the bound. Several reactions: Newton
 * on the extents (the Hessian of G/RT) with a line search that keeps every amount positive.
 * Pure numerics: the caller supplies μ°/RT of every species at each temperature.
 */
import { gasTotal, hessian, sensitivityOf, solveDense } from "./equilibrium-linear";
import { brent } from "./roots";

export { checkIndependent } from "./equilibrium-linear";

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
  /** Compute d(extents)/d(g) (for uncertainty bands); off saves the linear solves. */
  sensitivity?: boolean;
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
  /** d(extents)/d(g): R × S sensitivity of the extents to μ°/RT, for uncertainty propagation (empty when not asked for). */
  sensitivity: number[][];
}

/** Smallest positive double's logarithm: below this a distance to a bound is exactly 0. */
const LN_TINY = Math.log(Number.MIN_VALUE);

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
  constrained?: { residual: number; pinned: number[] },
): EquilibriumSolution {
  let residual = 0;
  if (constrained) residual = constrained.residual;
  else {
    const lnNg = Math.log(gasTotal(moles, p.gas));
    p.nu.forEach((row, j) => {
      if (atBound[j]) return;
      const f = reactionAffinity(row, moles, p, lnNg);
      residual = Math.max(residual, Number.isFinite(f) ? Math.abs(f) : Infinity);
    });
  }
  const sensitivity = p.sensitivity === false ? [] : sensitivityOf(p, moles, atBound, constrained?.pinned);
  return { extents, moles, converged, iterations, residual, atBound, sensitivity };
}

/**
 * A starting point with every species of the set present: pass over the reactions and move
 * each one that can make an absent species from species that are present, by a quarter of
 * what would exhaust its first reactant. Returns the indices still absent when none can move
 * (except those `mayBeAbsent` allows: pure condensed phases, which may stay at zero).
 */
function interiorStart(p: EquilibriumProblem, mayBeAbsent: (i: number) => boolean = () => false): { xi: number[]; n: Float64Array; absent: number[] } {
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
  for (let i = 0; i < S; i++) if (involved(i) && !(n[i] > 0) && !mayBeAbsent(i)) absent.push(i);
  return { xi, n, absent };
}

/** Convergence threshold on ΔrG/RT: never tighter than 1e-10, and never below the rounding floor. */
export const RESIDUAL_TOL = 1e-10;
const FLOOR_ULPS = 32;

/**
 * The rounding floor of each reaction's ΔrG/RT at amounts n reached from the feed by the
 * extents xi: ν·μ°/RT carries eps × Σ|ν μ°/RT|, and ln nᵢ carries eps × (n0ᵢ + Σ|ν ξ|)/nᵢ,
 * since nᵢ = n0ᵢ + Σ ν ξ is formed by a sum whose terms may be far larger than nᵢ (a species
 * nearly used up, or one made in traces from large extents).
 */
export function residualFloor(p: EquilibriumProblem, n: Float64Array, xi: number[]): number {
  const S = n.length;
  const R = p.nu.length;
  const gross = new Float64Array(S);
  let grossGas = 0;
  let ng = 0;
  for (let i = 0; i < S; i++) {
    let g = p.n0[i];
    for (let j = 0; j < R; j++) g += Math.abs(p.nu[j][i] * xi[j]);
    gross[i] = g;
    if (p.gas[i]) {
      grossGas += g;
      ng += n[i];
    }
  }
  const lnNg = ng > 0 ? Math.log(ng) : 0;
  let worst = 0;
  for (let j = 0; j < R; j++) {
    let f = 0;
    for (let i = 0; i < S; i++) {
      const v = Math.abs(p.nu[j][i]);
      if (v === 0) continue;
      f += v * Math.abs(p.g[i]);
      if (p.gas[i] && n[i] > 0) {
        f += v * (Math.abs(Math.log(n[i])) + Math.abs(lnNg) + Math.abs(p.lnP) + gross[i] / n[i] + (ng > 0 ? grossGas / ng : 0));
      }
    }
    worst = Math.max(worst, f);
  }
  return FLOOR_ULPS * Number.EPSILON * worst;
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
 * with a fraction-to-the-boundary rule (no gas amount may fall to or below zero) and Armijo
 * backtracking on G/RT. A pure condensed species is a phase that may vanish: a step that
 * exhausts it stops exactly there and pins it at zero (an active constraint in a KKT step);
 * it is released when its multiplier says forming it would lower G. Converged when the
 * projected ΔrG/RT of every reaction is below 1e-10 (or its rounding floor, residualFloor,
 * when that is larger) and every pinned phase would raise G.
 */
export function solveSet(p: EquilibriumProblem, maxIter = 200): EquilibriumSolution {
  const R = p.nu.length;
  const S = p.n0.length;
  const start = interiorStart(p, (i) => !p.gas[i]);
  let xi = start.xi;
  let n = start.n;
  const involved = (i: number) => p.nu.some((row) => row[i] !== 0);
  const pinned = new Set<number>();
  for (let i = 0; i < S; i++) if (!p.gas[i] && involved(i) && !(n[i] > 0)) pinned.add(i);
  const scale = Math.max(...Array.from(p.n0));
  let G = gibbs(p, n);
  let iterations = 0;
  let converged = false;
  let residual = Infinity;
  let releases = 0;
  let stalled = false;
  const affinities = (m: Float64Array) => {
    const lnNg = Math.log(gasTotal(m, p.gas));
    return p.nu.map((row) => reactionAffinity(row, m, p, lnNg));
  };
  for (; iterations < maxIter; iterations++) {
    const F = affinities(n);
    const pins = [...pinned];
    const P = pins.length;
    const J = hessian(p, n);
    const trace = J.reduce((a, row, j) => a + Math.abs(row[j]), 0) / R || 1;
    const kkt = (mu: number) => {
      const M = Array.from({ length: R + P }, () => new Array(R + P).fill(0));
      for (let j = 0; j < R; j++) for (let k = 0; k < R; k++) M[j][k] = J[j][k] + (j === k ? mu * trace : 0);
      pins.forEach((i, q) => {
        for (let j = 0; j < R; j++) {
          M[R + q][j] = p.nu[j][i];
          M[j][R + q] = p.nu[j][i];
        }
      });
      return solveDense(M, [...F.map((f) => -f), ...pins.map((i) => -n[i])]);
    };
    let sol = kkt(0);
    // A reaction among condensed species only has no curvature; regularise the step.
    for (let mu = 1e-12; !sol && mu < 1e6; mu *= 100) sol = kkt(mu);
    if (!sol) break;
    const d = sol.slice(0, R);
    const lam = sol.slice(R);
    // Projected residual: ΔrG/RT of each reaction less what the pinned phases hold back.
    residual = 0;
    for (let j = 0; j < R; j++) {
      let r = F[j];
      pins.forEach((i, q) => (r += p.nu[j][i] * lam[q]));
      residual = Math.max(residual, Math.abs(r));
    }
    if (residual < Math.max(RESIDUAL_TOL, residualFloor(p, n, xi))) {
      // μ = −λ ≥ 0 for a phase rightly absent; a negative one would lower G by forming.
      const release = pins.filter((_, q) => lam[q] > 1e-9);
      if (release.length === 0 || releases >= 2 * S) {
        converged = release.length === 0;
        break;
      }
      for (const i of release) pinned.delete(i);
      releases++;
      stalled = false;
      continue;
    }
    // The last step changed nothing a double can hold and the residual is still above the floor.
    if (stalled) break;
    const dn = new Float64Array(S);
    for (let i = 0; i < S; i++) for (let j = 0; j < R; j++) dn[i] += p.nu[j][i] * d[j];
    let aGas = Infinity;
    let aCond = Infinity;
    let hit = -1;
    for (let i = 0; i < S; i++) {
      if (!(dn[i] < 0) || pinned.has(i) || !(n[i] > 0)) continue;
      const a = n[i] / -dn[i];
      if (p.gas[i]) aGas = Math.min(aGas, a);
      else if (a < aCond) {
        aCond = a;
        hit = i;
      }
    }
    let a = Math.min(1, 0.99 * aGas);
    let pinHit = false;
    if (aCond <= a) {
      a = aCond;
      pinHit = true;
    }
    const slope = F.reduce((sum, f, j) => sum + f * d[j], 0);
    let accepted = false;
    const trial = new Float64Array(S);
    for (let k = 0; k < 60; k++) {
      for (let i = 0; i < S; i++) trial[i] = pinned.has(i) || (pinHit && i === hit) ? 0 : n[i] + a * dn[i];
      if (trial.every((v, i) => v > 0 || (v === 0 && (pinned.has(i) || (pinHit && i === hit) || dn[i] === 0)))) {
        const Gt = gibbs(p, trial);
        if (Gt <= G + 1e-4 * a * slope || Math.abs(Gt - G) <= 1e-15 * Math.abs(G)) {
          G = Gt;
          accepted = true;
          break;
        }
      }
      a *= 0.5;
      pinHit = false;
    }
    if (!accepted) break;
    xi = xi.map((x, j) => x + a * d[j]);
    if (pinHit) pinned.add(hit);
    // Amounts from the extents, so the element balance is the feed's to rounding.
    const fresh = new Float64Array(S);
    for (let i = 0; i < S; i++) {
      let v = p.n0[i];
      for (let j = 0; j < R; j++) v += p.nu[j][i] * xi[j];
      fresh[i] = pinned.has(i) ? 0 : v > 0 ? v : trial[i];
    }
    n = fresh;
    if (Math.abs(a) * Math.max(...d.map(Math.abs)) < 1e-16 * scale && !pinHit) stalled = true;
  }
  return finish(p, xi, n, converged, iterations, new Array(R).fill(false), { residual, pinned: [...pinned] });
}

export function solveEquilibrium(p: EquilibriumProblem): EquilibriumSolution {
  return p.nu.length === 1 ? solveSingle(p) : solveSet(p);
}

export { interiorStart };
