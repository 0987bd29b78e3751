/**
 * Temperatures as a case stores them: a number in kelvin, or a string with its unit
 * as entered ("25 degC", "77 degF"). Pure and client-safe; the conversions are those of
 * lib/thermo/scales.ts (the one source), and the engine parses the same strings with its own
 * unit parser.
 */
import { kelvinDifferenceFrom, kelvinDifferenceTo, kelvinFrom, kelvinTo, TEMPERATURE_SCALES, type TemperatureScale } from "@/lib/thermo/scales";

export const TEMPERATURE_UNITS = TEMPERATURE_SCALES;
export type TemperatureUnit = TemperatureScale;
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
  return s ? kelvinFrom(s.value, s.unit) : NaN;
}

/** A temperature difference in K (a step of 10 degC is 10 K). */
export function toKelvinDifference(q: Quantity): number {
  const s = splitQuantity(q);
  return s ? kelvinDifferenceFrom(s.value, s.unit) : NaN;
}

/** "480 K", "25 °C". */
export function formatQuantity(q: Quantity): string {
  const s = splitQuantity(q);
  if (!s) return String(q);
  return `${s.value} ${UNIT_LABELS[s.unit]}`;
}

/** A temperature in K shown in `unit`. */
export function fromKelvin(k: number, unit: TemperatureUnit): number {
  return kelvinTo(k, unit);
}

/** Rounded so that 300 K reads 26.85 °C, not 26.850000000000023. */
const tidy = (x: number) => Number(x.toPrecision(12));

/** An absolute temperature moved from one unit to another (300 K → 26.85 °C). */
export function convertTemperature(value: number, from: TemperatureUnit, to: TemperatureUnit): number {
  return from === to ? value : tidy(fromKelvin(toKelvin(joinQuantity(value, from)), to));
}

/** A temperature difference moved from one unit to another (a step of 10 K is 10 °C and 18 °F). */
export function convertDifference(value: number, from: TemperatureUnit, to: TemperatureUnit): number {
  if (from === to) return value;
  return tidy(kelvinDifferenceTo(kelvinDifferenceFrom(value, from), to));
}

/**
 * What a typed field reads after the unit switch: the same temperature (or difference) in the
 * new unit. Text that is not a number is left as typed for the form to flag.
 */
export function convertTyped(text: string, from: TemperatureUnit, to: TemperatureUnit, kind: "absolute" | "difference" = "absolute"): string {
  const t = text.trim();
  if (t === "" || from === to) return text;
  const n = Number(t);
  if (!Number.isFinite(n)) return text;
  return String(kind === "absolute" ? convertTemperature(n, from, to) : convertDifference(n, from, to));
}

/** A list of typed temperatures ("300, 400 500") converted entry by entry, keeping the separators. */
export function convertTypedList(text: string, from: TemperatureUnit, to: TemperatureUnit): string {
  return text.replace(/[^\s,;]+/g, (entry) => convertTyped(entry, from, to));
}
