/**
 * The equilibrium panel as an engineer uses it, on the seeded (invented) Larkspur Hydrogen
 * Works cases: the frozen shift-converter outlet, the reformer with shift and the family
 * comparison, a trial and a save on a draft, the CSV and the printed report, and a phone.
 */
import path from "node:path";
import type { Locator, Page } from "playwright-core";
import { describe, expect, it } from "vitest";
import { baseURL, openBrowser, browserForFile, SHOTS, shot, signIn } from "./browser";

/** A screenshot of one part of the page (the panel), beside the full-page ones. */
async function partShot(part: Locator, name: string) {
  await part.screenshot({ path: path.join(SHOTS, `${name}.png`) });
}

const b = browserForFile();

async function openCase(page: Page, title: string): Promise<string> {
  await page.goto(`${baseURL()}/cases`);
  await page.getByTestId("case-list").getByRole("link", { name: title }).click();
  await page.waitForURL(/\/cases\/\d+$/);
  return new URL(page.url()).pathname.split("/").pop()!;
}

describe("equilibrium panel", () => {
  it("shows the frozen shift-converter outlet, corrected against naive, with bands, matching the API", async () => {
    const { page } = b;
    await signIn(page, "erin.engineer@example.test");
    const id = await openCase(page, "Shift converter 480–700 K");
    const panel = page.getByTestId("equilibrium-panel");
    await panel.getByTestId("equilibrium-results").waitFor();
    await expect.poll(() => panel.getByTestId("equilibrium-table").locator("tbody tr").count()).toBeGreaterThan(5);
    expect(await panel.getByText("Frozen snapshot · revision 1").count()).toBe(1);
    expect(await panel.getByTestId("caution").count()).toBe(1);
    expect(await panel.getByTestId("equilibrium-warnings").textContent()).toContain("high-pressure");
    const api = (await (await page.request.get(`${baseURL()}/api/v1/cases/${id}/results`)).json()) as {
      result: { equilibrium: { tK: number; keyConversion: number }[] };
    };
    const first = panel.getByTestId("equilibrium-table").locator("tbody tr").first().locator("td");
    expect(await first.nth(0).textContent()).toBe(String(api.result.equilibrium[0].tK));
    expect(await first.nth(1).textContent()).toBe(`${(100 * api.result.equilibrium[0].keyConversion).toPrecision(4)} %`);
    await panel.getByTestId("equilibrium-key-chart").locator("svg .recharts-area").first().waitFor();
    await shot(page, "equilibrium-shift-1280");
    await partShot(panel, "equilibrium-shift-panel-1280");
  });

  it("runs the reformer with shift and compares the data families", async () => {
    const { page } = b;
    await openCase(page, "Reformer outlet near 1100 K");
    const panel = page.getByTestId("equilibrium-panel");
    await panel.getByTestId("equilibrium-results").waitFor();
    expect(await panel.getByText("2 simultaneous reactions").count()).toBe(1);
    await panel.getByTestId("compare-sources").click();
    await panel.getByTestId("sources-table").waitFor();
    expect(Number(await panel.getByTestId("sources-logk-spread").textContent())).toBeGreaterThan(0);
    await partShot(panel, "equilibrium-reformer-sources-panel-1280");
  });

  it("a draft: solve a trial, save it to the case, and find it in the CSV", async () => {
    const { page } = b;
    const id = await openCase(page, "Reformer start-up sweep (°C)");
    const panel = page.getByTestId("equilibrium-panel");
    const amount = (key: string) => panel.getByRole("textbox", { name: key, exact: true });
    await amount("CH4(g)").fill("1");
    await amount("H2O(g)").fill("3");
    await panel.getByLabel("Pressure").fill("2.5 MPa");
    await panel.getByLabel("Inert species (rides along, e.g. N2(g))").fill("N2(g)");
    await panel.getByRole("button", { name: "Add" }).click();
    await amount("N2(g)").fill("0.05");
    await panel.getByRole("button", { name: "Solve" }).click();
    await panel.getByText("Trial run, not saved").waitFor();
    await partShot(panel, "equilibrium-draft-trial-panel-1280");
    await panel.getByLabel("Pressure").fill("-3 bar");
    await panel.getByRole("button", { name: "Solve" }).click();
    // In plain words beside the field, once; no field path.
    await panel.getByTestId("equilibrium-error").waitFor();
    expect(await panel.getByText("The pressure must be above 0.").count()).toBe(1);
    expect(await panel.textContent()).not.toContain("equilibrium.pressureBar");
    await panel.getByLabel("Pressure").fill("25 bar");
    await panel.getByRole("button", { name: "Save to case" }).click();
    await panel.getByText("Saved to the case.").waitFor();
    await panel.getByText("Saved feed · live evaluation").waitFor();
    const csv = await (await page.request.get(`${baseURL()}/api/v1/cases/${id}/export`)).text();
    expect(csv.split("\n")[0]).toContain("equilibrium.moleFractions.H2(g)");
  });

  it("prints the equilibrium in the report", async () => {
    const { page } = b;
    const id = await openCase(page, "Shift converter 480–700 K");
    await page.goto(`${baseURL()}/cases/${id}/report`);
    const section = page.getByTestId("report-equilibrium");
    await section.getByTestId("equilibrium-table").waitFor();
    await section.getByTestId("sources-table").waitFor();
    await shot(page, "equilibrium-report");
    await partShot(section, "equilibrium-report-section");
  });

  it("reads on a phone", async () => {
    const phone = await openBrowser({ width: 390, height: 844 });
    try {
      await signIn(phone.page, "erin.engineer@example.test");
      await openCase(phone.page, "Shift converter 480–700 K");
      await phone.page.getByTestId("equilibrium-results").waitFor();
      const wide = await phone.page.evaluate(() => {
        const w = document.documentElement.clientWidth;
        return [...document.querySelectorAll("[data-testid=equilibrium-panel] *")]
          .filter((e) => e.getBoundingClientRect().right > w + 1 && !e.closest(".overflow-x-auto"))
          .slice(0, 5)
          .map((e) => `${e.tagName}.${(e as HTMLElement).className}`.slice(0, 120));
      });
      expect(wide).toEqual([]);
      const box = await phone.page.getByTestId("equilibrium-panel").boundingBox();
      expect(box!.x + box!.width).toBeLessThanOrEqual(390);
      await partShot(phone.page.getByTestId("equilibrium-panel"), "equilibrium-shift-panel-390");
    } finally {
      await phone.close();
    }
  });
});
