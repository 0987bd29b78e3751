/**
 * A result's points as CSV, pure: the API's field names as headers and its numbers written in
 * full (shortest round-trip form), the equilibrium columns after them when the result has one.
 * Client-safe.
 */
import { toCsv } from "@/lib/csv";
import type { EvaluateResult } from "@/lib/thermo";
import { fromKelvin, TEMPERATURE_COLUMN, type DisplayUnit } from "./display-unit";
import { equilibriumCsvColumns } from "./equilibrium";

export const CSV_COLUMNS = ["tK", "dCpJ", "dHkJ", "dSJ", "dGkJ", "naiveDGkJ", "diffKJ", "lnK", "naiveLnK", "log10K", "naiveLog10K", "K", "exceedsTolerance"] as const;

/**
 * `unit` converts the temperature column only, renamed with its unit (`tDegC`, `tDegF`); every
 * other column keeps the API's name and number. K (`tK`) is the default.
 */
export function resultCsv(result: EvaluateResult, unit: DisplayUnit = "K"): string {
  // Uncertainty and equilibrium columns follow the points' own, only when the result has them.
  const extra = equilibriumCsvColumns(result);
  const rows = result.points.map((p, i) => [
    ...CSV_COLUMNS.map((c) => (c === "tK" ? Number(fromKelvin(p.tK, unit).toPrecision(15)) : (p as unknown as Record<string, string | number | boolean | null>)[c])),
    ...extra.map((col) => col.values[i] as string | number | boolean | null | undefined),
  ]);
  return toCsv([...CSV_COLUMNS.map((c) => (c === "tK" ? TEMPERATURE_COLUMN[unit] : c)), ...extra.map((c) => c.header)], rows);
}
