/**
 * Equilibrium composition on the temperature grid, for corrected and naive K side by side,
 * with linear uncertainty bands (EVALUATE.md "Equilibrium"). The numerics are in
 * equilibrium-solver.ts; this module builds one problem per temperature from the species
 * models and shapes the result.
 */
import { R } from "./constants";
import type { CriticalConstants } from "./eos";
import { compose } from "./equilibrium-compose";
import { reactionSet, type ReactionSet } from "./equilibrium-set";
import { refuse } from "./errors";
import { fmt } from "./format";
import { realGasSetup, type GasModel, type RealGasDiagnostics, type RealGasSetup } from "./real-gas";
import type { ParsedSpecies } from "./schema";
import type { EngineWarning, SpeciesModel } from "./species-model";
import { termAt, termOnGrid, type TermGrid } from "./term";
import { checkFiniteGrid, termWarnings } from "./term-warnings";
import { sigmaG, sigmaGNaive, type SpeciesUncertainty } from "./uncertainty";

export { feedAmounts } from "./feed";

/** Largest grid an equilibrium is solved on (each point is a solve, and a result row of every species). */
export const MAX_EQUILIBRIUM_POINTS = 5000;

/** Standard uncertainties (1σ) that ride beside the values they cover. */
export interface CompositionSigma {
  extents: number[];
  moles: Record<string, number>;
  moleFractions: Record<string, number>;
  keyConversion: number;
  keyFraction: number | null;
  log10K: number[];
}

export interface Composition {
  /** Single reaction only. */
  extent?: number;
  extents: number[];
  /** All species, in the feed's unit of amount. */
  moles: Record<string, number>;
  /** Gas-phase mole fractions (condensed species are not in the gas). */
  moleFractions: Record<string, number>;
  /** (feed − outlet) / feed of the key species. */
  keyConversion: number;
  /** Gas-phase mole fraction of the key species; null when the key is condensed. */
  keyFraction: number | null;
  /** log10 K of each reaction of the set at this T. */
  log10K: number[];
  converged: boolean;
  diagnostics: { iterations: number; residual: number; atBound: boolean[]; realGas?: RealGasDiagnostics };
  sigma?: CompositionSigma;
  /** φ of every gas-phase species (1 with ideal-gas activities). */
  fugacityCoefficients: Record<string, number>;
  /** With a real-gas equation: the ideal-gas solution beside it. */
  ideal?: { moleFractions: Record<string, number>; keyConversion: number };
}

export interface EquilibriumPoint extends Composition {
  tK: number;
  naive: Composition;
  /** naive.keyFraction − keyFraction (0 when the key is condensed). */
  keyFractionDiff: number;
  /** |keyFractionDiff| exceeds the 1σ of the corrected key fraction. */
  naiveExceedsUncertainty?: boolean;
}

export interface EquilibriumInfo {
  reactions: string[];
  key: string;
  pressureBar: number;
  /** Gas-phase model the compositions were solved with. */
  gas: GasModel;
  /** The unit the request gave (default mol). */
  feedUnit: string;
  /** The unit of `feed` and of every `moles` in the result: mass units are converted to amounts (g → mol, kg → kmol, kg/h and t/h → kmol/h). */
  amountUnit: string;
  /** Feed amounts in `amountUnit`. */
  feed: Record<string, number>;
  /** Molar masses (g/mol, from the formulas) used to convert mass units; only when a mass unit was given. */
  molarMassGPerMol?: Record<string, number>;
  /** Species of the set and the inert ones that only ride along. */
  species: { key: string; role: "reacting" | "inert" }[];
  /** Temperatures at which the naive key fraction differs from the corrected one by more than its 1σ. */
  naiveExceedsUncertaintyK?: number[];
}

export interface SetSpecies {
  key: string;
  reacting: boolean;
  phase?: string;
  model?: SpeciesModel;
  u: SpeciesUncertainty | null;
  /** Gas at every T unless condensed by its marker or its lowest-G phase. */
  grid?: TermGrid;
  ref?: { hJ: number; sJ: number; phase: string };
}

export interface EquilibriumInput {
  equilibrium: {
    feed: Record<string, number | string>;
    feedUnit?: string;
    pressureBar?: number | string;
    key?: string;
    reactions?: string[];
    gas?: GasModel;
    critical?: Record<string, CriticalConstants>;
    kij?: { species: [string, string]; value: number }[];
  };
  reaction: string;
  species: Record<string, ParsedSpecies>;
  T: Float64Array;
  referenceK: number;
  models: Map<string, SpeciesModel>;
  grids: Map<string, TermGrid>;
  buildModel: (key: string) => SpeciesModel;
}

/**
 * Solve the equilibrium at every grid temperature (corrected and naive), with uncertainty
 * where species carry one, in stages: the reaction set (equilibrium-set.ts) → the reacting
 * species on the grid → one solve per temperature (equilibrium-compose.ts) → warnings and info.
 */
export function equilibriumOnGrid(input: EquilibriumInput): {
  points: EquilibriumPoint[];
  info: EquilibriumInfo;
  warnings: EngineWarning[];
  context: EquilibriumContext;
} {
  const rs = reactionSet(input);
  const { T } = input;
  const n = T.length;
  if (n > MAX_EQUILIBRIUM_POINTS) {
    refuse("too-many-points", `equilibrium: ${n} temperatures exceed the limit of ${MAX_EQUILIBRIUM_POINTS} for an equilibrium composition; use a larger stepK`, {
      points: n,
      limit: MAX_EQUILIBRIUM_POINTS,
    });
  }
  const warnings: EngineWarning[] = [];
  speciesOnGrid(rs.list, input, warnings);
  const solveAt = solverAt(rs, input);
  const { points, exceeds } = solveOnGrid(rs, T, solveAt, warnings);
  const anyUncertainty = rs.list.some((s) => s.u !== null);
  const { list, n0 } = rs;
  const info: EquilibriumInfo = {
    reactions: rs.texts,
    key: rs.key,
    pressureBar: rs.pressureBar,
    gas: input.equilibrium.gas ?? "ideal",
    feedUnit: rs.conv.feedUnit,
    amountUnit: rs.conv.amountUnit,
    feed: Object.fromEntries(list.map((s, i) => [s.key, n0[i]])),
    ...(rs.conv.molarMass ? { molarMassGPerMol: rs.conv.molarMass } : {}),
    species: list.map((s) => ({ key: s.key, role: s.reacting ? "reacting" : "inert" })),
  };
  if (anyUncertainty) info.naiveExceedsUncertaintyK = exceeds;
  const liquidLike = points.filter((p) => p.diagnostics.realGas?.liquidLike || p.naive.diagnostics.realGas?.liquidLike).map((p) => p.tK);
  if (liquidLike.length > 0) {
    warnings.push({
      code: "real-gas-liquid-root",
      tK: liquidLike[0],
      temperaturesK: liquidLike,
      message: `the Peng–Robinson gas took a liquid-like root at ${liquidLike.length} temperature${liquidLike.length > 1 ? "s" : ""} (first ${fmt(liquidLike[0])} K): the mixture may condense, which a gas-only model does not describe`,
    });
  }
  const context: EquilibriumContext = {
    list: list.map((s) => ({ key: s.key, reacting: s.reacting, phase: s.phase })),
    n0,
    nu: rs.nu,
    key: rs.key,
    /** Solve at any T from the species models (termAt), for the adiabatic outlet. */
    solveAt: (tK: number) =>
      solveAt(tK, (sp) => {
        const v = termAt(sp.model!, sp.phase, tK);
        return { h: v.hJ, s: v.sJ, gas: v.phase === "g" };
      }),
  };
  return { points, info, warnings, context };
}

/** Stage 2: each reacting species' model and grid (reusing the reaction's), and its H and S at the reference temperature. */
function speciesOnGrid(list: SetSpecies[], input: EquilibriumInput, warnings: EngineWarning[]): void {
  const { T, referenceK } = input;
  for (const sp of list) {
    if (!sp.reacting) continue;
    let model = input.models.get(sp.key);
    if (!model) {
      model = input.buildModel(sp.key);
      input.models.set(sp.key, model);
    }
    sp.model = model;
    let grid = input.grids.get(sp.key);
    if (!grid) {
      grid = termOnGrid(model, sp.phase, T, model.chains.size > 1);
      checkFiniteGrid(sp.key, grid, T);
      input.grids.set(sp.key, grid);
      warnings.push(...termWarnings(model, sp.phase, T, grid, referenceK));
    }
    sp.grid = grid;
    sp.ref = termAt(model, sp.phase, referenceK);
  }
}

type SolveAt = (tK: number, props: (sp: SetSpecies) => { h: number; s: number; gas: boolean }) => { corrected: Composition; naive: Composition };

/** Stage 3: corrected and naive solutions at tK, from each reacting species' H, S and phase there. */
function solverAt(rs: ReactionSet, input: EquilibriumInput): SolveAt {
  const { list, n0, nu, k, pressureBar } = rs;
  const S = list.length;
  const eq = input.equilibrium;
  const anyUncertainty = list.some((s) => s.u !== null);
  const lnP = Math.log(pressureBar);
  const gasModel: GasModel = eq.gas ?? "ideal";
  // A species marked condensed never enters the gas; every other one may.
  const mayBeGas = (i: number) => list[i].phase === undefined || list[i].phase === "g";
  const real: RealGasSetup | null = gasModel === "peng-robinson" ? realGasSetup(list, mayBeGas, input.species, eq, pressureBar) : null;
  return (tK, props) => {
    const RT = R * tK;
    const gas = new Array<boolean>(S);
    const gasNaive = new Array<boolean>(S);
    const g = new Float64Array(S);
    const gNaive = new Float64Array(S);
    const sig = new Float64Array(S);
    const sigNaive = new Float64Array(S);
    list.forEach((sp, i) => {
      if (!sp.reacting) {
        gas[i] = gasNaive[i] = sp.phase === undefined || sp.phase === "g";
        return;
      }
      const { h, s, gas: isGas } = props(sp);
      gas[i] = isGas;
      gasNaive[i] = sp.ref!.phase === "g";
      g[i] = (h - tK * s) / RT;
      gNaive[i] = (sp.ref!.hJ - tK * sp.ref!.sJ) / RT;
      if (sp.u) {
        sig[i] = sigmaG(sp.u, tK, h, s, sp.ref!.hJ, sp.ref!.sJ) / RT;
        sigNaive[i] = sigmaGNaive(sp.u, tK) / RT;
      }
    });
    const corrected = compose({ n0, nu, gas, g, lnP, sensitivity: anyUncertainty }, list, k, anyUncertainty ? sig : null, real, tK);
    const naive = compose({ n0, nu, gas: gasNaive, g: gNaive, lnP, sensitivity: anyUncertainty }, list, k, anyUncertainty ? sigNaive : null, real, tK);
    return { corrected, naive };
  };
}

/** Stage 4: one solve per grid temperature from the species' grids; temperatures that did not converge are one warning. */
function solveOnGrid(rs: ReactionSet, T: Float64Array, solveAt: SolveAt, warnings: EngineWarning[]): { points: EquilibriumPoint[]; exceeds: number[] } {
  const n = T.length;
  const anyUncertainty = rs.list.some((s) => s.u !== null);
  const points: EquilibriumPoint[] = new Array(n);
  const exceeds: number[] = [];
  const notConverged: number[] = [];
  const notConvergedCorrected: number[] = [];
  const notConvergedNaive: number[] = [];
  for (let t = 0; t < n; t++) {
    const tK = T[t];
    const { corrected, naive } = solveAt(tK, (sp) => {
      const gr = sp.grid!;
      return { h: gr.h[t], s: gr.s[t], gas: gr.phases[gr.phaseIndex[t]] === "g" };
    });
    const diff = naive.keyFraction !== null && corrected.keyFraction !== null ? naive.keyFraction - corrected.keyFraction : 0;
    const point: EquilibriumPoint = { tK, ...corrected, naive, keyFractionDiff: diff };
    if (anyUncertainty && corrected.sigma) {
      const s = corrected.sigma.keyFraction ?? 0;
      point.naiveExceedsUncertainty = Math.abs(diff) > s;
      if (point.naiveExceedsUncertainty) exceeds.push(tK);
    }
    if (!corrected.converged || !naive.converged) notConverged.push(tK);
    if (!corrected.converged) notConvergedCorrected.push(tK);
    if (!naive.converged) notConvergedNaive.push(tK);
    points[t] = point;
  }
  if (notConverged.length > 0) {
    const list = (ts: number[]) => (ts.length === 0 ? "none" : `${ts.length} (${ts.slice(0, 5).map(fmt).join(", ")}${ts.length > 5 ? ", …" : ""} K)`);
    warnings.push({
      code: "equilibrium-not-converged",
      tK: notConverged[0],
      temperaturesK: notConverged,
      correctedK: notConvergedCorrected,
      naiveK: notConvergedNaive,
      message: `the equilibrium solution did not converge at ${notConverged.length} temperature${notConverged.length > 1 ? "s" : ""} (first ${fmt(notConverged[0])} K): corrected rows ${list(notConvergedCorrected)}, naive rows ${list(notConvergedNaive)}; see diagnostics.residual`,
    });
  }
  return { points, exceeds };
}

/** What the adiabatic outlet needs from the equilibrium: the species, feed and a solve at any T. */
export interface EquilibriumContext {
  list: { key: string; reacting: boolean; phase?: string }[];
  n0: Float64Array;
  nu: number[][];
  key: string;
  solveAt: (tK: number) => { corrected: Composition; naive: Composition };
}
