/**
 * Temperature scales, the thermochemical calorie and the wording of the "above 0 K" rule:
 * the one source for the engine, the case forms and the dataset reader. Pure and
 * client-safe (no mathjs): lib/thermo/units.ts parses quantities with units on top of it.
 */

/** The thermochemical calorie, J (common practice: 1 cal = 4.184 J exactly). */
export const CALORIE_J = 4.184;
/** 0 °C in K. */
export const ZERO_CELSIUS_K = 273.15;

export const TEMPERATURE_SCALES = ["K", "degC", "degF"] as const;
export type TemperatureScale = (typeof TEMPERATURE_SCALES)[number];

/** An absolute temperature in K from a value on `scale`. */
export function kelvinFrom(value: number, scale: TemperatureScale): number {
  if (scale === "degC") return value + ZERO_CELSIUS_K;
  if (scale === "degF") return ((value - 32) * 5) / 9 + ZERO_CELSIUS_K;
  return value;
}

/** An absolute temperature in K shown on `scale`. */
export function kelvinTo(k: number, scale: TemperatureScale): number {
  if (scale === "degC") return k - ZERO_CELSIUS_K;
  if (scale === "degF") return ((k - ZERO_CELSIUS_K) * 9) / 5 + 32;
  return k;
}

/** A temperature difference in K from a difference on `scale` (10 degC is 10 K, 18 degF is 10 K). */
export function kelvinDifferenceFrom(value: number, scale: TemperatureScale): number {
  return scale === "degF" ? (value * 5) / 9 : value;
}

/** A temperature difference in K shown on `scale` (1 K = 1 °C = 1.8 °F). */
export function kelvinDifferenceTo(k: number, scale: TemperatureScale): number {
  return scale === "degF" ? k * 1.8 : k;
}

/** Cp in J/(mol·K) from kJ/(mol·K) or cal/(mol·K). */
export function joulesPerMolKFrom(value: number, unit: "J/(mol*K)" | "kJ/(mol*K)" | "cal/(mol*K)"): number {
  if (unit === "kJ/(mol*K)") return value * 1000;
  if (unit === "cal/(mol*K)") return value * CALORIE_J;
  return value;
}

/** The one rule for an absolute temperature: strictly above 0 K (NaN is not). */
export function isAboveZeroK(tK: number): boolean {
  return tK > 0;
}

/** The engine's wording of the rule, after a field name: `referenceK: temperatures must be above 0 K (got -5 K)`. */
export const ABOVE_ZERO_K = "temperatures must be above 0 K";
/** The forms' wording of the rule, as a sentence; with the value (K) it says what was entered: "… above 0 K (this is -26.85 K)." */
export function aboveZeroKSentence(tK?: number): string {
  return tK === undefined ? "Temperatures must be above 0 K." : `Temperatures must be above 0 K (this is ${Number(tK.toFixed(6))} K).`;
}
