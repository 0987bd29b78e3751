/** Case inputs for tests, pinned to the published reference versions. */
import type { CaseInput } from "@/lib/validation/cases";
import type { RefFormula } from "./reference-library";

/** The water-gas shift, CO(g) + H2O(g) → CO2(g) + H2(g), over the converter's span. */
export function shiftCase(pins: Record<RefFormula, number>, over: Partial<CaseInput> = {}): CaseInput {
  return {
    title: "Shift converter check",
    notes: "",
    terms: [
      { formula: "CO", phase: "g", coefficient: -1, versionId: pins.CO },
      { formula: "H2O", phase: "g", coefficient: -1, versionId: pins.H2O },
      { formula: "CO2", phase: "g", coefficient: 1, versionId: pins.CO2 },
      { formula: "H2", phase: "g", coefficient: 1, versionId: pins.H2 },
    ],
    temperatures: { fromK: 480, toK: 700, stepK: 20 },
    referenceK: 298.15,
    toleranceKJ: 1,
    toleranceKFactor: null,
    ...over,
  };
}
