/**
 * The linear algebra of the equilibrium solver: the Hessian of G/RT in the extents, a small
 * dense solve, the sensitivity of the extents to μ°/RT, and the rank test of a reaction set.
 */
import { refuse } from "./errors";
import type { EquilibriumProblem } from "./equilibrium-solver";

export function gasTotal(n: Float64Array, gas: boolean[]): number {
  let t = 0;
  for (let i = 0; i < n.length; i++) if (gas[i]) t += n[i];
  return t;
}

/** Hessian of G/RT in the extents: Σ_gas ν_j ν_k / n_i − Δν_j Δν_k / n_gas. */
export function hessian(p: EquilibriumProblem, n: Float64Array): number[][] {
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

/**
 * d(extents)/d(g) at a solution: −J⁻¹ Nᵀ, with the rows of reactions pinned at a bound left
 * at zero, and, for a set, the pinned (absent) condensed species held at zero through the KKT
 * system [J Aᵀ; A 0].
 */
export function sensitivityOf(p: EquilibriumProblem, n: Float64Array, atBound: boolean[], pinned: number[] = []): number[][] {
  const R = p.nu.length;
  const S = n.length;
  const free = [...Array(R).keys()].filter((j) => !atBound[j]);
  const out = Array.from({ length: R }, () => new Array(S).fill(0));
  if (free.length === 0) return out;
  const Jfull = hessian(p, n);
  const F = free.length;
  const P = pinned.length;
  const M = Array.from({ length: F + P }, () => new Array(F + P).fill(0));
  free.forEach((j, a) => free.forEach((k, b) => (M[a][b] = Jfull[j][k])));
  pinned.forEach((i, q) =>
    free.forEach((j, a) => {
      M[F + q][a] = p.nu[j][i];
      M[a][F + q] = p.nu[j][i];
    }),
  );
  for (let i = 0; i < S; i++) {
    const rhs = [...free.map((j) => -p.nu[j][i]), ...new Array(P).fill(0)];
    if (rhs.every((v) => v === 0)) continue;
    const x = solveDense(M, rhs);
    if (!x) continue;
    free.forEach((j, q) => (out[j][i] = Number.isFinite(x[q]) ? x[q] : 0));
  }
  return out;
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
      refuse("dependent-reactions", `${field}[${j}] ("${texts[j]}") is a linear combination of the reactions before it; give linearly independent reactions`, { index: j });
    }
    basis.push(r.map((v) => v / norm));
  });
}
