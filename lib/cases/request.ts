/**
 * The engine request for a case, pure: the reaction text of its terms and the request built
 * from its inputs and pinned versions. Used by the case services and the demo seeder.
 * Client-safe (types only from the engine and the models).
 */
import type { EvaluateRequest } from "@/lib/thermo";
import type { CaseInputs } from "@/lib/validation/cases";
import type { PinnedVersion } from "@/models/case-snapshot";
import { reactionText, termKey } from "./balance";
import { equilibriumRequestOf, speciesOfPin } from "./equilibrium";

/** Critical constants by species key, for the feed species a real-gas equilibrium has no pin for (inert ones). */
export type InertCritical = Record<string, { tcK: number; pcBar: number; omega: number }>;

/** The case's reaction as text: `CH4(g) + H2O(g) → CO(g) + 3 H2(g)`; the engine reads `->`. */
export function caseReaction(inputs: Pick<CaseInputs, "terms">, arrow = "→"): string {
  return reactionText(
    inputs.terms.map((t) => ({ key: termKey(t), coefficient: t.coefficient })),
    arrow,
  );
}

/** The engine request for a case: species keys are the formula plus phase marker, or the bare formula for the stable phase. */
export function buildRequest(inputs: CaseInputs, pins: readonly PinnedVersion[], inertCritical: InertCritical = {}): EvaluateRequest {
  const species: EvaluateRequest["species"] = {};
  // Critical constants ride along only when the equilibrium asks for a real gas, so other requests stay as they were.
  const realGas = inputs.equilibrium?.gas === "peng-robinson";
  for (const p of pins) species[p.key] = realGas && p.critical ? { ...speciesOfPin(p), critical: p.critical } : speciesOfPin(p);
  const request: EvaluateRequest = {
    reaction: caseReaction(inputs, "->"),
    species,
    temperatures: inputs.temperatures,
    referenceK: inputs.referenceK,
    toleranceKJ: inputs.toleranceKJ,
    // Which species moves ΔrG: drawn on the case page and printed in the report.
    include: ["contributions"],
  };
  if (inputs.toleranceKFactor !== null) request.toleranceKFactor = inputs.toleranceKFactor;
  const equilibrium = equilibriumRequestOf(inputs.equilibrium);
  if (equilibrium) {
    const inert = Object.fromEntries(Object.entries(inertCritical).filter(([k]) => !(k in species)));
    if (realGas && Object.keys(inert).length) equilibrium.critical = inert;
    request.equilibrium = equilibrium;
  }
  const inletK = inputs.equilibrium?.adiabaticInletK;
  if (equilibrium && inletK !== undefined && inletK !== null) request.adiabatic = { inletK };
  return request;
}
