/**
 * Equilibrium composition on the temperature grid, for corrected and naive K side by side,
 * with linear uncertainty bands (EVALUATE.md "Equilibrium"). The numerics are in
 * equilibrium-solver.ts; this module builds one problem per temperature from the species
 * models and shapes the result.
 */
import { R } from "./constants";
import { EngineRefusal, refuse } from "./errors";
import { checkBalance, parseFormula, parseReaction, parseSpeciesKey } from "./formula";
import { checkIndependent, interiorStart, solveEquilibrium, type EquilibriumProblem, type EquilibriumSolution } from "./equilibrium-solver";
import { FEED_UNITS, type FeedUnit, type ParsedSpecies } from "./schema";
import { checkFiniteGrid, fmt, termAt, termOnGrid, termWarnings, type EngineWarning, type SpeciesModel, type TermGrid } from "./species";
import { parseUncertainty, sigmaG, sigmaGNaive, type SpeciesUncertainty } from "./uncertainty";
import { parsePressureBar } from "./units";
import { realGasSetup, solveRealGas, type GasModel, type RealGasDiagnostics, type RealGasSetup } from "./real-gas";
import type { CriticalConstants } from "./eos";

const LN10 = Math.LN10;

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

interface SetSpecies {
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

const has = (o: object, k: string) => Object.prototype.hasOwnProperty.call(o, k);

/**
 * Solve the equilibrium at every grid temperature (corrected and naive), with uncertainty
 * where species carry one. Refuses dependent reaction sets, empty feeds, unknown keys and
 * non-positive pressures with exact messages.
 */
export function equilibriumOnGrid(input: EquilibriumInput): {
  points: EquilibriumPoint[];
  info: EquilibriumInfo;
  warnings: EngineWarning[];
  context: EquilibriumContext;
} {
  const eq = input.equilibrium;
  const set = eq.reactions !== undefined;
  const field = set ? "equilibrium.reactions" : "reaction";
  const texts = eq.reactions ?? [input.reaction];
  const parsed = texts.map((text, j) => {
    const r = parseReaction(text);
    for (const t of r.terms) {
      if (!has(input.species, t.key)) {
        refuse("missing-species", `species "${t.key}" is used in ${set ? `${field}[${j}]` : "the reaction"} but has no entry in species`, { species: t.key });
      }
    }
    try {
      checkBalance(r.terms);
    } catch (e) {
      if (e instanceof EngineRefusal && set) refuse(e.code, `${field}[${j}]: ${e.message}`, e.details);
      throw e;
    }
    return r;
  });

  // Species: those of the reactions in order of appearance, then inert feed species.
  const list: SetSpecies[] = [];
  const index = new Map<string, number>();
  for (const r of parsed) {
    for (const t of r.terms) {
      if (index.has(t.key)) continue;
      index.set(t.key, list.length);
      list.push({ key: t.key, reacting: true, phase: t.phase, u: parseUncertainty(t.key, input.species[t.key]) });
    }
  }
  const formulaOf = (key: string) => parseSpeciesKey(key).formula;
  for (const key of Object.keys(eq.feed)) {
    if (index.has(key)) continue;
    const twin = list.find((s) => formulaOf(s.key) === formulaOf(key));
    if (twin) {
      refuse(
        "feed-key-mismatch",
        `equilibrium.feed: "${key}" is not a species of the reactions (did you mean "${twin.key}"?); a feed key must match the reaction's key exactly`,
        { key, suggestion: twin.key },
      );
    }
    index.set(key, list.length);
    list.push({ key, reacting: false, phase: parseSpeciesKey(key).phase, u: null });
  }
  const S = list.length;
  const nu = parsed.map((r) => {
    const row = new Array(S).fill(0);
    for (const t of r.terms) row[index.get(t.key)!] = t.nu;
    return row;
  });
  if (set && nu.length > 1) checkIndependent(nu, texts, field);

  const conv = feedAmounts(eq.feed, eq.feedUnit);
  const n0 = new Float64Array(S);
  for (const [key, v] of Object.entries(conv.amounts)) n0[index.get(key)!] = v;
  if (!n0.some((v) => v > 0)) {
    refuse("empty-feed", "equilibrium.feed: every amount is 0; give at least one species a positive amount");
  }
  const pressureBar = eq.pressureBar === undefined ? 1 : parsePressureBar(eq.pressureBar, "equilibrium.pressureBar");
  if (!(pressureBar > 0)) {
    refuse("nonpositive-pressure", `equilibrium.pressureBar: the pressure must be above 0 bar (got ${fmt(pressureBar)} bar)`);
  }
  let key = eq.key;
  if (key !== undefined) {
    if (!index.has(key)) {
      refuse("invalid-key", `equilibrium.key: "${key}" is neither in the feed nor in the reactions`, { key });
    }
    if (!(n0[index.get(key)!] > 0)) {
      refuse("invalid-key", `equilibrium.key: "${key}" has no amount in the feed, so its conversion is undefined`, { key });
    }
  } else {
    const first = parsed[0].terms.find((t) => t.nu < 0 && n0[index.get(t.key)!] > 0);
    key = first?.key ?? list.find((s, i) => n0[i] > 0)!.key;
  }
  const k = index.get(key)!;

  if (nu.length > 1) {
    // A species marked condensed may stay absent (a phase that does not form); a gas may not.
    const condensed = (i: number) => list[i].phase !== undefined && list[i].phase !== "g";
    const probe = interiorStart({ n0, nu, gas: list.map((_, i) => !condensed(i)), g: new Float64Array(S), lnP: 0 }, condensed);
    if (probe.absent.length > 0) {
      const names = probe.absent.map((i) => `"${list[i].key}"`).join(", ");
      refuse(
        "unreachable-species",
        `equilibrium.feed: the reactions cannot form ${names} from this feed, so the set has no solution with every species present; add ${probe.absent.length > 1 ? "them" : "it"} to the feed or drop the reactions that need ${probe.absent.length > 1 ? "them" : "it"}`,
        { species: probe.absent.map((i) => list[i].key) },
      );
    }
  }

  const { T, referenceK } = input;
  const n = T.length;
  if (n > MAX_EQUILIBRIUM_POINTS) {
    refuse(
      "too-many-points",
      `equilibrium: ${n} temperatures exceed the limit of ${MAX_EQUILIBRIUM_POINTS} for an equilibrium composition; use a larger stepK`,
      { points: n, limit: MAX_EQUILIBRIUM_POINTS },
    );
  }
  const warnings: EngineWarning[] = [];
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
  const anyUncertainty = list.some((s) => s.u !== null);
  const lnP = Math.log(pressureBar);
  const gasModel: GasModel = eq.gas ?? "ideal";
  // A species marked condensed never enters the gas; every other one may.
  const mayBeGas = (i: number) => list[i].phase === undefined || list[i].phase === "g";
  const real: RealGasSetup | null =
    gasModel === "peng-robinson" ? realGasSetup(list, mayBeGas, input.species, eq, pressureBar) : null;

  /** Corrected and naive solutions at tK, from each reacting species' H, S and phase there. */
  const solveAt = (tK: number, props: (sp: SetSpecies) => { h: number; s: number; gas: boolean }) => {
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
    const list = (ts: number[]) =>
      ts.length === 0 ? "none" : `${ts.length} (${ts.slice(0, 5).map(fmt).join(", ")}${ts.length > 5 ? ", …" : ""} K)`;
    warnings.push({
      code: "equilibrium-not-converged", tK: notConverged[0], temperaturesK: notConverged,
      correctedK: notConvergedCorrected, naiveK: notConvergedNaive,
      message: `the equilibrium solution did not converge at ${notConverged.length} temperature${notConverged.length > 1 ? "s" : ""} (first ${fmt(notConverged[0])} K): corrected rows ${list(notConvergedCorrected)}, naive rows ${list(notConvergedNaive)}; see diagnostics.residual`,
    });
  }
  const info: EquilibriumInfo = {
    reactions: texts,
    key,
    pressureBar,
    gas: gasModel,
    feedUnit: conv.feedUnit,
    amountUnit: conv.amountUnit,
    feed: Object.fromEntries(list.map((s, i) => [s.key, n0[i]])),
    ...(conv.molarMass ? { molarMassGPerMol: conv.molarMass } : {}),
    species: list.map((s) => ({ key: s.key, role: s.reacting ? "reacting" : "inert" })),
  };
  if (anyUncertainty) info.naiveExceedsUncertaintyK = exceeds;
  const liquidLike = points.filter((p) => p.diagnostics.realGas?.liquidLike || p.naive.diagnostics.realGas?.liquidLike).map((p) => p.tK);
  if (liquidLike.length > 0) {
    warnings.push({
      code: "real-gas-liquid-root", tK: liquidLike[0], temperaturesK: liquidLike,
      message: `the Peng–Robinson gas took a liquid-like root at ${liquidLike.length} temperature${liquidLike.length > 1 ? "s" : ""} (first ${fmt(liquidLike[0])} K): the mixture may condense, which a gas-only model does not describe`,
    });
  }
  const context: EquilibriumContext = {
    list: list.map((s) => ({ key: s.key, reacting: s.reacting, phase: s.phase })),
    n0,
    nu,
    key,
    /** Solve at any T from the species models (termAt), for the adiabatic outlet. */
    solveAt: (tK: number) =>
      solveAt(tK, (sp) => {
        const v = termAt(sp.model!, sp.phase, tK);
        return { h: v.hJ, s: v.sJ, gas: v.phase === "g" };
      }),
  };
  return { points, info, warnings, context };
}

/** What the adiabatic outlet needs from the equilibrium: the species, feed and a solve at any T. */
export interface EquilibriumContext {
  list: { key: string; reacting: boolean; phase?: string }[];
  n0: Float64Array;
  nu: number[][];
  key: string;
  solveAt: (tK: number) => { corrected: Composition; naive: Composition };
}

interface FeedUnitInfo {
  /** Amount (mol, or g for a mass unit) or rate (mol/s, or g/s). */
  rate: boolean;
  mass: boolean;
  /** Size in mol, mol/s, g or g/s. */
  factor: number;
}

const FEED_UNIT_INFO: Record<FeedUnit, FeedUnitInfo> = {
  mol: { rate: false, mass: false, factor: 1 },
  kmol: { rate: false, mass: false, factor: 1000 },
  "mol/s": { rate: true, mass: false, factor: 1 },
  "kmol/s": { rate: true, mass: false, factor: 1000 },
  "kmol/h": { rate: true, mass: false, factor: 1000 / 3600 },
  g: { rate: false, mass: true, factor: 1 },
  kg: { rate: false, mass: true, factor: 1000 },
  "kg/h": { rate: true, mass: true, factor: 1000 / 3600 },
  "t/h": { rate: true, mass: true, factor: 1e6 / 3600 },
};

/** The amount unit results are given in, for each feed unit. */
const AMOUNT_UNIT: Record<FeedUnit, FeedUnit> = {
  mol: "mol", kmol: "kmol", "mol/s": "mol/s", "kmol/s": "kmol/s", "kmol/h": "kmol/h", g: "mol", kg: "kmol", "kg/h": "kmol/h", "t/h": "kmol/h",
};

const FEED_AMOUNT = /^([-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?)\s*(\S+)$/;

/**
 * Feed amounts in the amount unit of `feedUnit`: bare numbers are in feedUnit; a string
 * carries its own unit of the same set (an amount when feedUnit is an amount, a rate when
 * it is a rate); mass units go through each species' molar mass (from its formula).
 */
export function feedAmounts(
  feed: Record<string, number | string>,
  feedUnit: string | undefined,
): { amounts: Record<string, number>; feedUnit: FeedUnit; amountUnit: FeedUnit; molarMass?: Record<string, number> } {
  const unit = (feedUnit ?? "mol") as FeedUnit;
  if (!Object.prototype.hasOwnProperty.call(FEED_UNIT_INFO, unit)) {
    refuse("invalid-request", `invalid request: equilibrium.feedUnit: expected one of ${FEED_UNITS.join(", ")}`);
  }
  const target = AMOUNT_UNIT[unit];
  const tInfo = FEED_UNIT_INFO[target];
  const amounts: Record<string, number> = {};
  let molarMass: Record<string, number> | undefined;
  for (const [key, raw] of Object.entries(feed)) {
    const field = `equilibrium.feed[${JSON.stringify(key)}]`;
    let value: number;
    let u: FeedUnit = unit;
    const text = typeof raw === "number" ? "" : raw.trim();
    if (typeof raw === "number") value = raw;
    else if (/^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/.test(text)) value = Number(text);
    else {
      const m = FEED_AMOUNT.exec(text);
      if (!m || !Object.prototype.hasOwnProperty.call(FEED_UNIT_INFO, m[2])) {
        refuse("unit-error", `${field}: cannot read "${raw}" as a feed amount; expected a number with one of ${FEED_UNITS.join(", ")}`, { field });
      }
      value = Number(m![1]);
      u = m![2] as FeedUnit;
    }
    if (!Number.isFinite(value!) || value! < 0) {
      refuse("invalid-request", `invalid request: ${field}: expected an amount of 0 or more (got ${JSON.stringify(raw)})`, { field });
    }
    const info = FEED_UNIT_INFO[u];
    if (info.rate !== tInfo.rate) {
      refuse(
        "unit-error",
        `${field}: "${raw}" is ${info.rate ? "a rate" : "an amount"} but feedUnit "${unit}" is ${tInfo.rate ? "a rate" : "an amount"}; give every feed amount as ${tInfo.rate ? "a rate" : "an amount"}`,
        { field },
      );
    }
    let base = value! * info.factor;
    if (info.mass) {
      const M = parseFormula(parseSpeciesKey(key).formula).molarMassGPerMol;
      molarMass = { ...(molarMass ?? {}), [key]: M };
      base /= M;
    }
    amounts[key] = base / tInfo.factor;
  }
  return { amounts, feedUnit: unit, amountUnit: target, molarMass };
}

/** Solve one problem and shape it; `sigma` (μ°/RT units per species) adds the linear bands. */
function compose(p: EquilibriumProblem, list: SetSpecies[], k: number, sigma: Float64Array | null, real: RealGasSetup | null, tK: number): Composition {
  const rg = real ? solveRealGas(p, real, tK, solveEquilibrium) : null;
  const sol: EquilibriumSolution = rg ? rg.solution : solveEquilibrium(p);
  const S = list.length;
  const m = sol.moles;
  const fractions = (amounts: Float64Array) => {
    let ng = 0;
    for (let i = 0; i < S; i++) if (p.gas[i]) ng += amounts[i];
    const out: Record<string, number> = {};
    list.forEach((sp, i) => {
      if (p.gas[i]) out[sp.key] = ng > 0 ? amounts[i] / ng : 0;
    });
    return { ng, out };
  };
  const { ng, out: moleFractions } = fractions(m);
  const moles: Record<string, number> = {};
  const fugacityCoefficients: Record<string, number> = {};
  list.forEach((sp, i) => {
    moles[sp.key] = m[i];
    if (p.gas[i]) fugacityCoefficients[sp.key] = rg ? rg.phi[i] : 1;
  });
  const log10K = p.nu.map((row) => -row.reduce((a, v, i) => a + v * p.g[i], 0) / LN10);
  const out: Composition = {
    extents: sol.extents,
    moles,
    moleFractions,
    keyConversion: (p.n0[k] - m[k]) / p.n0[k],
    keyFraction: p.gas[k] ? moleFractions[list[k].key] : null,
    log10K,
    converged: sol.converged,
    diagnostics: { iterations: sol.iterations, residual: sol.residual, atBound: sol.atBound, ...(rg ? { realGas: rg.diagnostics } : {}) },
    fugacityCoefficients,
  };
  if (rg) {
    const im = rg.ideal.moles;
    out.ideal = { moleFractions: fractions(im).out, keyConversion: (p.n0[k] - im[k]) / p.n0[k] };
  }
  if (p.nu.length === 1) out.extent = sol.extents[0];
  if (sigma) {
    // dn_i/dg_q = Σ_j ν_ji · dξ_j/dg_q
    const dn = Array.from({ length: S }, (_, i) =>
      Array.from({ length: S }, (_, q) => p.nu.reduce((a, row, j) => a + row[i] * sol.sensitivity[j][q], 0)),
    );
    const dng = Array.from({ length: S }, (_, q) => dn.reduce((a, row, i) => a + (p.gas[i] ? row[q] : 0), 0));
    const norm = (v: (q: number) => number) => {
      let s = 0;
      for (let q = 0; q < S; q++) s += (v(q) * sigma[q]) ** 2;
      return Math.sqrt(s);
    };
    const sMoles: Record<string, number> = {};
    const sFractions: Record<string, number> = {};
    list.forEach((sp, i) => {
      sMoles[sp.key] = norm((q) => dn[i][q]);
      if (p.gas[i] && ng > 0) sFractions[sp.key] = norm((q) => (dn[i][q] - (m[i] / ng) * dng[q]) / ng);
    });
    out.sigma = {
      extents: sol.sensitivity.map((row) => norm((q) => row[q])),
      moles: sMoles,
      moleFractions: sFractions,
      keyConversion: sMoles[list[k].key] / p.n0[k],
      keyFraction: p.gas[k] ? (sFractions[list[k].key] ?? 0) : null,
      log10K: p.nu.map((row) => norm((q) => row[q]) / LN10),
    };
  }
  return out;
}
