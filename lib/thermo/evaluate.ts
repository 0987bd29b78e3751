/**
 * Reaction properties, corrected (Kirchhoff, numerically integrated) against naive
 * (ΔrH(Tref) − T·ΔrS(Tref)), crossovers and the sign case: the engine's main door.
 *
 * evaluate() is a pipeline of named stages, each in its own module:
 *   1. normaliseRequest (request.ts)        — every input checked once, in SI numbers
 *   2. buildTerms (reaction-grid.ts)         — one species model per term, one Integrator per call
 *   3. reactionOnGrid (reaction-grid.ts)     — term grids summed into typed arrays, term warnings
 *   4. analysis: reactionSigmas (reaction-uncertainty.ts), correctedCrossovers and signCaseOf
 *      (crossover.ts), equilibrium and adiabatic outlet (equilibrium.ts, adiabatic.ts)
 *   5. assemble: buildPoints (or buildColumns) (points.ts) once at the end, the result's keys written in order.
 */
import { ENGINE_VERSION, HIGH_PRESSURE_BAR, R as GAS_CONSTANT } from "./constants";
import { adiabaticOutlet } from "./adiabatic";
import { condensationWarnings } from "./condensation";
import { speciesContributions } from "./contributions";
import { correctedCrossovers, signCaseOf } from "./crossover";
import { equilibriumOnGrid } from "./equilibrium";
import type { ColumnarResult, ResultFormat } from "./columns";
import type { EvaluateResult } from "./evaluate-types";
import { fmt } from "./format";
import { Integrator, WORK_BUDGET } from "./integrate";
import { buildColumns, buildPoints, refuseNonfinitePoints } from "./points";
import { buildTerms, reactionOnGrid, type ReactionGrid, type Term } from "./reaction-grid";
import { reactionSigmas } from "./reaction-uncertainty";
import { normaliseRequest, type NormalisedRequest } from "./request";
import { buildSpeciesModel, type EngineWarning } from "./species-model";
import { speciesRows, type SpeciesRow } from "./species";
import { parseUncertainty } from "./uncertainty";

export { type EvaluatePoint, type EvaluateResult } from "./evaluate-types";

const LN10 = Math.LN10;
const R = GAS_CONSTANT;

export interface EvaluateOptions {
  /** The integrator of this call (its work budget, its counters); default: a fresh one with WORK_BUDGET. */
  integrator?: Integrator;
  /**
   * "rows" (default): `points`, one object per temperature. "columns": `columns` in its place,
   * built straight from the typed arrays — the same as `toColumnar(evaluate(request))` (columns.ts)
   * without building the point objects first.
   */
  format?: ResultFormat;
}

/**
 * Evaluate a request (EVALUATE.md). Validates with `evaluateRequestSchema`; every refusal is
 * an EngineRefusal with a stable code and an exact message. Units: kJ/mol for H and G,
 * J/(mol·K) for S and Cp, K for temperatures.
 */
export function evaluate(request: unknown, options?: EvaluateOptions & { format?: "rows" }): EvaluateResult;
export function evaluate(request: unknown, options: EvaluateOptions & { format: "columns" }): ColumnarResult;
export function evaluate(request: unknown, options?: EvaluateOptions): EvaluateResult | ColumnarResult;
export function evaluate(request: unknown, options: EvaluateOptions = {}): EvaluateResult | ColumnarResult {
  const integrator = options.integrator ?? new Integrator(WORK_BUDGET);
  const nr = normaliseRequest(request);
  const { req, T, referenceK } = nr;
  const terms = buildTerms(nr.terms, req.species, referenceK, integrator);
  const warnings: EngineWarning[] = [];
  const rg = reactionOnGrid(terms, req.species, T, referenceK, warnings);
  // Only a value that is not finite builds the points here, to name it.
  if (rg.nonfinite) refuseNonfinitePoints(T, rg);

  const uncertain = terms.map((t) => parseUncertainty(t.key, req.species[t.key]));
  const unc = reactionSigmas(terms, uncertain, T, referenceK, rg);
  const roots = correctedCrossovers(terms, T, rg.dS, rg.dG);
  const { crossover, signCase } = signCaseOf(rg.ref, T, roots, rg.dG, rg.naive);
  highPressureWarning(nr, warnings);
  const outlet = req.equilibrium ? equilibriumAndOutlet(nr, terms, rg, integrator, warnings) : null;
  const contributions = req.include?.includes("contributions") ? speciesContributions(terms, rg.grids, T, referenceK, uncertain) : null;

  const ref = rg.ref;
  const sigmas = unc?.sigmas ?? null;
  return {
    ...(options.format === "columns" ? { columns: buildColumns(T, rg, nr.tolJ, nr.tolLn, sigmas) } : { points: buildPoints(T, rg, nr.tolJ, nr.tolLn, sigmas) }),
    reference: {
      tK: referenceK,
      dCpJ: ref.dCp,
      dHkJ: ref.dH / 1000,
      dSJ: ref.dS,
      dGkJ: ref.dG / 1000,
      lnK: -ref.dG / (R * referenceK),
      log10K: -ref.dG / (R * referenceK) / LN10,
    },
    crossover,
    signCase,
    ...(unc ? { uncertainty: unc.summary } : {}),
    ...(outlet ?? {}),
    ...(req.include?.includes("species") ? { species: speciesSection(terms, rg, T) } : {}),
    ...(contributions ?? {}),
    // Warnings and the engine version close the result, after any optional sections.
    warnings,
    engine: { version: ENGINE_VERSION },
  };
}

/** `high-pressure`: K is the ideal-gas constant; with a real-gas equilibrium the fugacity coefficients are applied, so no warning. */
function highPressureWarning(nr: NormalisedRequest, warnings: EngineWarning[]): void {
  const p = nr.pressureBar;
  if (p !== undefined && p > HIGH_PRESSURE_BAR && nr.req.equilibrium?.gas !== "peng-robinson") {
    warnings.push({
      code: "high-pressure",
      pressureBar: p,
      message: `K is the ideal-gas constant for a 1 bar standard state; at ${fmt(p)} bar non-ideal (fugacity) corrections may matter`,
    });
  }
}

/** Stage 4c: the equilibrium composition on the grid and, when asked, the adiabatic outlet. */
function equilibriumAndOutlet(
  nr: NormalisedRequest,
  terms: readonly Term[],
  rg: ReactionGrid,
  integrator: Integrator,
  warnings: EngineWarning[],
): Pick<EvaluateResult, "equilibrium" | "equilibriumInfo" | "adiabatic"> {
  const { req, T, referenceK } = nr;
  const models = new Map(terms.map((t) => [t.key, t.model]));
  const buildModel = (key: string) => buildSpeciesModel(key, req.species[key], referenceK, { integrator });
  const eq = equilibriumOnGrid({
    equilibrium: req.equilibrium!,
    reaction: req.reaction,
    species: req.species,
    T,
    referenceK,
    models,
    grids: new Map(terms.map((t, k) => [t.key, rg.grids[k]])),
    buildModel,
  });
  warnings.push(...eq.warnings);
  warnings.push(...condensationWarnings(req.species, eq.points, eq.info));
  if (!req.adiabatic) return { equilibrium: eq.points, equilibriumInfo: eq.info };
  const ad = adiabaticOutlet({
    adiabatic: req.adiabatic,
    context: eq.context,
    models,
    referenceK,
    hasEntry: (key) => Object.prototype.hasOwnProperty.call(req.species, key),
    buildModel,
  });
  warnings.push(...ad.warnings);
  return { equilibrium: eq.points, equilibriumInfo: eq.info, adiabatic: ad.result };
}

/** With include "species": each term's rows on the grid. */
function speciesSection(terms: readonly Term[], rg: ReactionGrid, T: Float64Array): Record<string, SpeciesRow[]> {
  const species: Record<string, SpeciesRow[]> = {};
  terms.forEach((term, k) => {
    species[term.key] = speciesRows(T, rg.grids[k]);
  });
  return species;
}
