/**
 * What the case results route answers for its query: the documented row format, the columnar
 * format, and with `format=columns` the drawing sample (`points`) and one page of the numbers
 * table (`offset`, `limit`). Pure and client-safe: it reshapes a computed result and computes
 * nothing new; every number is the very same double as in the row format.
 */
import type { EvaluatePoint, EvaluateResult } from "@/lib/thermo/evaluate";
import { pointKeys, toColumnar, type ColumnarResult, type PointColumns, type ResultFormat } from "@/lib/thermo/columns";
import { sampleIndices } from "./downsample";

export type ResultsQuery = { format?: ResultFormat; points?: number; offset?: number; limit?: number };

/** `result.sample`: the columns are `points` of the case's `total` temperatures, kept for drawing. */
export type SampleInfo = { total: number; points: number };
/** `result.page`: exactly the rows `offset` … `offset + limit − 1` (fewer at the end), as columns. */
export type PageInfo = { offset: number; limit: number; total: number; columns: Partial<PointColumns> };

/**
 * The columnar answer of the case results route. With `points`, `columns`, `contributions` and
 * `contributionsSigma` hold the drawing sample; with `offset`/`limit` alone they (and
 * `equilibrium`) are left out and only the page carries per-temperature numbers.
 */
export type ResultsView = Omit<ColumnarResult, "columns"> & { columns?: Partial<PointColumns>; sample?: SampleInfo; page?: PageInfo };

/** The point fields the case page draws: the extremes of each survive the sampling. */
export const CHARTED_KEYS = ["dGkJ", "naiveDGkJ", "diffKJ", "log10K", "naiveLog10K", "lnK", "naiveLnK", "dHkJ", "dSJ", "exceedsTolerance", "sigmaDGkJ"] as const;

/** The columns of the points at `indices` (a missing optional field is null, as in `pointsToColumns`). */
function columnsAt(points: readonly EvaluatePoint[], keys: readonly (keyof EvaluatePoint)[], indices: readonly number[]): Partial<PointColumns> {
  const columns: Record<string, unknown[]> = {};
  for (const k of keys) {
    const column = new Array<unknown>(indices.length);
    for (let j = 0; j < indices.length; j++) column[j] = points[indices[j]][k] ?? null;
    columns[k] = column;
  }
  return columns as Partial<PointColumns>;
}

const pick = (table: Record<string, number[]>, indices: readonly number[]) => Object.fromEntries(Object.entries(table).map(([k, v]) => [k, indices.map((i) => v[i])]));

/** Which points to draw: the charted point fields and each species' share of the gap and of the 1σ band. */
function drawingIndices(result: EvaluateResult, maxPoints: number): number[] {
  const p = result.points;
  const series: ArrayLike<unknown>[] = [];
  for (const key of CHARTED_KEYS) {
    if (p.some((q) => key in q)) series.push(p.map((q) => q[key]));
  }
  for (const table of [result.contributions, result.contributionsSigma]) if (table) series.push(...Object.values(table));
  return sampleIndices(p.length, series, maxPoints);
}

/**
 * The result in the asked format. Without `format=columns` it is returned as it is (the route's
 * schema refuses `points`, `offset` and `limit` there). Key order of the answer is kept.
 */
export function resultInView(result: EvaluateResult, query: ResultsQuery): EvaluateResult | ResultsView {
  if (query.format !== "columns") return result;
  const { points: maxPoints, offset, limit } = query;
  const paged = offset !== undefined && limit !== undefined;
  if (maxPoints === undefined && !paged) return toColumnar(result);
  const p = result.points;
  const keys = pointKeys(p);
  const sample = maxPoints === undefined ? null : drawingIndices(result, maxPoints);
  const out: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(result)) {
    if (k === "points") {
      if (sample) out.columns = columnsAt(p, keys, sample);
    } else if (k === "contributions" || k === "contributionsSigma") {
      if (sample) out[k] = pick(v as Record<string, number[]>, sample);
    } else if (k === "equilibrium") {
      // The equilibrium panel's table and counts cover every temperature (its charts thin on their own).
      if (sample) out[k] = v;
    } else out[k] = v;
  }
  if (sample) out.sample = { total: p.length, points: sample.length } satisfies SampleInfo;
  if (paged) {
    const end = Math.min(p.length, offset + limit);
    const rows = Array.from({ length: Math.max(0, end - offset) }, (_, j) => offset + j);
    out.page = { offset, limit, total: p.length, columns: columnsAt(p, keys, rows) } satisfies PageInfo;
  }
  return out as ResultsView;
}
