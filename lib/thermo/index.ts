/** Heatpath's computation engine. Pure: no I/O, no framework imports. */
export { ENGINE_VERSION, R, STANDARD_PRESSURE_PA, ATM_PA, MAX_POINTS, HIGH_PRESSURE_BAR } from "./constants";
export { EngineRefusal } from "./errors";
export { evaluate, SIGN_CASES, UNCERTAINTY_BASIS, type EvaluateResult, type EvaluatePoint, type SignCaseCode, type UncertaintySummary } from "./evaluate";
export { type EquilibriumPoint, type EquilibriumInfo, type Composition, type CompositionSigma } from "./equilibrium";
export { prMixture, prZPure, prPureParameters, type CriticalConstants, type PRMixtureResult } from "./eos";
export { type AdiabaticResult, type AdiabaticOutlet } from "./adiabatic";
export { type GasModel, type RealGasDiagnostics } from "./real-gas";
export { compareSources, type SourceVariant, type SourceComparison } from "./sources";
export { speciesProperties, type SpeciesRow, type EngineWarning } from "./species";
export { parseFormula, parseReaction, parseSpeciesKey, checkBalance, ATOMIC_WEIGHTS } from "./formula";
export { parseTemperatureGrid } from "./grid";
export { parseQuantity, parseTemperatureK, parseTemperatureDifferenceK, parseMolarEnergyKJ, parseMolarEntropyJ, parsePressureBar } from "./units";
export { fitCp, type FitResult } from "./fit";
export {
  evaluateRequestSchema,
  speciesSchema,
  segmentSchema,
  criticalSchema,
  GAS_MODELS,
  fitRequestSchema,
  CP_FORMS,
  type EvaluateRequest,
  type SpeciesInput,
  type SegmentInput,
  type FitRequest,
  type EquilibriumRequest,
} from "./schema";
