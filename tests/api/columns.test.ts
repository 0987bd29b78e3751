import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import * as evaluateRoute from "@/app/api/v1/evaluate/route";
import * as resultsRoute from "@/app/api/v1/cases/[id]/results/route";
import { closeDb, db } from "@/lib/db";
import { createCase, submitCase, type ResultsDto } from "@/lib/services/cases";
import type { EvaluatePoint, EvaluateResult } from "@/lib/thermo";
import { columnsToPoints, pointsToColumns, type ColumnarResult } from "@/lib/thermo/columns";
import { caseInputSchema } from "@/lib/validation/cases";
import { signInAs } from "../helpers/actors";
import { shiftCase } from "../helpers/cases";
import { freshDatabase } from "../helpers/db";
import { ensureReferenceLibrary, type RefFormula } from "../helpers/reference-library";
import { bodyOf, ctx, jsonRequest } from "../helpers/request";

let pins: Record<RefFormula, number>;

beforeAll(async () => {
  await freshDatabase();
  pins = await ensureReferenceLibrary();
});
afterAll(() => closeDb());

const caseCtx = (id: number) => ctx({ id: String(id) }) as { params: Promise<{ id: string }> };

async function results(id: number, query = ""): Promise<{ status: number; body: unknown }> {
  const r = await resultsRoute.GET(jsonRequest("GET", `/api/v1/cases/${id}/results${query}`), caseCtx(id));
  return { status: r.status, body: await bodyOf(r) };
}

/** Every column entry is the very same double (Object.is) as the row's field; the rest of the answer is equal. */
function expectSameAnswer(rows: EvaluateResult, columnar: ColumnarResult) {
  expect(columnar).not.toHaveProperty("points");
  const { points, ...rest } = rows;
  const { columns, ...columnarRest } = columnar;
  expect(columnarRest).toEqual(rest);
  expect(Object.keys(columns)).toEqual(Object.keys(points[0]));
  for (const [key, column] of Object.entries(columns) as [keyof EvaluatePoint, unknown[]][]) {
    expect(column).toHaveLength(points.length);
    points.forEach((p, i) => expect(Object.is(column[i], p[key])).toBe(true));
  }
  expect(columnsToPoints(columns)).toEqual(points);
}

describe("format=columns", () => {
  it("POST /api/v1/evaluate answers the same numbers in columns as in rows (1001-point shift reaction)", async () => {
    const erin = await signInAs("engineer");
    const c = await createCase(erin, caseInputSchema.parse(shiftCase(pins, { temperatures: { fromK: 300, toK: 1300, stepK: 1 } })));
    const { request } = (await results(c.id)).body as ResultsDto;
    const post = (query: string) => evaluateRoute.POST(jsonRequest("POST", `/api/v1/evaluate${query}`, request), ctx());
    const rows = (await bodyOf(await post(""))) as EvaluateResult;
    const explicitRows = (await bodyOf(await post("?format=rows"))) as EvaluateResult;
    const columnsResponse = await post("?format=columns");
    expect(columnsResponse.status).toBe(200);
    const columnar = (await bodyOf(columnsResponse)) as ColumnarResult;
    expect(rows.points).toHaveLength(1001);
    expect(explicitRows).toEqual(rows);
    expectSameAnswer(rows, columnar);
    // The point of the format: the answer is much smaller.
    expect(JSON.stringify(columnar).length).toBeLessThan(0.75 * JSON.stringify(rows).length);
  });

  it("the case results route: a live draft and a frozen snapshot, with and without a revision", async () => {
    const erin = await signInAs("engineer");
    const c = await createCase(erin, caseInputSchema.parse(shiftCase(pins)));
    const liveRows = (await results(c.id)).body as ResultsDto;
    const liveColumns = (await results(c.id, "?format=columns")).body as Omit<ResultsDto, "result"> & { result: ColumnarResult };
    expect(liveRows.source).toBe("live");
    const { result: a, ...liveRest } = liveRows;
    const { result: b, ...liveColumnsRest } = liveColumns;
    expect(liveColumnsRest).toEqual(liveRest);
    expectSameAnswer(a, b);

    await submitCase(erin, c.id, 0);
    for (const query of ["", "?revision=1"]) {
      const snapRows = (await results(c.id, query)).body as ResultsDto;
      const snapColumns = (await results(c.id, `${query ? `${query}&` : "?"}format=columns`)).body as ResultsDto & { result: ColumnarResult };
      expect(snapRows.source).toBe("snapshot");
      expect(snapColumns.hash).toBe(snapRows.hash);
      expectSameAnswer(snapRows.result, snapColumns.result);
    }
  });

  it("refuses an unknown format or query parameter with 422, never ignoring it", async () => {
    const erin = await signInAs("engineer");
    const c = await createCase(erin, caseInputSchema.parse(shiftCase(pins)));
    for (const query of ["?format=csv", "?format=Columns", "?fromat=columns", "?revision=1&extra=1"]) {
      const r = await results(c.id, query);
      expect(r.status, query).toBe(422);
      expect(r.body).toMatchObject({ error: { code: "invalid-request" } });
    }
    const r = await evaluateRoute.POST(jsonRequest("POST", "/api/v1/evaluate?format=table", {}), ctx());
    expect(r.status).toBe(422);
  });

  it("pointsToColumns: optional fields a point lacks are null, and come back out as missing (synthetic, invented for this test)", () => {
    const base = { tK: 300, dCpJ: 1, dHkJ: 2, dSJ: 3, dGkJ: 4, lnK: 5, log10K: 6, K: null, naiveDGkJ: 7, naiveLnK: 8, naiveLog10K: 9, diffKJ: 10, exceedsTolerance: false };
    const points: EvaluatePoint[] = [base, { ...base, tK: 310, K: 2.5, sigmaDGkJ: 0.1 }];
    const columns = pointsToColumns(points);
    expect(columns.K).toEqual([null, 2.5]);
    expect(columns.sigmaDGkJ).toEqual([null, 0.1]);
    expect(columnsToPoints(columns)).toEqual(points);
    expect(pointsToColumns([])).toEqual({});
  });
});

describe("GET /api/v1/health?deep=1", () => {
  const deep = async () => {
    const { GET } = await import("@/app/api/v1/health/route");
    const r = await GET(jsonRequest("GET", "/api/v1/health?deep=1"), ctx());
    return { status: r.status, body: (await bodyOf(r)) as { status: string; database: { ok: boolean }; mailQueue: { ok: boolean; due: number; oldestDueSeconds: number } } };
  };

  it("ok with a reachable database and no mail waiting past the limit", async () => {
    await db().query("UPDATE mail_messages SET status = 'sent'");
    const r = await deep();
    expect(r.status).toBe(200);
    expect(r.body).toMatchObject({ status: "ok", database: { ok: true }, mailQueue: { ok: true, due: 0, oldestDueSeconds: 0 } });
  });

  it("degraded (still 200) when due mail has waited longer than the limit: no worker is claiming", async () => {
    const { models } = await import("@/lib/db");
    const old = new Date(Date.now() - 3_600_000);
    await models().MailMessage.create({
      teamId: null,
      kind: "invitation",
      recipients: ["stuck@example.test"],
      subject: "s",
      body: "b",
      nextAttemptAt: old,
      claimToken: null,
      claimedAt: null,
      sentAt: null,
      lastError: null,
    });
    const r = await deep();
    expect(r.status).toBe(200);
    expect(r.body.status).toBe("degraded");
    expect(r.body.mailQueue.ok).toBe(false);
    expect(r.body.mailQueue.due).toBe(1);
    expect(r.body.mailQueue.oldestDueSeconds).toBeGreaterThanOrEqual(3599);
  });

  it("refuses a misspelt or unknown query parameter with 422 (strict, like every request)", async () => {
    const { GET } = await import("@/app/api/v1/health/route");
    for (const query of ["deep=yes", "deep=true", "verbose=1", "deep=1&x=1"]) {
      const r = await GET(jsonRequest("GET", `/api/v1/health?${query}`), ctx());
      expect(r.status, query).toBe(422);
      expect(await bodyOf(r)).toMatchObject({ error: { code: "invalid-request" } });
    }
  });

  it("503 unavailable when the database does not answer, without saying why", async () => {
    const spy = vi.spyOn(db(), "query").mockRejectedValue(new Error("connect ECONNREFUSED 10.0.0.5:5432 password=secret"));
    try {
      const r = await deep();
      expect(r.status).toBe(503);
      expect(r.body).toMatchObject({ status: "unavailable", database: { ok: false }, mailQueue: { ok: false } });
      expect(JSON.stringify(r.body)).not.toMatch(/ECONNREFUSED|secret/);
    } finally {
      spy.mockRestore();
    }
  });
});
