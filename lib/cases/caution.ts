/**
 * The caution in plain text, for mails and anywhere the component (components/results/caution.tsx)
 * cannot go. Keep the two in the same words.
 */
export const CAUTION_TEXT =
  "Screening estimates for ideal standard states (1 bar, ideal-gas activities, pure condensed phases). " +
  "Decisions that affect safety follow the organisation's process-safety review, the applicable codes and licensed engineering judgement.";

/** The equilibrium panel's extra line: what the outlet is and is not. */
export const EQUILIBRIUM_CAUTION_TEXT =
  "The outlet is a thermodynamic limit: kinetics, catalyst activity, the approach to equilibrium and non-ideal gas behaviour at high pressure decide the real outlet. " +
  "Carbon formation is judged only if a carbon-forming reaction is in the set.";
