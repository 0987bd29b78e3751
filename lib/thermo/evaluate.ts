/**
 * Reaction properties, corrected (Kirchhoff, numerically integrated) against naive
 * (ΔrH(Tref) − T·ΔrS(Tref)), crossovers and the sign case: the engine's main door.
 */
import { ENGINE_VERSION, HIGH_PRESSURE_BAR, R as GAS_CONSTANT, T298 } from "./constants";
import { refuse } from "./errors";
import { checkBalance, parseReaction } from "./formula";
import { inSupportedRange, parseTemperatureGrid } from "./grid";
import { brent } from "./roots";
import { withWorkBudget, WORK_BUDGET } from "./integrate";
import { describeIssue, evaluateRequestSchema, missingIsRequired } from "./schema";
import {
  buildSpeciesModel,
  checkFiniteGrid,
  fmt,
  termAt,
  termOnGrid,
  termWarnings,
  type EngineWarning,
  type SpeciesModel,
  type SpeciesRow,
  type TermGrid,
} from "./species";
import { parseMolarEnergyKJ, parsePressureBar, parseTemperatureK } from "./units";
import { equilibriumOnGrid, type EquilibriumInfo, type EquilibriumPoint } from "./equilibrium";
import { adiabaticOutlet, type AdiabaticResult } from "./adiabatic";
import { combine, parseUncertainty, sigmaG, sigmaGNaive, type SpeciesUncertainty } from "./uncertainty";
import { speciesContributions } from "./contributions";
import { belowBoilingPointWarning, condensationWarnings } from "./condensation";

export interface EvaluatePoint {
  tK: number;
  dCpJ: number;
  dHkJ: number;
  dSJ: number;
  dGkJ: number;
  lnK: number;
  log10K: number;
  K: number | null;
  naiveDGkJ: number;
  naiveLnK: number;
  naiveLog10K: number;
  diffKJ: number;
  exceedsTolerance: boolean;
  /** 1σ of dGkJ (kJ/mol) and log10K, when species carry uncertainties. */
  sigmaDGkJ?: number;
  sigmaLog10K?: number;
  naiveSigmaDGkJ?: number;
  /** |diffKJ| > sigmaDGkJ: the naive error exceeds the data's own uncertainty. */
  naiveExceedsUncertainty?: boolean;
}

export interface UncertaintySummary {
  basis: string;
  species: Record<string, SpeciesUncertainty>;
  /** Grid temperatures where |naive − corrected| ΔrG exceeds the 1σ of the corrected ΔrG. */
  naiveExceedsK: number[];
}

export type SignCaseCode = "favourable-always" | "favourable-above" | "favourable-below" | "favourable-never";

export interface EvaluateResult {
  points: EvaluatePoint[];
  reference: { tK: number; dCpJ: number; dHkJ: number; dSJ: number; dGkJ: number; lnK: number; log10K: number };
  crossover: { naiveK: number | null; naiveInSpan: boolean; correctedK: number[] };
  signCase: { code: SignCaseCode; text: string; correctedAgrees: boolean };
  species?: Record<string, SpeciesRow[]>;
  /** With include "contributions": per species key, kJ/mol per grid point (lib/thermo/contributions.ts). */
  contributions?: Record<string, number[]>;
  contributionsSigma?: Record<string, number[]>;
  uncertainty?: UncertaintySummary;
  equilibrium?: EquilibriumPoint[];
  equilibriumInfo?: EquilibriumInfo;
  adiabatic?: AdiabaticResult;
  warnings: EngineWarning[];
  engine: { version: string };
}

export const UNCERTAINTY_BASIS =
  "1σ standard uncertainties by linear propagation of each species' ΔfH°, S° and relative Cp uncertainty, taken as independent";

export const SIGN_CASES: Record<SignCaseCode, string> = {
  "favourable-always": "K > 1 at all T",
  "favourable-above": "K > 1 only above the crossover temperature",
  "favourable-below": "K > 1 only below the crossover temperature",
  "favourable-never": "K > 1 at no T",
};

const LN10 = Math.LN10;
/** R read once: under a CommonJS transform an imported binding is an accessor, read on every use in the per-point loops. */
const R = GAS_CONSTANT;

interface Term {
  key: string;
  nu: number;
  phase?: string;
  model: SpeciesModel;
}

/** ΔrX at one temperature (J units), with the lowest-G phase chosen per term where unmarked. */
function reactionAt(terms: Term[], T: number): { dCp: number; dH: number; dS: number; dG: number } {
  let dCp = 0;
  let dH = 0;
  let dS = 0;
  for (const t of terms) {
    const v = termAt(t.model, t.phase, T);
    dCp += t.nu * v.cpJ;
    dH += t.nu * v.hJ;
    dS += t.nu * v.sJ;
  }
  return { dCp, dH, dS, dG: dH - T * dS };
}

/**
 * Rounding scale of ΔrG at T (J/mol): ΔrG is a sum of ν·(H − T·S) over the terms, each known
 * to about 1e-13 of its size from the integration and a few ulps from the arithmetic.
 */
function touchTolerance(terms: Term[], T: number): number {
  let size = 0;
  for (const t of terms) {
    const v = termAt(t.model, t.phase, T);
    size += Math.abs(t.nu) * (Math.abs(v.hJ) + T * Math.abs(v.sJ));
  }
  return 1e-12 * size;
}

interface Sigmas {
  dGkJ: Float64Array;
  log10K: Float64Array;
  naiveDGkJ: Float64Array;
  exceeds: Uint8Array;
}

/** The point objects, built once from the typed arrays (one object shape per call). */
function buildPoints(
  n: number, T: Float64Array, dCp: Float64Array, dH: Float64Array, dS: Float64Array, dG: Float64Array, naive: Float64Array,
  tolJ: number, tolLn: number, sigmas: Sigmas | null,
): EvaluatePoint[] {
  const points: EvaluatePoint[] = new Array(n);
  for (let i = 0; i < n; i++) {
    const g = dG[i];
    const gn = naive[i];
    const t = T[i];
    const lnK = -g / (R * t);
    const naiveLnK = -gn / (R * t);
    const K = Math.exp(lnK);
    const exceedsTolerance = Math.abs(gn - g) > tolJ || Math.abs(naiveLnK - lnK) > tolLn;
    points[i] = sigmas === null
      ? {
          tK: t, dCpJ: dCp[i], dHkJ: dH[i] / 1000, dSJ: dS[i], dGkJ: g / 1000, lnK, log10K: lnK / LN10,
          K: Number.isFinite(K) && K > 0 ? K : null, naiveDGkJ: gn / 1000, naiveLnK, naiveLog10K: naiveLnK / LN10,
          diffKJ: (gn - g) / 1000, exceedsTolerance,
        }
      : {
          tK: t, dCpJ: dCp[i], dHkJ: dH[i] / 1000, dSJ: dS[i], dGkJ: g / 1000, lnK, log10K: lnK / LN10,
          K: Number.isFinite(K) && K > 0 ? K : null, naiveDGkJ: gn / 1000, naiveLnK, naiveLog10K: naiveLnK / LN10,
          diffKJ: (gn - g) / 1000, exceedsTolerance,
          sigmaDGkJ: sigmas.dGkJ[i], sigmaLog10K: sigmas.log10K[i], naiveSigmaDGkJ: sigmas.naiveDGkJ[i],
          naiveExceedsUncertainty: sigmas.exceeds[i] === 1,
        };
  }
  return points;
}

/** Refuses (`nonfinite-value`) a reaction value that overflowed although every species' values are finite. */
function checkFinitePoints(points: EvaluatePoint[], ref: { dCp: number; dH: number; dS: number; dG: number }): void {
  const fields = ["dCpJ", "dHkJ", "dSJ", "dGkJ", "lnK", "log10K", "naiveDGkJ", "naiveLnK", "diffKJ"] as const;
  const refBad = (["dCp", "dH", "dS", "dG"] as const).find((f) => !Number.isFinite(ref[f]));
  if (refBad) {
    refuse("nonfinite-value", `reference: Δr${refBad.slice(1)} is not finite in double precision; the models' coefficients are outside any physical range`, { field: refBad });
  }
  for (const p of points) {
    const bad = fields.find((f) => !Number.isFinite(p[f]));
    if (bad) {
      refuse("nonfinite-value", `points at ${fmt(p.tK)} K: ${bad} is not finite in double precision; the models' coefficients are outside any physical range`, {
        tK: p.tK, field: bad,
      });
    }
  }
}

/**
 * Evaluate a request (EVALUATE.md). Validates with `evaluateRequestSchema`; every refusal is
 * an EngineRefusal with a stable code and an exact message. Units: kJ/mol for H and G,
 * J/(mol·K) for S and Cp, K for temperatures.
 */
export function evaluate(request: unknown): EvaluateResult {
  return withWorkBudget(WORK_BUDGET, () => evaluateWithin(request));
}

function evaluateWithin(request: unknown): EvaluateResult {
  const parsed = evaluateRequestSchema.safeParse(request, { error: missingIsRequired });
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    refuse("invalid-request", `invalid request: ${describeIssue(issue)}`, {
      issues: parsed.error.issues.map((i) => ({ path: i.path.map(String), message: i.message })),
    });
  }
  const req = parsed.data!;
  const reaction = parseReaction(req.reaction);
  for (const t of reaction.terms) {
    if (!Object.prototype.hasOwnProperty.call(req.species, t.key)) {
      refuse("missing-species", `species "${t.key}" is used in the reaction but has no entry in species`, { species: t.key });
    }
  }
  checkBalance(reaction.terms);
  const referenceK = parseTemperatureK(req.referenceK ?? T298, "referenceK");
  if (!(referenceK > 0)) refuse("nonpositive-temperature", `referenceK: temperatures must be above 0 K (got ${referenceK} K)`);
  inSupportedRange(referenceK, "referenceK");
  const T = parseTemperatureGrid(req.temperatures);
  const n = T.length;

  const terms: Term[] = reaction.terms.map((t) => ({
    key: t.key, nu: t.nu, phase: t.phase, model: buildSpeciesModel(t.key, req.species[t.key], referenceK),
  }));

  // Per-temperature values stay in typed arrays through the pipeline; the point objects are
  // built once, at the end.
  const dCp = new Float64Array(n);
  const dH = new Float64Array(n);
  const dS = new Float64Array(n);
  const grids: TermGrid[] = [];
  const warnings: EngineWarning[] = [];
  for (const term of terms) {
    const g = termOnGrid(term.model, term.phase, T, term.model.chains.size > 1);
    const { cp, h, s } = g;
    const nu = term.nu;
    // x * 0 is 0 for a finite x and NaN otherwise: z stays 0 exactly when every value is finite.
    let z = 0;
    for (let i = 0; i < n; i++) {
      const c = cp[i];
      const hh = h[i];
      const ss = s[i];
      z += c * 0 + hh * 0 + ss * 0;
      dCp[i] += nu * c;
      dH[i] += nu * hh;
      dS[i] += nu * ss;
    }
    if (z !== 0) checkFiniteGrid(term.key, g, T);
    grids.push(g);
    for (const w of termWarnings(term.model, term.phase, T, g, referenceK)) warnings.push(w);
    const cold = belowBoilingPointWarning(term.key, req.species[term.key], T, g);
    if (cold) warnings.push(cold);
  }

  const ref = reactionAt(terms, referenceK);
  let tolJ = Infinity;
  if (req.toleranceKJ !== undefined) {
    const kJ = parseMolarEnergyKJ(req.toleranceKJ, "toleranceKJ");
    if (!(kJ >= 0)) refuse("invalid-request", `invalid request: toleranceKJ: expected a tolerance of 0 or more (got ${fmt(kJ)} kJ/mol)`);
    tolJ = kJ * 1000;
  }
  const tolLn = req.toleranceKFactor === undefined ? Infinity : Math.log(req.toleranceKFactor);
  const dG = new Float64Array(n);
  const naive = new Float64Array(n);
  let z = 0;
  for (let i = 0; i < n; i++) {
    const t = T[i];
    const g = dH[i] - t * dS[i];
    const gn = ref.dH - t * ref.dS;
    const lnK = -g / (R * t);
    const naiveLnK = -gn / (R * t);
    dG[i] = g;
    naive[i] = gn;
    z += dCp[i] * 0 + dH[i] * 0 + dS[i] * 0 + g * 0 + lnK * 0 + naiveLnK * 0 + gn * 0 + (gn - g) * 0;
  }
  // Only a value that is not finite builds the points here, to name it.
  if (z !== 0 || !(Number.isFinite(ref.dCp) && Number.isFinite(ref.dH) && Number.isFinite(ref.dS) && Number.isFinite(ref.dG))) {
    checkFinitePoints(buildPoints(n, T, dCp, dH, dS, dG, naive, tolJ, tolLn, null), ref);
  }

  const uncertain = terms.map((t) => parseUncertainty(t.key, req.species[t.key]));
  let uncertaintySummary: UncertaintySummary | undefined;
  let sigmas: Sigmas | null = null;
  if (uncertain.some((u) => u !== null)) {
    const refs = terms.map((t) => termAt(t.model, t.phase, referenceK));
    const nus = terms.map((t) => t.nu);
    const naiveExceedsK: number[] = [];
    const m = terms.length;
    const sig = new Float64Array(m);
    const sigN = new Float64Array(m);
    sigmas = { dGkJ: new Float64Array(n), log10K: new Float64Array(n), naiveDGkJ: new Float64Array(n), exceeds: new Uint8Array(n) };
    for (let i = 0; i < n; i++) {
      const t = T[i];
      for (let k = 0; k < m; k++) {
        const u = uncertain[k];
        sig[k] = u ? sigmaG(u, t, grids[k].h[i], grids[k].s[i], refs[k].hJ, refs[k].sJ) : 0;
        sigN[k] = u ? sigmaGNaive(u, t) : 0;
      }
      const sG = combine(nus, sig);
      const sigmaDGkJ = sG / 1000;
      sigmas.dGkJ[i] = sigmaDGkJ;
      sigmas.log10K[i] = sG / (R * t * LN10);
      sigmas.naiveDGkJ[i] = combine(nus, sigN) / 1000;
      const exceeds = Math.abs((naive[i] - dG[i]) / 1000) > sigmaDGkJ;
      sigmas.exceeds[i] = exceeds ? 1 : 0;
      if (exceeds) naiveExceedsK.push(t);
    }
    uncertaintySummary = {
      basis: UNCERTAINTY_BASIS,
      species: Object.fromEntries(terms.flatMap((t, k) => (uncertain[k] ? [[t.key, uncertain[k]!]] : []))),
      naiveExceedsK,
    };
  }

  // Corrected crossovers: bracket on the grid and at the extrema of ΔrG (ΔrS = 0). The nodes
  // are the grid temperatures plus one per sign change of ΔrS between neighbours.
  const dGAt = (t: number) => reactionAt(terms, t).dG;
  const dSAt = (t: number) => reactionAt(terms, t).dS;
  let changes = 0;
  for (let i = 0; i + 1 < n; i++) if (dS[i] * dS[i + 1] < 0) changes++;
  const nodeT = new Float64Array(n + changes);
  const nodeG = new Float64Array(n + changes);
  const nodeExtremum = new Uint8Array(n + changes);
  let nn = 0;
  for (let i = 0; i < n; i++) {
    nodeT[nn] = T[i];
    nodeG[nn] = dG[i];
    nodeExtremum[nn++] = dS[i] === 0 ? 1 : 0;
    if (i + 1 < n && dS[i] * dS[i + 1] < 0) {
      const te = brent(dSAt, T[i], T[i + 1], dS[i], dS[i + 1]);
      if (te > T[i] && te < T[i + 1]) {
        nodeT[nn] = te;
        nodeG[nn] = dGAt(te);
        nodeExtremum[nn++] = 1;
      }
    }
  }
  // A double root: ΔrG touches zero at an extremum (ΔrS = 0) without changing sign. An extremum
  // whose |ΔrG| is within the rounding of the terms' H and T·S counts as a root there.
  for (let j = 0; j < nn; j++) {
    if (nodeG[j] !== 0 && nodeExtremum[j] && Math.abs(nodeG[j]) <= touchTolerance(terms, nodeT[j])) nodeG[j] = 0;
  }
  const roots: number[] = [];
  for (let j = 0; j < nn; j++) {
    const ga = nodeG[j];
    if (ga === 0) {
      roots.push(nodeT[j]);
      continue;
    }
    if (j + 1 < nn) {
      const gb = nodeG[j + 1];
      if (gb !== 0 && ga * gb < 0) roots.push(brent(dGAt, nodeT[j], nodeT[j + 1], ga, gb, 1e-9));
    }
  }

  const naiveK = ref.dH * ref.dS > 0 ? ref.dH / ref.dS : null;
  const naiveInSpan = naiveK !== null && naiveK >= T[0] && naiveK <= T[n - 1];
  const code: SignCaseCode =
    ref.dH <= 0 ? (ref.dS >= 0 ? "favourable-always" : "favourable-below") : ref.dS > 0 ? "favourable-above" : "favourable-never";
  let agrees = roots.length === (naiveInSpan ? 1 : 0);
  for (let i = 0; i < n && agrees; i++) if (dG[i] < 0 !== naive[i] < 0) agrees = false;

  const pressureBar =
    req.pressureBar !== undefined
      ? parsePressureBar(req.pressureBar, "pressureBar")
      : req.equilibrium?.pressureBar !== undefined
        ? parsePressureBar(req.equilibrium.pressureBar, "equilibrium.pressureBar")
        : undefined;
  // With a real-gas equilibrium the fugacity coefficients are applied; the warning would say otherwise.
  if (pressureBar !== undefined && pressureBar > HIGH_PRESSURE_BAR && req.equilibrium?.gas !== "peng-robinson") {
    warnings.push({
      code: "high-pressure", pressureBar,
      message: `K is the ideal-gas constant for a 1 bar standard state; at ${fmt(pressureBar)} bar non-ideal (fugacity) corrections may matter`,
    });
  }

  const result: EvaluateResult = {
    points: buildPoints(n, T, dCp, dH, dS, dG, naive, tolJ, tolLn, sigmas),
    reference: {
      tK: referenceK, dCpJ: ref.dCp, dHkJ: ref.dH / 1000, dSJ: ref.dS, dGkJ: ref.dG / 1000,
      lnK: -ref.dG / (R * referenceK), log10K: -ref.dG / (R * referenceK) / LN10,
    },
    crossover: { naiveK, naiveInSpan, correctedK: roots },
    signCase: { code, text: SIGN_CASES[code], correctedAgrees: agrees },
    warnings,
    engine: { version: ENGINE_VERSION },
  };
  if (uncertaintySummary) result.uncertainty = uncertaintySummary;
  if (req.equilibrium) {
    const models = new Map(terms.map((t) => [t.key, t.model]));
    const gridMap = new Map(terms.map((t, k) => [t.key, grids[k]]));
    const eq = equilibriumOnGrid({
      equilibrium: req.equilibrium, reaction: req.reaction, species: req.species, T, referenceK, models, grids: gridMap,
      buildModel: (key) => buildSpeciesModel(key, req.species[key], referenceK),
    });
    result.equilibrium = eq.points;
    result.equilibriumInfo = eq.info;
    warnings.push(...eq.warnings);
    warnings.push(...condensationWarnings(req.species, eq.points, eq.info));
    if (req.adiabatic) {
      const ad = adiabaticOutlet({
        adiabatic: req.adiabatic, context: eq.context, models, referenceK,
        hasEntry: (key) => Object.prototype.hasOwnProperty.call(req.species, key),
        buildModel: (key) => buildSpeciesModel(key, req.species[key], referenceK),
      });
      result.adiabatic = ad.result;
      warnings.push(...ad.warnings);
    }
  } else if (req.adiabatic) {
    refuse("adiabatic-needs-equilibrium", "adiabatic: an adiabatic outlet needs an equilibrium feed; add equilibrium { feed, pressureBar }");
  }
  if (req.include?.includes("species")) {
    const species: Record<string, SpeciesRow[]> = {};
    terms.forEach((term, k) => {
      const g = grids[k];
      const rows: SpeciesRow[] = new Array(n);
      for (let i = 0; i < n; i++) {
        const hkJ = g.h[i] / 1000;
        rows[i] = { tK: T[i], phase: g.phases[g.phaseIndex[i]], cpJ: g.cp[i], hkJ, sJ: g.s[i], gkJ: hkJ - (T[i] * g.s[i]) / 1000 };
      }
      species[term.key] = rows;
    });
    result.species = species;
  }
  if (req.include?.includes("contributions")) Object.assign(result, speciesContributions(terms, grids, T, referenceK, uncertain));
  // Warnings and the engine version close the result, after any optional sections.
  const { warnings: w, engine } = result;
  delete (result as Partial<EvaluateResult>).warnings;
  delete (result as Partial<EvaluateResult>).engine;
  result.warnings = w;
  result.engine = engine;
  return result;
}
