/**
 * Reaction properties, corrected (Kirchhoff, numerically integrated) against naive
 * (ΔrH(Tref) − T·ΔrS(Tref)), crossovers and the sign case: the engine's main door.
 */
import { ENGINE_VERSION, HIGH_PRESSURE_BAR, R, T298 } from "./constants";
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

  const dCp = new Float64Array(n);
  const dH = new Float64Array(n);
  const dS = new Float64Array(n);
  const grids: TermGrid[] = [];
  const warnings: EngineWarning[] = [];
  for (const term of terms) {
    const g = termOnGrid(term.model, term.phase, T, term.model.chains.size > 1);
    checkFiniteGrid(term.key, g, T);
    grids.push(g);
    for (let i = 0; i < n; i++) {
      dCp[i] += term.nu * g.cp[i];
      dH[i] += term.nu * g.h[i];
      dS[i] += term.nu * g.s[i];
    }
    warnings.push(...termWarnings(term.model, term.phase, T, g, referenceK));
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
  const points: EvaluatePoint[] = new Array(n);
  for (let i = 0; i < n; i++) {
    const t = T[i];
    const g = dH[i] - t * dS[i];
    const gn = ref.dH - t * ref.dS;
    dG[i] = g;
    naive[i] = gn;
    const lnK = -g / (R * t);
    const naiveLnK = -gn / (R * t);
    const K = Math.exp(lnK);
    points[i] = {
      tK: t,
      dCpJ: dCp[i],
      dHkJ: dH[i] / 1000,
      dSJ: dS[i],
      dGkJ: g / 1000,
      lnK,
      log10K: lnK / LN10,
      K: Number.isFinite(K) && K > 0 ? K : null,
      naiveDGkJ: gn / 1000,
      naiveLnK,
      naiveLog10K: naiveLnK / LN10,
      diffKJ: (gn - g) / 1000,
      exceedsTolerance: Math.abs(gn - g) > tolJ || Math.abs(naiveLnK - lnK) > tolLn,
    };
  }

  checkFinitePoints(points, ref);

  const uncertain = terms.map((t) => parseUncertainty(t.key, req.species[t.key]));
  let uncertaintySummary: UncertaintySummary | undefined;
  if (uncertain.some((u) => u !== null)) {
    const refs = terms.map((t) => termAt(t.model, t.phase, referenceK));
    const nus = terms.map((t) => t.nu);
    const naiveExceedsK: number[] = [];
    const sig = new Float64Array(terms.length);
    const sigN = new Float64Array(terms.length);
    for (let i = 0; i < n; i++) {
      const t = T[i];
      terms.forEach((term, k) => {
        const u = uncertain[k];
        sig[k] = u ? sigmaG(u, t, grids[k].h[i], grids[k].s[i], refs[k].hJ, refs[k].sJ) : 0;
        sigN[k] = u ? sigmaGNaive(u, t) : 0;
      });
      const p = points[i];
      const sG = combine(nus, sig);
      p.sigmaDGkJ = sG / 1000;
      p.sigmaLog10K = sG / (R * t * LN10);
      p.naiveSigmaDGkJ = combine(nus, sigN) / 1000;
      p.naiveExceedsUncertainty = Math.abs(p.diffKJ) > p.sigmaDGkJ;
      if (p.naiveExceedsUncertainty) naiveExceedsK.push(t);
    }
    uncertaintySummary = {
      basis: UNCERTAINTY_BASIS,
      species: Object.fromEntries(terms.flatMap((t, k) => (uncertain[k] ? [[t.key, uncertain[k]!]] : []))),
      naiveExceedsK,
    };
  }

  // Corrected crossovers: bracket on the grid and at the extrema of ΔrG (ΔrS = 0).
  const dGAt = (t: number) => reactionAt(terms, t).dG;
  const dSAt = (t: number) => reactionAt(terms, t).dS;
  const nodes: { t: number; g: number }[] = [];
  const extrema = new Set<number>();
  const isExtremum = (t: number) => extrema.has(t);
  for (let i = 0; i < n; i++) {
    nodes.push({ t: T[i], g: dG[i] });
    if (dS[i] === 0) extrema.add(T[i]);
    if (i + 1 < n && dS[i] * dS[i + 1] < 0) {
      const te = brent(dSAt, T[i], T[i + 1], dS[i], dS[i + 1]);
      if (te > T[i] && te < T[i + 1]) {
        nodes.push({ t: te, g: dGAt(te) });
        extrema.add(te);
      }
    }
  }
  // A double root: ΔrG touches zero at an extremum (ΔrS = 0) without changing sign. An extremum
  // whose |ΔrG| is within the rounding of the terms' H and T·S counts as a root there.
  for (const node of nodes) {
    if (node.g !== 0 && isExtremum(node.t) && Math.abs(node.g) <= touchTolerance(terms, node.t)) node.g = 0;
  }
  const roots: number[] = [];
  for (let i = 0; i < nodes.length; i++) {
    const a = nodes[i];
    if (a.g === 0) {
      roots.push(a.t);
      continue;
    }
    const b = nodes[i + 1];
    if (b && b.g !== 0 && a.g * b.g < 0) roots.push(brent(dGAt, a.t, b.t, a.g, b.g, 1e-9));
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
    points,
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
  // Warnings and the engine version close the result, after any optional sections.
  const { warnings: w, engine } = result;
  delete (result as Partial<EvaluateResult>).warnings;
  delete (result as Partial<EvaluateResult>).engine;
  result.warnings = w;
  result.engine = engine;
  return result;
}
