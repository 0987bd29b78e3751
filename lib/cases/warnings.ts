/** What each engine warning code means, in the words the results page and report use. */
export const WARNING_MEANINGS: Record<string, string> = {
  extrapolation: "A species' model is used outside the temperature range it was fitted over; its Cp there is an extrapolation.",
  "reference-extrapolation": "The reference temperature lies outside a model's range, so the naive line is anchored on extrapolated values.",
  "phase-change-in-span": "A species changes its stable phase inside the span; ΔrH and ΔrS jump there.",
  "metastable-phase": "A term fixed to one phase is used where another phase is stable (for example supercooled or superheated).",
  "segment-jump": "Two segments of one model disagree at their shared edge; the values jump there by the stated amount.",
  "transition-mismatch": "A stated transition temperature or enthalpy disagrees with the crossing of the phases' G curves.",
  "reference-mismatch": "A species' stated anchor disagrees with the constants of its own segments.",
  "nonphysical-cp": "A model gives a heat capacity that is negative or implausible somewhere in the span.",
  "high-pressure": "K is the ideal-gas, 1 bar constant; at this pressure non-ideal corrections may matter.",
  "below-boiling-point":
    "A species is used as a gas below its normal boiling point; at 1 atm it would be liquid or solid there, and the gas values describe a hypothetical ideal gas.",
  "condensed-phase-possible":
    "In the equilibrium a gas species sits below its normal boiling point, so a liquid or solid could form; a screen on the boiling point, not a dew-point calculation.",
  "equilibrium-not-converged":
    "The solver did not settle on an outlet composition at some temperatures; the numbers shown there are its last attempt, not an equilibrium. Check the feed, the key species and the reaction set.",
};

export function warningMeaning(code: string): string {
  return WARNING_MEANINGS[code] ?? "See the message for details.";
}
