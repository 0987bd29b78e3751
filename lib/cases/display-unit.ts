/**
 * Temperatures shown in the unit the reader chose (K, °C, °F). The API and the engine stay in
 * kelvin; only labels, axes, tables and the CSV export convert. Pure and client-safe.
 */
import { kelvinDifferenceTo, kelvinTo } from "@/lib/thermo/scales";
import { splitQuantity, TEMPERATURE_UNITS, UNIT_LABELS, type Quantity, type TemperatureUnit } from "./temperature";

export { TEMPERATURE_UNITS as DISPLAY_UNITS, UNIT_LABELS };
export type DisplayUnit = TemperatureUnit;

export function isDisplayUnit(u: unknown): u is DisplayUnit {
  return typeof u === "string" && (TEMPERATURE_UNITS as readonly string[]).includes(u);
}

/** An absolute temperature in kelvin → the display unit. */
export function fromKelvin(tK: number, unit: DisplayUnit): number {
  return kelvinTo(tK, unit);
}

/** A temperature difference in kelvin → the display unit (1 K = 1 °C = 1.8 °F). */
export function differenceFromKelvin(dK: number, unit: DisplayUnit): number {
  return kelvinDifferenceTo(dK, unit);
}

/** The unit a case was entered in: that of its first temperature (K when it has none). */
export function enteredUnit(temperatures: { fromK: Quantity } | { listK: Quantity[] } | undefined): DisplayUnit {
  const q = temperatures ? ("fromK" in temperatures ? temperatures.fromK : temperatures.listK[0]) : undefined;
  return q === undefined ? "K" : (splitQuantity(q)?.unit ?? "K");
}

/**
 * A temperature for reading, to 0.1 of the unit ("1096.6 K", "823.4 °C"). Conversion from K
 * leaves float noise (673.15 − 273.15 = 399.99999999999994), so round before printing.
 */
export function formatTemperature(tK: number | null | undefined, unit: DisplayUnit, digits = 1): string {
  if (tK === null || tK === undefined || !Number.isFinite(tK)) return "—";
  const v = fromKelvin(tK, unit);
  const s = v.toFixed(digits);
  return `${s.startsWith("-") ? `−${s.slice(1)}` : s} ${UNIT_LABELS[unit]}`;
}

/** A grid temperature in a table cell: the shortest form that keeps what was entered (400, 402.5, 298.15). */
export function gridValue(tK: number, unit: DisplayUnit): string {
  const v = Number(fromKelvin(tK, unit).toFixed(6));
  const s = String(v);
  return s.startsWith("-") ? `−${s.slice(1)}` : s;
}

/** CSV and axis names: `tK`, `tDegC`, `tDegF`. */
export const TEMPERATURE_COLUMN: Record<DisplayUnit, string> = { K: "tK", degC: "tDegC", degF: "tDegF" };

/**
 * Round tick values for an axis from lo to hi (display unit): steps of 1, 2, 2.5 or 5 × 10ⁿ,
 * about `target` of them, so a span of 400–900 °C reads 400, 500, … and never 673.1.
 */
export function niceTicks(lo: number, hi: number, target = 6): number[] {
  if (!Number.isFinite(lo) || !Number.isFinite(hi)) return [];
  if (hi < lo) [lo, hi] = [hi, lo];
  if (hi - lo < 1e-9) return [Number(lo.toPrecision(12))];
  const raw = (hi - lo) / Math.max(1, target - 1);
  const mag = 10 ** Math.floor(Math.log10(raw));
  // A relative slack, so float noise from a unit conversion (500.0000000000001) keeps the step at 100.
  const step = [1, 2, 2.5, 5, 10].map((m) => m * mag).find((s) => s >= raw * (1 - 1e-9)) ?? 10 * mag;
  const out: number[] = [];
  const first = Math.ceil(lo / step - 1e-9) * step;
  for (let v = first; v <= hi + step * 1e-9; v += step) out.push(Number(v.toPrecision(12)));
  return out;
}
