/**
 * Temperatures as a case stores them: a number in kelvin, or a string with its unit
 * as entered ("25 degC", "77 degF"). Pure and client-safe; the engine parses the same
 * strings with its own unit parser.
 */
export const TEMPERATURE_UNITS = ["K", "degC", "degF"] as const;
export type TemperatureUnit = (typeof TEMPERATURE_UNITS)[number];
export const UNIT_LABELS: Record<TemperatureUnit, string> = { K: "K", degC: "°C", degF: "°F" };

export type Quantity = number | string;

const PATTERN = /^\s*(-?(?:\d+(?:\.\d*)?|\.\d+)(?:e[-+]?\d+)?)\s*(K|degC|degF)?\s*$/i;

/** Split a stored quantity into its number and unit; null when it is not one. */
export function splitQuantity(q: Quantity): { value: number; unit: TemperatureUnit } | null {
  if (typeof q === "number") return Number.isFinite(q) ? { value: q, unit: "K" } : null;
  const m = PATTERN.exec(q);
  if (!m) return null;
  const unit = (TEMPERATURE_UNITS.find((u) => u.toLowerCase() === (m[2] ?? "K").toLowerCase()) ?? "K") as TemperatureUnit;
  return { value: Number(m[1]), unit };
}

/** Store a number in the unit the user chose: kelvin as a plain number, others as "x degC". */
export function joinQuantity(value: number, unit: TemperatureUnit): Quantity {
  return unit === "K" ? value : `${value} ${unit}`;
}

/** An absolute temperature in K. */
export function toKelvin(q: Quantity): number {
  const s = splitQuantity(q);
  if (!s) return NaN;
  if (s.unit === "degC") return s.value + 273.15;
  if (s.unit === "degF") return ((s.value - 32) * 5) / 9 + 273.15;
  return s.value;
}

/** A temperature difference in K (a step of 10 degC is 10 K). */
export function toKelvinDifference(q: Quantity): number {
  const s = splitQuantity(q);
  if (!s) return NaN;
  return s.unit === "degF" ? (s.value * 5) / 9 : s.value;
}

/** "480 K", "25 °C". */
export function formatQuantity(q: Quantity): string {
  const s = splitQuantity(q);
  if (!s) return String(q);
  return `${s.value} ${UNIT_LABELS[s.unit]}`;
}
