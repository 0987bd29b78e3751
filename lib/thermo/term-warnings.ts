/** Warnings about a term over the grid, and the refusal of a term whose values overflow. */
import { brent } from "./roots";
import { chainAt, covers } from "./chain";
import { refuse } from "./errors";
import { fmt } from "./format";
import type { EngineWarning, SpeciesModel } from "./species-model";
import { termAt, type TermGrid } from "./term";

/**
 * Warnings for one term over a grid span: extrapolation, reference-extrapolation,
 * metastable-phase, phase-change-in-span, nonphysical-cp, segment-jump (edges inside the span).
 */
export function termWarnings(model: SpeciesModel, phase: string | undefined, T: Float64Array, grid: TermGrid, referenceK: number | null): EngineWarning[] {
  const key = model.key;
  const ig = model.integrator;
  const out: EngineWarning[] = [];
  const n = T.length;
  const chainsByName = model.chains;
  // The grid in runs of one phase (one run when the term has one phase): the warnings below
  // look at run ends, not at every grid temperature.
  const runChains = grid.phases.map((p) => chainsByName.get(p)!);
  const runStart: number[] = [];
  const runPhase: number[] = [];
  if (grid.phases.length === 1) {
    if (n > 0) {
      runStart.push(0);
      runPhase.push(grid.phaseIndex[0]);
    }
  } else {
    const pi = grid.phaseIndex;
    for (let i = 0; i < n; i++) {
      if (i === 0 || pi[i] !== pi[i - 1]) {
        runStart.push(i);
        runPhase.push(pi[i]);
      }
    }
  }
  runStart.push(n);
  // Extrapolation: per side, the furthest grid temperature outside the chain in use there. The
  // grid ascends, so within a run that is its first (below) or last (above) temperature.
  const worst: Record<"below" | "above", { by: number; tK: number; limit: number; phase: string } | null> = { below: null, above: null };
  for (let r = 0; r + 1 < runStart.length; r++) {
    const chain = runChains[runPhase[r]];
    const tLo = T[runStart[r]];
    const tHi = T[runStart[r + 1] - 1];
    if (tLo < chain.tminK && !covers(chain, tLo)) {
      const by = chain.tminK - tLo;
      if (!worst.below || by > worst.below.by) worst.below = { by, tK: tLo, limit: chain.tminK, phase: chain.phase };
    }
    if (tHi > chain.tmaxK && !covers(chain, tHi)) {
      const by = tHi - chain.tmaxK;
      if (!worst.above || by > worst.above.by) worst.above = { by, tK: tHi, limit: chain.tmaxK, phase: chain.phase };
    }
  }
  for (const side of ["below", "above"] as const) {
    const w = worst[side];
    if (!w) continue;
    out.push({
      code: "extrapolation",
      species: key,
      tK: w.tK,
      side,
      byK: w.by,
      limitK: w.limit,
      phase: w.phase,
      message: `${side} the ${fmt(w.limit)} K ${side === "below" ? "lower" : "upper"} limit of the model by ${fmt(w.by)} K`,
    });
  }
  if (referenceK !== null) {
    const at = termAt(model, phase, referenceK);
    const chain = chainsByName.get(at.phase)!;
    if (!covers(chain, referenceK)) {
      const below = referenceK < chain.tminK;
      out.push({
        code: "reference-extrapolation",
        species: key,
        tK: referenceK,
        phase: chain.phase,
        side: below ? "below" : "above",
        byK: below ? chain.tminK - referenceK : referenceK - chain.tmaxK,
        message: `the reference temperature ${fmt(referenceK)} K is ${below ? "below" : "above"} the ${fmt(below ? chain.tminK : chain.tmaxK)} K ${below ? "lower" : "upper"} limit of the ${chain.phase} model, so the naive curve starts from extrapolated values`,
      });
    }
  }
  if (grid.gByPhase && phase !== undefined) {
    const own = grid.phases.indexOf(phase);
    let first = -1;
    let worstGap = 0;
    let worstPhase = "";
    let last = -1;
    for (let i = 0; i < n; i++) {
      for (let k = 0; k < grid.phases.length; k++) {
        if (k === own || !covers(chainsByName.get(grid.phases[k])!, T[i])) continue;
        const gap = grid.gByPhase[own][i] - grid.gByPhase[k][i];
        if (gap > 1e-6) {
          if (first < 0) first = i;
          last = i;
          if (gap > worstGap) {
            worstGap = gap;
            worstPhase = grid.phases[k];
          }
        }
      }
    }
    if (first >= 0) {
      out.push({
        code: "metastable-phase",
        species: key,
        tK: T[first],
        toK: T[last],
        phase,
        stablePhase: worstPhase,
        dGkJ: worstGap / 1000,
        message: `${phase} is not the stable phase from ${fmt(T[first])} K to ${fmt(T[last])} K (${worstPhase} is lower in G by up to ${fmt(worstGap / 1000)} kJ/mol); the term keeps the ${phase} phase as written`,
      });
    }
  }
  if (phase === undefined) {
    for (let r = 1; r + 1 < runStart.length; r++) {
      const i = runStart[r];
      const a = runPhase[r - 1];
      const b = runPhase[r];
      const ca = chainsByName.get(grid.phases[a])!;
      const cb = chainsByName.get(grid.phases[b])!;
      const f = (t: number) => {
        const x = chainAt(ig, cb, t);
        const y = chainAt(ig, ca, t);
        return x.hJ - t * x.sJ - (y.hJ - t * y.sJ);
      };
      let at: number | null = null;
      const f0 = f(T[i - 1]);
      const f1 = f(T[i]);
      if (f0 * f1 <= 0) at = brent(f, T[i - 1], T[i], f0, f1);
      else {
        // The switch came from a range edge, not a G crossing.
        at = ca.tmaxK >= T[i - 1] && ca.tmaxK <= T[i] ? ca.tmaxK : cb.tminK >= T[i - 1] && cb.tminK <= T[i] ? cb.tminK : null;
      }
      const hb = chainAt(ig, cb, at ?? T[i]);
      const ha = chainAt(ig, ca, at ?? T[i]);
      out.push({
        code: "phase-change-in-span",
        species: key,
        tK: at ?? T[i],
        from: ca.phase,
        to: cb.phase,
        dHkJ: (hb.hJ - ha.hJ) / 1000,
        message: `changes from ${ca.phase} to ${cb.phase} at ${fmt(at ?? T[i])} K inside the span (ΔH ${fmt((hb.hJ - ha.hJ) / 1000)} kJ/mol); the lowest-G phase is used on each side`,
      });
    }
  }
  let bad = -1;
  let minCp = Infinity;
  for (let i = 0; i < n; i++) {
    if (!(grid.cp[i] > 0)) {
      if (bad < 0) bad = i;
      if (grid.cp[i] < minCp) minCp = grid.cp[i];
    }
  }
  if (bad >= 0) {
    out.push({
      code: "nonphysical-cp",
      species: key,
      tK: T[bad],
      minCpJ: minCp,
      message: `Cp is not positive from ${fmt(T[bad])} K (lowest ${fmt(minCp)} J/(mol·K)); the model is outside the range where it means anything`,
    });
  }
  const lo = Math.min(T[0], referenceK ?? T[0]);
  const hi = Math.max(T[n - 1], referenceK ?? T[n - 1]);
  const used = new Set(phase === undefined ? runPhase.map((k) => grid.phases[k]) : [phase]);
  for (const j of model.jumps) {
    if (!used.has(j.phase) || j.tK < lo || j.tK > hi) continue;
    out.push({
      code: "segment-jump",
      species: key,
      tK: j.tK,
      phase: j.phase,
      dHkJ: j.dHkJ,
      dSJ: j.dSJ,
      dCpJ: j.dCpJ,
      message: `the two ${j.phase} segments meeting at ${fmt(j.tK)} K disagree there: H jumps by ${fmt(j.dHkJ)} kJ/mol, S by ${fmt(j.dSJ)} J/(mol·K), Cp by ${fmt(j.dCpJ)} J/(mol·K)`,
    });
  }
  for (const w of model.warnings) out.push(w);
  return out;
}

/**
 * Refuses (`nonfinite-value`) a term whose Cp, H or S is not a finite double at some grid
 * temperature (coefficients so large that the values overflow), so that no result carries null.
 */
export function checkFiniteGrid(key: string, grid: TermGrid, T: Float64Array): void {
  for (let i = 0; i < T.length; i++) {
    const bad = !Number.isFinite(grid.cp[i]) ? "Cp" : !Number.isFinite(grid.h[i]) ? "H" : !Number.isFinite(grid.s[i]) ? "S" : null;
    if (bad) {
      refuse(
        "nonfinite-value",
        `species "${key}": ${bad} is not finite at ${fmt(T[i])} K (got ${bad === "Cp" ? grid.cp[i] : bad === "H" ? grid.h[i] : grid.s[i]}); the model's coefficients are outside any physical range`,
        { species: key, tK: T[i], quantity: bad },
      );
    }
  }
}
