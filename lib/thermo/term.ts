/**
 * A reaction term (a species key with or without a phase marker) on the grid and at one
 * temperature: a marked term uses its phase; an unmarked one the lowest-G phase at each T.
 */
import { chainAt, chainOnGrid, covers, type Chain } from "./chain";
import { refuse } from "./errors";
import type { SpeciesModel } from "./species-model";

export interface TermGrid {
  cp: Float64Array;
  h: Float64Array;
  s: Float64Array;
  /** Index into `phases` of the phase used at each grid temperature. */
  phaseIndex: Uint8Array;
  phases: string[];
  /** Per phase: G (J/mol) on the grid, when several phases were evaluated. */
  gByPhase?: Float64Array[];
}

/** The chains a term may use: only the marked phase, or all phases. */
export function termChains(model: SpeciesModel, phase: string | undefined): Chain[] {
  if (phase === undefined) return [...model.chains.values()];
  const chain = model.chains.get(phase);
  if (!chain) {
    refuse("missing-phase", `species "${model.key}": the key asks for the ${phase} phase but no segment has phase "${phase}"`, {
      species: model.key,
      phase,
    });
  }
  return [chain!];
}

/**
 * Properties of a term on an ascending grid. A marked term uses its phase only; an unmarked
 * term takes, at each T, the lowest-G phase among those whose range covers T (all phases
 * if none covers it).
 */
export function termOnGrid(model: SpeciesModel, phase: string | undefined, T: Float64Array, withOthers = false): TermGrid {
  const n = T.length;
  const all = phase === undefined || withOthers ? [...model.chains.values()] : termChains(model, phase);
  const own = phase === undefined ? -1 : all.findIndex((c) => c.phase === phase);
  if (phase !== undefined && own < 0) termChains(model, phase);
  const cps: Float64Array[] = [];
  const hs: Float64Array[] = [];
  const ss: Float64Array[] = [];
  for (const chain of all) {
    const cp = new Float64Array(n);
    const h = new Float64Array(n);
    const s = new Float64Array(n);
    chainOnGrid(model.integrator, chain, T, cp, h, s);
    cps.push(cp);
    hs.push(h);
    ss.push(s);
  }
  const phases = all.map((c) => c.phase);
  if (all.length === 1) return { cp: cps[0], h: hs[0], s: ss[0], phaseIndex: new Uint8Array(n), phases };
  const gByPhase = all.map((_, k) => {
    const g = new Float64Array(n);
    for (let i = 0; i < n; i++) g[i] = hs[k][i] - T[i] * ss[k][i];
    return g;
  });
  if (own >= 0) {
    return { cp: cps[own], h: hs[own], s: ss[own], phaseIndex: new Uint8Array(n).fill(own), phases, gByPhase };
  }
  const cp = new Float64Array(n);
  const h = new Float64Array(n);
  const s = new Float64Array(n);
  const phaseIndex = new Uint8Array(n);
  for (let i = 0; i < n; i++) {
    const k = lowestG(all, gByPhase, i, T[i]);
    cp[i] = cps[k][i];
    h[i] = hs[k][i];
    s[i] = ss[k][i];
    phaseIndex[i] = k;
  }
  return { cp, h, s, phaseIndex, phases, gByPhase };
}

function lowestG(all: Chain[], g: Float64Array[], i: number, T: number): number {
  let best = -1;
  for (let k = 0; k < all.length; k++) {
    if (covers(all[k], T) && (best < 0 || g[k][i] < g[best][i])) best = k;
  }
  if (best >= 0) return best;
  best = 0;
  for (let k = 1; k < all.length; k++) if (g[k][i] < g[best][i]) best = k;
  return best;
}

/** Properties of a term at one temperature (used by root finding and at the reference temperature). */
export function termAt(model: SpeciesModel, phase: string | undefined, T: number): { cpJ: number; hJ: number; sJ: number; phase: string } {
  const chains = termChains(model, phase);
  let best: { cpJ: number; hJ: number; sJ: number; phase: string } | null = null;
  let bestCovers = false;
  for (const chain of chains) {
    const v = { ...chainAt(model.integrator, chain, T), phase: chain.phase };
    const c = covers(chain, T);
    const g = v.hJ - T * v.sJ;
    if (best === null || (c && !bestCovers) || (c === bestCovers && g < best.hJ - T * best.sJ)) {
      best = v;
      bestCovers = c;
    }
  }
  return best!;
}
