/**
 * The caution in plain text, for mails and anywhere the component (components/results/caution.tsx)
 * cannot go. Keep the two in the same words. The gas model of the result's equilibrium decides
 * the first sentence: ideal-gas activities, or activities corrected by Peng–Robinson fugacity
 * coefficients (an estimate of its own).
 */
export type CautionGas = "ideal" | "peng-robinson";

/** The gas model a result was computed with: Peng–Robinson only where its equilibrium says so. */
export function cautionGasOf(result: { equilibriumInfo?: { gas?: string } } | null | undefined): CautionGas {
  return result?.equilibriumInfo?.gas === "peng-robinson" ? "peng-robinson" : "ideal";
}

/** The gas model of a case's saved inputs (a submitted case's match its snapshot): for mails that load no result. */
export function cautionGasOfInputs(inputs: { equilibrium?: { gas?: string } | null } | null | undefined): CautionGas {
  return inputs?.equilibrium?.gas === "peng-robinson" ? "peng-robinson" : "ideal";
}

/** What the estimate assumes, in the caution's parentheses. */
export const CAUTION_BASIS: Record<CautionGas, string> = {
  ideal: "ideal standard states (1 bar, ideal-gas activities, pure condensed phases)",
  "peng-robinson":
    "1 bar standard states, gas activities corrected by Peng–Robinson fugacity coefficients (a cubic equation of state with tabulated critical constants), pure condensed phases",
};

export const CAUTION_SAFETY = "Decisions that affect safety follow the organisation's process-safety review, the applicable codes and licensed engineering judgement.";

export function cautionText(gas: CautionGas = "ideal"): string {
  return `Screening estimates for ${CAUTION_BASIS[gas]}. ${CAUTION_SAFETY}`;
}

export const CAUTION_TEXT = cautionText("ideal");

/** The equilibrium panel's extra line: what the outlet is and is not. */
export function equilibriumCautionText(gas: CautionGas = "ideal"): string {
  const gasLine =
    gas === "peng-robinson"
      ? "non-ideal gas behaviour beyond what the Peng–Robinson equation captures (polar species, near-critical mixtures, binary interaction parameters left at 0)"
      : "non-ideal gas behaviour at high pressure";
  return (
    `The outlet is a thermodynamic limit: kinetics, catalyst activity, the approach to equilibrium and ${gasLine} decide the real outlet. ` +
    "Carbon formation is judged only if a carbon-forming reaction is in the set."
  );
}

/** The no-warnings line of a result's summary. */
export function noWarningsText(gas: CautionGas = "ideal"): string {
  return gas === "peng-robinson"
    ? "No warnings: every model is used inside its range, within the stated assumptions (1 bar standard states, Peng–Robinson fugacity coefficients for the gas)."
    : "No warnings: every model is used inside its range, within the ideal-state assumptions (1 bar standard states, ideal-gas activities).";
}
