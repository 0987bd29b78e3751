/**
 * The columnar form of an evaluation's answer: the per-temperature points as one
 * array per field (`columns.tK[i]`, `columns.dGkJ[i]`, …) instead of one object per
 * temperature. The numbers are the same values, not recomputed; everything else
 * in the answer is unchanged. Pure: no I/O.
 */
import { z } from "zod";
import type { EvaluatePoint, EvaluateResult } from "./evaluate";

export type PointColumns = { [K in keyof EvaluatePoint]-?: Array<EvaluatePoint[K] | null> };
export type ColumnarResult = Omit<EvaluateResult, "points"> & { columns: Partial<PointColumns> };

/** `?format=rows` (the default, the documented contract) or `?format=columns`. */
export const resultFormatSchema = z.enum(["rows", "columns"]);
export type ResultFormat = z.infer<typeof resultFormatSchema>;

/** Every field any point carries, in the points' field order (the order of the columns). */
export function pointKeys(points: readonly EvaluatePoint[]): (keyof EvaluatePoint)[] {
  const keys: (keyof EvaluatePoint)[] = [];
  const seen = new Set<string>();
  for (const p of points) {
    for (const k of Object.keys(p) as (keyof EvaluatePoint)[]) {
      if (!seen.has(k)) {
        seen.add(k);
        keys.push(k);
      }
    }
  }
  return keys;
}

/**
 * One array per field that any point carries, in the points' field order. An
 * optional field a point lacks (the uncertainty fields when no species has an
 * uncertainty) is `null` at that index, so every column has `points.length` entries.
 */
export function pointsToColumns(points: readonly EvaluatePoint[]): Partial<PointColumns> {
  const keys = pointKeys(points);
  const columns: Record<string, unknown[]> = {};
  for (const k of keys) {
    const column = new Array<unknown>(points.length);
    for (let i = 0; i < points.length; i++) column[i] = points[i][k] ?? null;
    columns[k] = column;
  }
  return columns as Partial<PointColumns>;
}

/** The inverse, for clients and tests: columns back to the row format. Missing (null) optional fields are left out. */
export function columnsToPoints(columns: Partial<PointColumns>): EvaluatePoint[] {
  const keys = Object.keys(columns) as (keyof EvaluatePoint)[];
  const n = keys.length ? (columns[keys[0]] as unknown[]).length : 0;
  const points: EvaluatePoint[] = [];
  for (let i = 0; i < n; i++) {
    const p: Record<string, unknown> = {};
    for (const k of keys) {
      const v = (columns[k] as unknown[])[i];
      // K is the one row field that is null by contract (beyond double range); keep it.
      if (v !== null || k === "K") p[k] = v;
    }
    points.push(p as unknown as EvaluatePoint);
  }
  return points;
}

/** The answer with `points` replaced by `columns`; key order otherwise kept. */
export function toColumnar(result: EvaluateResult): ColumnarResult {
  const out: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(result)) {
    if (k === "points") out.columns = pointsToColumns(v as EvaluatePoint[]);
    else out[k] = v;
  }
  return out as ColumnarResult;
}

/** Rows unless columns were asked for. */
export function inFormat(result: EvaluateResult, format: ResultFormat | undefined): EvaluateResult | ColumnarResult {
  return format === "columns" ? toColumnar(result) : result;
}
