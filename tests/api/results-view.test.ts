/**
 * GET /api/v1/cases/:id/results?format=columns with `points` (the drawing sample) and
 * `offset`/`limit` (one page of the numbers table): every number is the very same double as
 * the row format's at the same index, and the parameters are refused outside format=columns.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import * as resultsRoute from "@/app/api/v1/cases/[id]/results/route";
import type { PageInfo, ResultsView, SampleInfo } from "@/lib/cases/results-view";
import { closeDb } from "@/lib/db";
import { createCase, submitCase, type ResultsDto } from "@/lib/services/cases";
import type { EvaluatePoint } from "@/lib/thermo";
import type { PointColumns } from "@/lib/thermo/columns";
import { caseInputSchema } from "@/lib/validation/cases";
import { signInAs } from "../helpers/actors";
import { shiftCase } from "../helpers/cases";
import { freshDatabase } from "../helpers/db";
import { ensureReferenceLibrary, type RefFormula } from "../helpers/reference-library";
import { bodyOf, ctx, jsonRequest } from "../helpers/request";

let pins: Record<RefFormula, number>;
let draftId: number;
let rows: ResultsDto;

beforeAll(async () => {
  await freshDatabase();
  pins = await ensureReferenceLibrary();
  const erin = await signInAs("engineer");
  // 4001 temperatures: more than the page's 1200-point drawing sample.
  draftId = (await createCase(erin, caseInputSchema.parse(shiftCase(pins, { temperatures: { fromK: 300, toK: 1300, stepK: 0.25 } })))).id;
  rows = (await results(draftId)).body as ResultsDto;
});
afterAll(() => closeDb());

async function results(id: number, query = ""): Promise<{ status: number; body: unknown }> {
  const r = await resultsRoute.GET(jsonRequest("GET", `/api/v1/cases/${id}/results${query}`), ctx({ id: String(id) }) as { params: Promise<{ id: string }> });
  return { status: r.status, body: await bodyOf(r) };
}
type Answer = Omit<ResultsDto, "result"> & { result: ResultsView };
const view = async (id: number, query: string) => {
  const r = await results(id, query);
  expect(r.status, query).toBe(200);
  return r.body as Answer;
};

/** Column entry j is the very same double (Object.is) as the row point at indices[j], field by field. */
function expectColumnsAt(columns: Partial<PointColumns>, points: EvaluatePoint[], indices: number[]) {
  expect(Object.keys(columns)).toEqual(Object.keys(points[0]));
  for (const [key, column] of Object.entries(columns) as [keyof EvaluatePoint, unknown[]][]) {
    expect(column, key).toHaveLength(indices.length);
    indices.forEach((i, j) => expect(Object.is(column[j], points[i][key] ?? null), `${key}[${j}] = point ${i}`).toBe(true));
  }
}
const indexOfT = (points: EvaluatePoint[]) => {
  const at = new Map(points.map((p, i) => [p.tK, i]));
  return (tK: number) => at.get(tK)!;
};

describe("points: the drawing sample", () => {
  it("a 4001-point draft drawn with at most 1200 points: ends, global extremes, the same numbers as the rows at the same indices", async () => {
    const p = rows.result.points;
    expect(p).toHaveLength(4001);
    const a = await view(draftId, "?format=columns&points=1200");
    const r = a.result;
    const sample = r.sample as SampleInfo;
    const tK = r.columns!.tK as number[];
    expect(sample.total).toBe(4001);
    expect(sample.points).toBe(tK.length);
    expect(tK.length).toBeLessThanOrEqual(1200);
    // The rule's floor (11 charted keys plus 4 species shares: 30 per bucket, 39 buckets) is filled up towards the limit.
    expect(tK.length).toBeGreaterThan(600);
    const indices = tK.map(indexOfT(p));
    expect(indices[0]).toBe(0);
    expect(indices[indices.length - 1]).toBe(4000);
    expect(indices).toEqual([...indices].sort((x, y) => x - y));
    expectColumnsAt(r.columns!, p, indices);
    for (const key of ["dGkJ", "diffKJ", "lnK", "dHkJ", "dSJ"] as const) {
      const values = p.map((q) => q[key]);
      expect(indices, `max ${key}`).toContain(values.indexOf(Math.max(...values)));
      expect(indices, `min ${key}`).toContain(values.indexOf(Math.min(...values)));
    }
    // The species' shares are sampled at the same indices.
    for (const [species, full] of Object.entries(rows.result.contributions!)) {
      expect(r.contributions![species], species).toEqual(indices.map((i) => full[i]));
    }
    for (const [species, full] of Object.entries(rows.result.contributionsSigma ?? {})) {
      expect(r.contributionsSigma![species], species).toEqual(indices.map((i) => full[i]));
    }
    // Everything else is the row answer's.
    const { points: _p, contributions: _c, contributionsSigma: _cs, ...rest } = rows.result;
    const { columns: _k, contributions: _d, contributionsSigma: _ds, sample: _s, ...viewRest } = r;
    expect(viewRest).toEqual(rest);
    expect(r).not.toHaveProperty("page");
    const { result: _a, ...dto } = rows;
    const { result: _b, ...viewDto } = a;
    expect(viewDto).toEqual(dto);
  });

  it("a grid that fits is sent whole, and a frozen snapshot is sampled the same way", async () => {
    const erin = await signInAs("engineer");
    const small = await createCase(erin, caseInputSchema.parse(shiftCase(pins)));
    const whole = await view(small.id, "?format=columns&points=5000");
    const smallRows = (await results(small.id)).body as ResultsDto;
    expect(whole.result.sample).toEqual({ total: 12, points: 12 });
    expectColumnsAt(
      whole.result.columns!,
      smallRows.result.points,
      smallRows.result.points.map((_, i) => i),
    );

    const big = await createCase(erin, caseInputSchema.parse(shiftCase(pins, { temperatures: { fromK: 400, toK: 900, stepK: 0.5 } })));
    await submitCase(erin, big.id, 0);
    const snapRows = (await results(big.id, "?revision=1")).body as ResultsDto;
    const snap = await view(big.id, "?revision=1&format=columns&points=300");
    expect(snap.source).toBe("snapshot");
    expect(snap.hash).toBe(snapRows.hash);
    const tK = snap.result.columns!.tK as number[];
    expect(tK.length).toBeLessThanOrEqual(300);
    expect(snap.result.sample).toEqual({ total: 1001, points: tK.length });
    expectColumnsAt(snap.result.columns!, snapRows.result.points, tK.map(indexOfT(snapRows.result.points)));
  });
});

describe("offset and limit: one page of the numbers table", () => {
  it("exact rows of the page, with the sample or on their own (then no other per-temperature series)", async () => {
    const p = rows.result.points;
    const range = (from: number, to: number) => Array.from({ length: to - from }, (_, j) => from + j);
    const first = await view(draftId, "?format=columns&points=1200&offset=0&limit=50");
    expect(first.result.sample?.total).toBe(4001);
    const page = first.result.page as PageInfo;
    expect(page).toMatchObject({ offset: 0, limit: 50, total: 4001 });
    expectColumnsAt(page.columns, p, range(0, 50));

    const turn = await view(draftId, "?format=columns&offset=50&limit=50");
    expectColumnsAt(turn.result.page!.columns, p, range(50, 100));
    for (const key of ["columns", "contributions", "contributionsSigma", "equilibrium", "sample", "points"]) expect(turn.result, key).not.toHaveProperty(key);
    expect(turn.result.reference).toEqual(rows.result.reference);
    expect(turn.result.warnings).toEqual(rows.result.warnings);

    const last = await view(draftId, "?format=columns&offset=3950&limit=1000");
    expect(last.result.page).toMatchObject({ offset: 3950, limit: 1000, total: 4001 });
    expectColumnsAt(last.result.page!.columns, p, range(3950, 4001));

    const beyond = await view(draftId, "?format=columns&offset=5000&limit=10");
    expect(beyond.result.page!.total).toBe(4001);
    for (const column of Object.values(beyond.result.page!.columns)) expect(column).toEqual([]);
    expect(Object.keys(beyond.result.page!.columns)).toEqual(Object.keys(p[0]));
  });
});

describe("refusals", () => {
  it("points, offset and limit only with format=columns, in range, whole, offset and limit together: 422 naming the field", async () => {
    const cases: [string, string][] = [
      ["?points=1200", "points"],
      ["?format=rows&points=1200", "points"],
      ["?offset=0&limit=50", "offset"],
      ["?format=rows&offset=0&limit=50", "limit"],
      ["?format=columns&offset=0", "limit"],
      ["?format=columns&limit=50", "offset"],
      ["?format=columns&points=1", "points"],
      ["?format=columns&points=5001", "points"],
      ["?format=columns&points=12.5", "points"],
      ["?format=columns&points=many", "points"],
      ["?format=columns&points=", "points"],
      ["?format=columns&offset=-1&limit=10", "offset"],
      ["?format=columns&offset=0&limit=0", "limit"],
      ["?format=columns&offset=0&limit=1001", "limit"],
      ["?format=columns&pionts=10", "pionts"],
    ];
    for (const [query, field] of cases) {
      const r = await results(draftId, query);
      expect(r.status, query).toBe(422);
      const error = (r.body as { error: { code: string; message: string; details?: { fields?: Record<string, string> } } }).error;
      expect(error.code, query).toBe("invalid-request");
      expect(`${Object.keys(error.details?.fields ?? {}).join(" ")} ${error.message}`, query).toContain(field);
    }
    const r = (await results(draftId, "?points=1200")).body as { error: { message: string } };
    expect(r.error.message).toContain("points is only read with format=columns");
  });

  it("without the new parameters the answer is unchanged", async () => {
    expect((await results(draftId)).body).toEqual(rows);
    expect((await results(draftId, "?format=rows")).body).toEqual(rows);
  });
});
