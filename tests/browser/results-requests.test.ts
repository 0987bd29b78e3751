/**
 * One results request per case page view: the results view and the equilibrium panel share it
 * (the drawing sample and the numbers table's first page, format=columns); a page turn of the
 * table asks for that page only. Demo data: the invented Larkspur Hydrogen Works cases.
 */
import type { Page, Request } from "playwright-core";
import { describe, expect, it } from "vitest";
import { baseURL, browserForFile, shot, signIn } from "./browser";

const b = browserForFile();

/** Every request the page makes to the case's results route, from now on. */
function resultsRequests(page: Page, caseId: string): URL[] {
  const seen: URL[] = [];
  const path = `/api/v1/cases/${caseId}/results`;
  page.on("request", (r: Request) => {
    const url = new URL(r.url());
    if (url.pathname === path) seen.push(url);
  });
  return seen;
}

async function caseIdOf(page: Page, title: string): Promise<string> {
  await page.goto(`${baseURL()}/cases`);
  const href = await page.getByTestId("case-list").getByRole("link", { name: title }).getAttribute("href");
  return href!.split("/").pop()!;
}

/** Open the case page and wait until everything fed by the results is on screen and the network is quiet. */
async function view(page: Page, caseId: string, withEquilibrium: boolean) {
  await page.goto(`${baseURL()}/cases/${caseId}`);
  await page.getByTestId("numbers-table").waitFor();
  await page.getByTestId("chart-dg").locator(".recharts-line-curve").first().waitFor();
  await page.locator('[data-testid="contributions"], [data-testid="contributions-missing"]').first().waitFor();
  if (withEquilibrium) await page.getByTestId("equilibrium-results").waitFor();
  await page.waitForLoadState("networkidle");
}

const query = (u: URL) => Object.fromEntries(u.searchParams.entries());

describe("the case page asks for its results once", () => {
  let signedIn = false;
  for (const { title, status, equilibrium, points } of [
    { title: "Reformer start-up sweep (°C)", status: "draft", equilibrium: false, points: 51 },
    { title: "Reformer tubes: carbon from CO (Boudouard)", status: "draft", equilibrium: true, points: 141 },
    { title: "Shift converter 480–700 K", status: "submitted", equilibrium: true, points: 111 },
  ]) {
    it(`${status}: ${title}`, async () => {
      const { page } = b;
      if (!signedIn) await signIn(page, "erin.engineer@example.test");
      signedIn = true;
      const id = await caseIdOf(page, title);
      const seen = resultsRequests(page, id);
      await view(page, id, equilibrium);
      expect(seen.map((u) => u.search)).toHaveLength(1);
      expect(query(seen[0])).toEqual({ format: "columns", points: "1200", offset: "0", limit: "50" });
      expect(await page.getByTestId("results-source").textContent()).toContain(status === "draft" ? "Live evaluation" : "Frozen snapshot");
      expect(await page.getByTestId("table-range").textContent()).toBe(`Rows 1–${Math.min(50, points)} of ${points}`);
      await shot(page, `results-once-${status}-${id}`);

      // The next page of the table: that page only; back to the first: nothing asked.
      const results = page.getByTestId("results");
      await results.getByRole("button", { name: "Next" }).click();
      await page
        .getByTestId("table-range")
        .filter({ hasText: `Rows 51–${Math.min(100, points)} of ${points}` })
        .waitFor();
      await page.waitForLoadState("networkidle");
      expect(seen).toHaveLength(2);
      expect(query(seen[1])).toEqual({ format: "columns", offset: "50", limit: "50" });
      const api = (await (await page.request.get(`${baseURL()}/api/v1/cases/${id}/results`)).json()) as { result: { points: { tK: number; dGkJ: number }[] } };
      const first = page.getByTestId("numbers-table").locator("tbody tr").first().locator("td");
      expect(Number(await first.nth(0).getAttribute("data-value"))).toBe(api.result.points[50].tK);
      expect(Number(await first.nth(4).getAttribute("data-value"))).toBe(api.result.points[50].dGkJ);
      await results.getByRole("button", { name: "Previous" }).click();
      await page
        .getByTestId("table-range")
        .filter({ hasText: `Rows 1–50 of ${points}` })
        .waitFor();
      expect(Number(await first.nth(0).getAttribute("data-value"))).toBe(api.result.points[0].tK);
      expect(seen).toHaveLength(2);
    });
  }
});
