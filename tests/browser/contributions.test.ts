/**
 * The case page's "which species moves ΔrG" chart and the report's columns, on the seeded
 * demo cases (invented plant, published NASA-7 2015 sets), at 1280 px and on a 390 px phone;
 * and the equilibrium panel's condensation note on the cold box.
 */
import type { Page } from "playwright-core";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { baseURL, browserForFile, openBrowser, SHOTS, shot, signIn } from "./browser";

const b = browserForFile();

type Results = {
  result: {
    points: { tK: number; diffKJ: number; sigmaDGkJ?: number }[];
    contributions?: Record<string, number[]>;
    contributionsSigma?: Record<string, number[]>;
    warnings: { code: string; species?: string }[];
  };
};

async function openCase(page: Page, title: string): Promise<string> {
  await page.goto(`${baseURL()}/cases`);
  await page.getByRole("link", { name: title }).click();
  await page.waitForURL(/\/cases\/\d+$/);
  return page.url().split("/").pop()!;
}

describe("contributions on the case page and in the report", () => {
  it("draws each species' share of corrected − naive for methane cracking, in agreement with the API", async () => {
    const { page } = b;
    await signIn(page, "erin.engineer@example.test");
    const id = await openCase(page, "Reformer tubes: carbon from methane cracking");
    const chart = page.getByTestId("contributions");
    await chart.getByTestId("chart-contributions").locator("svg .recharts-area").first().waitFor();
    const api = (await (await page.request.get(`${baseURL()}/api/v1/cases/${id}/results`)).json()) as Results;
    const c = api.result.contributions!;
    expect(Object.keys(c)).toEqual(["CH4(g)", "C(cr)", "H2(g)"]);
    // One stacked band per species, in each of the two charts (the reference sets carry a Cp uncertainty, so the 1σ band is split too).
    expect(await chart.getByTestId("chart-contributions").locator(".recharts-area").count()).toBe(3);
    expect(await chart.getByTestId("chart-contributions-sigma").locator(".recharts-area").count()).toBe(3);
    for (const k of Object.keys(c)) await chart.getByText(k, { exact: true }).first().waitFor();
    // The headline names the largest share where the gap is widest, as the API's numbers say.
    const pts = api.result.points;
    const w = pts.reduce((a, p, i) => (Math.abs(p.diffKJ) > Math.abs(pts[a].diffKJ) ? i : a), 0);
    const largest = Object.keys(c).reduce((a, k) => (Math.abs(c[k][w]) > Math.abs(c[a][w]) ? k : a));
    const headline = await page.getByTestId("contributions-headline").textContent();
    expect(headline).toContain(`At ${pts[w].tK.toFixed(2)} K`);
    expect(headline).toContain(`the largest share is ${largest} with ${c[largest][w].toFixed(3).replace("-", "−")} kJ/mol`);
    // The shares at that temperature add up to corrected − naive.
    const sum = Object.values(c).reduce((a, x) => a + x[w], 0);
    expect(Math.abs(sum + pts[w].diffKJ)).toBeLessThanOrEqual(1e-9);
    await chart.scrollIntoViewIfNeeded();
    await chart.screenshot({ path: path.join(SHOTS, "contributions-1280.png") });
    await shot(page, "contributions-case-1280");
  });

  it("prints one column per species and their sum in the report", async () => {
    const { page } = b;
    const id = await openCase(page, "Reformer tubes: carbon from CO (Boudouard)");
    await page.goto(`${baseURL()}/cases/${id}/report`);
    const table = page.getByTestId("report-contributions");
    await table.waitFor();
    const heads = await table.locator("thead th").allTextContents();
    expect(heads).toEqual(["T (K)", "CO(g) (kJ/mol)", "C(cr) (kJ/mol)", "CO2(g) (kJ/mol)", "sum = corrected − naive (kJ/mol)", "1σ of ΔrG (kJ/mol)"]);
    const api = (await (await page.request.get(`${baseURL()}/api/v1/cases/${id}/results`)).json()) as Results;
    const first = await table.locator("tbody tr").first().locator("td").allTextContents();
    const p0 = api.result.points[0];
    expect(first[0]).toBe(p0.tK.toFixed(2));
    const minus = (x: number) => x.toFixed(3).replace("-", "−");
    // Each species cell: its share, and in brackets its share of the 1σ.
    expect(first[1]).toBe(`${minus(api.result.contributions!["CO(g)"][0])} (${minus(api.result.contributionsSigma!["CO(g)"][0])})`);
    expect(first[4]).toBe(minus(-p0.diffKJ));
    expect(first[5]).toBe(minus(p0.sigmaDGkJ!));
    await page.emulateMedia({ media: "print" });
    await table.scrollIntoViewIfNeeded();
    await page.getByTestId("report").screenshot({ path: path.join(SHOTS, "contributions-report-print.png") });
    await page.emulateMedia({ media: "screen" });
  });

  it("the cold box says CH4 is below its boiling point and that a condensed phase would form", async () => {
    const { page } = b;
    await openCase(page, "Cold box CO trace near 90 K");
    await page.getByTestId("warnings").getByText("below-boiling-point").first().waitFor();
    const note = page.getByTestId("condensation-note");
    await note.waitFor();
    expect(await note.textContent()).toMatch(/CH4\(g\)\s*would condense \(solid below its 90\.69 K triple point\) from 80 K to 111 K/);
    expect(await note.textContent()).toContain("Screened on the normal boiling point (1 atm)");
    await note.scrollIntoViewIfNeeded();
    await page.screenshot({ path: path.join(SHOTS, "condensation-note-1280.png") });
  });

  it("fits a 390 px phone", async () => {
    const phone = await openBrowser({ width: 390, height: 844 });
    try {
      const p = phone.page;
      await signIn(p, "erin.engineer@example.test");
      await openCase(p, "Reformer tubes: carbon from methane cracking");
      const chart = p.getByTestId("contributions");
      await chart.getByTestId("chart-contributions").locator("svg .recharts-area").first().waitFor();
      expect(await p.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
      await chart.scrollIntoViewIfNeeded();
      await chart.screenshot({ path: path.join(SHOTS, "contributions-390.png") });
    } finally {
      await phone.close();
    }
  });
});
