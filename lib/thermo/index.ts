/** Heatpath's computation engine. Pure: no I/O, no framework imports. */
export { ENGINE_VERSION, R } from "./constants";
export { EngineRefusal } from "./errors";
export { evaluate, type EvaluateResult, type EvaluatePoint } from "./evaluate";

export { compareSources, type SourceVariant, type SourceComparison } from "./sources";
export { speciesProperties, type EngineWarning } from "./species";
export { parseFormula, parseReaction, parseSpeciesKey } from "./formula";

export { parseTemperatureK, parseTemperatureDifferenceK, parseMolarEnergyKJ } from "./units";
export { fitCp, type FitResult } from "./fit";
export { speciesSchema, type EvaluateRequest, type SpeciesInput, type SegmentInput } from "./schema";
