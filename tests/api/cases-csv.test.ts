import Papa from "papaparse";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import * as exportRoute from "@/app/api/v1/cases/[id]/export/route";
import * as resultsRoute from "@/app/api/v1/cases/[id]/results/route";
import { closeDb } from "@/lib/db";
import { CSV_COLUMNS } from "@/lib/cases/result-csv";
import { createCase, submitCase, type ResultsDto } from "@/lib/services/cases";
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

async function both(id: number, query = "") {
  const results = (await bodyOf(
    await resultsRoute.GET(jsonRequest("GET", `/api/v1/cases/${id}/results${query}`), ctx({ id: String(id) }) as { params: Promise<{ id: string }> }),
  )) as ResultsDto;
  const response = await exportRoute.GET(jsonRequest("GET", `/api/v1/cases/${id}/export${query}`), ctx({ id: String(id) }) as { params: Promise<{ id: string }> });
  expect(response.status).toBe(200);
  expect(response.headers.get("content-type")).toMatch(/^text\/csv/);
  return { results, csv: await response.text(), disposition: response.headers.get("content-disposition") };
}

function expectSameNumbers(results: ResultsDto, csv: string) {
  const parsed = Papa.parse<string[]>(csv.trim(), { skipEmptyLines: true });
  const [header, ...rows] = parsed.data;
  expect(header).toEqual([...CSV_COLUMNS]);
  expect(rows).toHaveLength(results.result.points.length);
  rows.forEach((row, i) => {
    const p = results.result.points[i] as unknown as Record<string, number | boolean | null>;
    CSV_COLUMNS.forEach((c, j) => {
      const api = p[c];
      if (api === null) expect(row[j]).toBe("");
      else if (typeof api === "boolean") expect(row[j]).toBe(String(api));
      // Exact equality: the CSV carries the shortest round-trip form of each double.
      else expect(Number(row[j])).toBe(api);
    });
  });
}

describe("CSV export", () => {
  it("equals the API's numbers for a live draft, across a 2001-point grid", async () => {
    const erin = await signInAs("engineer");
    const c = await createCase(erin, caseInputSchema.parse(shiftCase(pins, { temperatures: { fromK: 300, toK: 1300, stepK: 0.5 }, toleranceKFactor: 1.5 })));
    const { results, csv, disposition } = await both(c.id);
    expect(results.source).toBe("live");
    expect(results.result.points).toHaveLength(2001);
    expectSameNumbers(results, csv);
    expect(disposition).toMatch(/attachment; filename="heatpath-case-\d+-shift-converter-check-draft\.csv"/);
  });

  it("equals the stored snapshot's numbers for a submitted case and for a chosen revision", async () => {
    const erin = await signInAs("engineer");
    const c = await createCase(erin, caseInputSchema.parse(shiftCase(pins, { temperatures: { fromK: "200 degC", toK: "450 degC", stepK: "10 degC" } })));
    await submitCase(erin, c.id, 0);
    const latest = await both(c.id);
    expect(latest.results.source).toBe("snapshot");
    expect(latest.results.result.points[0].tK).toBeCloseTo(473.15, 9);
    expectSameNumbers(latest.results, latest.csv);
    const chosen = await both(c.id, "?revision=1");
    expect(chosen.csv).toBe(latest.csv);
    expect(chosen.disposition).toMatch(/-r1\.csv"/);
  });

  it("converts the temperature column only, renamed with its unit, when asked (?unit=degC, degF); K stays the default", async () => {
    const erin = await signInAs("engineer");
    const c = await createCase(erin, caseInputSchema.parse(shiftCase(pins, { temperatures: { fromK: "200 degC", toK: "300 degC", stepK: "50 degC" } })));
    const { results } = await both(c.id);
    const get = async (q: string) => exportRoute.GET(jsonRequest("GET", `/api/v1/cases/${c.id}/export${q}`), ctx({ id: String(c.id) }) as { params: Promise<{ id: string }> });
    for (const [unit, column, expected] of [
      ["degC", "tDegC", [200, 250, 300]],
      // t/°F = 1.8·t/°C + 32 (common practice)
      ["degF", "tDegF", [392, 482, 572]],
    ] as const) {
      const response = await get(`?unit=${unit}`);
      expect(response.status).toBe(200);
      expect(response.headers.get("content-disposition")).toContain(`-${unit}.csv`);
      const [header, ...rows] = Papa.parse<string[]>((await response.text()).trim(), { skipEmptyLines: true }).data;
      expect(header).toEqual([column, ...CSV_COLUMNS.slice(1)]);
      rows.forEach((row, i) => {
        expect(Number(row[0])).toBeCloseTo(expected[i], 9);
        expect(Number(row[4])).toBe(results.result.points[i].dGkJ);
      });
    }
    expect((await get("?unit=kelvin")).status).toBe(422);
    expect((await get("?units=degC")).status).toBe(422);
  });
});
