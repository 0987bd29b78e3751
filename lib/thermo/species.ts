/**
 * Species models: one chain of segments per phase (chain.ts), each segment anchored at one
 * temperature (species-model.ts), H and S by numerical integration of Cp from the anchor;
 * terms on the grid (term.ts) and their warnings (term-warnings.ts). This module is the
 * public door for one species (`speciesProperties`) and re-exports the stages' names.
 */
import { T298 } from "./constants";
import { refuse } from "./errors";
import { requireTemperatureK } from "./grid";
import { Integrator, WORK_BUDGET } from "./integrate";
import { formatPath, missingIsRequired, speciesSchema, type SpeciesInput } from "./schema";
import { buildSpeciesModel, type EngineWarning } from "./species-model";
import { termOnGrid, type TermGrid } from "./term";
import { termWarnings } from "./term-warnings";

export { fmt } from "./format";

export { buildSpeciesModel, type EngineWarning, type SpeciesModel } from "./species-model";
export { termAt, termOnGrid, type TermGrid } from "./term";

export interface SpeciesRow {
  tK: number;
  phase: string;
  cpJ: number;
  hkJ: number;
  sJ: number;
  /** H − T·S in kJ/mol (not ΔfG°). */
  gkJ: number;
}

/** Rows of a term's grid values; row j goes to index `order[j]` when an order is given. */
export function speciesRows(T: Float64Array, grid: TermGrid, order?: readonly number[]): SpeciesRow[] {
  const n = T.length;
  const rows: SpeciesRow[] = new Array(n);
  for (let j = 0; j < n; j++) {
    const hkJ = grid.h[j] / 1000;
    rows[order ? order[j] : j] = {
      tK: T[j],
      phase: grid.phases[grid.phaseIndex[j]],
      cpJ: grid.cp[j],
      hkJ,
      sJ: grid.s[j],
      gkJ: hkJ - (T[j] * grid.s[j]) / 1000,
    };
  }
  return rows;
}

/**
 * Cp (J/(mol·K)), H on the formation basis (kJ/mol), S (J/(mol·K)) and G = H − TS (kJ/mol,
 * not ΔfG°) of one species at the given temperatures (K), with warnings. `phase` restricts
 * to one chain; without it the lowest-G phase is taken at each T. Rows come back in the
 * order of `temperaturesK`. The integration work is bounded by `integrator`'s budget
 * (default: a fresh one with the request budget, WORK_BUDGET).
 */
export function speciesProperties(
  species: SpeciesInput,
  temperaturesK: number[],
  options: { phase?: string; referenceK?: number; key?: string; integrator?: Integrator } = {},
): { rows: SpeciesRow[]; warnings: EngineWarning[] } {
  const parsed = speciesSchema.safeParse(species, { error: missingIsRequired });
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    refuse("invalid-request", `${formatPath(["species", ...issue.path])}: ${issue.message}`, { issues: parsed.error.issues });
  }
  const referenceK = options.referenceK ?? T298;
  for (const t of [...temperaturesK, referenceK]) {
    if (!Number.isFinite(t)) refuse("nonpositive-temperature", `temperaturesK: temperatures must be finite and above 0 K (got ${t} K)`);
    requireTemperatureK(t, "temperaturesK");
  }
  const key = options.key ?? "species";
  const integrator = options.integrator ?? new Integrator(WORK_BUDGET);
  const model = buildSpeciesModel(key, parsed.data!, referenceK, { integrator, fieldPrefix: "species" });
  const order = temperaturesK.map((t, i) => i).sort((a, b) => temperaturesK[a] - temperaturesK[b]);
  const T = Float64Array.from(order, (i) => temperaturesK[i]);
  const grid = termOnGrid(model, options.phase, T, options.phase !== undefined);
  const rows = speciesRows(T, grid, order);
  const warnings = T.length ? termWarnings(model, options.phase, T, grid, options.referenceK ?? null) : [...model.warnings];
  return { rows, warnings };
}
