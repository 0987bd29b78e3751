import type { Page } from "playwright-core";
import { describe, expect, it } from "vitest";
import path from "node:path";
import { baseURL, openBrowser, browserForFile, SHOTS, shot, signIn, signOut } from "./browser";

const b = browserForFile();

const TITLE = "Shift converter, bed 2 check";

async function pickTerm(page: Page, i: number, side: "reactant" | "product", formula: string) {
  await page.getByLabel(`Term ${i + 1} side`).selectOption(side);
  await page.getByLabel(`Term ${i + 1} species`).selectOption(formula);
  await page.getByLabel(`Term ${i + 1} phase`).selectOption("g");
  // The first approved version is chosen for us.
  expect(await page.getByLabel(`Term ${i + 1} model version`).inputValue()).not.toBe("");
}

async function statusOf(page: Page) {
  return page.getByTestId("case-status").getAttribute("data-status");
}

/** The first row of the numbers table against the API's own numbers for the same case. */
async function tableAgreesWithApi(page: Page, caseId: string) {
  await page.getByTestId("numbers-table").waitFor();
  const api = (await (await page.request.get(`${baseURL()}/api/v1/cases/${caseId}/results`)).json()) as {
    result: { points: { tK: number; dGkJ: number; naiveDGkJ: number; diffKJ: number }[] };
  };
  const cells = page.getByTestId("numbers-table").locator("tbody tr").first().locator("td");
  expect(Number(await cells.nth(0).getAttribute("data-value"))).toBe(api.result.points[0].tK);
  expect(Number(await cells.nth(4).getAttribute("data-value"))).toBe(api.result.points[0].dGkJ);
  expect(Number(await cells.nth(5).getAttribute("data-value"))).toBe(api.result.points[0].naiveDGkJ);
  expect(Number(await cells.nth(6).getAttribute("data-value"))).toBe(api.result.points[0].diffKJ);
  expect(await cells.nth(4).textContent()).toBe(api.result.points[0].dGkJ.toFixed(3).replace("-", "−"));
  const csv = await (await page.request.get(`${baseURL()}/api/v1/cases/${caseId}/export`)).text();
  expect(Number(csv.split("\n")[1].split(",")[4])).toBe(api.result.points[0].dGkJ);
}

describe("engineer → reviewer journey", () => {
  let caseId = "";

  it("an engineer builds a case, sees the live results and submits it", async () => {
    const { page } = b;
    await signIn(page, "erin.engineer@example.test");
    await page.goto(`${baseURL()}/cases`);
    await page.getByRole("link", { name: "New case" }).click();
    await page.getByRole("heading", { level: 1, name: "New case" }).waitFor();

    // Inline errors before anything is sent.
    await page.getByRole("button", { name: "Save draft" }).click();
    await page.getByText("Give the case a title.").waitFor();

    await page.getByLabel("Title").fill(TITLE);
    await pickTerm(page, 0, "reactant", "CO");
    await pickTerm(page, 1, "reactant", "H2O");
    await page.getByRole("button", { name: "Add species" }).click();
    await pickTerm(page, 2, "product", "CO2");
    expect(await page.getByTestId("balance").textContent()).toContain("Not balanced: H -2");
    await page.getByRole("button", { name: "Add species" }).click();
    await pickTerm(page, 3, "product", "H2");
    expect(await page.getByTestId("balance").textContent()).toContain("Balanced: C, O, H");
    await page.getByLabel("From (K)").fill("480");
    await page.getByLabel("To (K)").fill("700");
    await page.getByLabel("Step (K)").fill("5");
    await page.getByLabel("Tolerance on ΔrG (kJ/mol)").fill("0.5");
    await shot(page, "case-builder");
    await page.getByRole("button", { name: "Save draft" }).click();
    await page.waitForURL(/\/cases\/\d+$/);
    caseId = page.url().split("/").pop()!;

    expect(await page.getByTestId("case-reaction").textContent()).toBe("CO(g) + H2O(g) → CO2(g) + H2(g)");
    expect(await statusOf(page)).toBe("draft");
    await page.getByTestId("results-source").getByText("Live evaluation").waitFor();
    await page.getByTestId("chart-dg").locator("svg").first().waitFor();
    await tableAgreesWithApi(page, caseId);
    expect(await page.getByTestId("caution").count()).toBeGreaterThanOrEqual(1);
    await shot(page, "case-results-draft");

    await page.getByRole("button", { name: "Submit for review" }).click();
    await page.getByRole("dialog").getByRole("button", { name: "Submit", exact: true }).click();
    await page.getByTestId("snapshot-hash").waitFor();
    expect(await statusOf(page)).toBe("submitted");
    await signOut(page);
  });

  it("the reviewer opens it from the queue, compares naive and corrected, and returns it", async () => {
    const { page } = b;
    await signIn(page, "rory.reviewer@example.test");
    // The request arrives by mail (the local catcher in demo mode); its link opens the case.
    await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Outbox" }).click();
    // Wait for the client navigation to land, or the reloads below would reload the page we came from.
    await page.waitForURL(/\/outbox$/);
    const mail = page
      .getByTestId("caught-message")
      .filter({ hasText: `Review requested: ${TITLE} (revision 1)` })
      .first();
    for (let i = 0; i < 20 && (await mail.count()) === 0; i++) {
      await page.waitForTimeout(500);
      await page.reload();
    }
    await shot(page, "outbox-review-requested");
    expect(await mail.getByRole("link").first().getAttribute("href")).toBe(`${baseURL()}/cases/${caseId}`);
    await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Reviews" }).click();
    await page.getByTestId("review-queue").getByRole("link", { name: TITLE }).click();
    await page.waitForURL(new RegExp(`/cases/${caseId}$`));
    await page.getByTestId("results-source").getByText("Frozen snapshot · revision 1").waitFor();
    // Both curves are drawn and the numbers say how far apart they are.
    const dg = page.getByTestId("chart-dg");
    await dg.getByText("corrected", { exact: true }).first().waitFor();
    await dg.getByText("naive", { exact: true }).first().waitFor();
    expect(await page.getByTestId("crossovers").textContent()).toContain("Naive T*");
    expect(await page.getByTestId("sign-case").textContent()).toContain("K > 1 only below the crossover temperature");
    await tableAgreesWithApi(page, caseId);
    await shot(page, "case-review");

    await page.getByLabel("Return to the author").check();
    await page.getByRole("button", { name: "Return case" }).click();
    await page.getByText("Say what needs to change (at least 5 characters).").waitFor();
    await page.getByLabel("Reason (required)").fill("Extend the span to 750 K to cover the bed-inlet excursion.");
    await page.getByRole("button", { name: "Return case" }).click();
    await page.getByRole("dialog").getByRole("button", { name: "Return", exact: true }).click();
    await page.getByTestId("return-reason").waitFor();
    expect(await statusOf(page)).toBe("returned");
    await signOut(page);
  });

  it("the engineer revises and resubmits; the old snapshot stays readable", async () => {
    const { page } = b;
    await signIn(page, "erin.engineer@example.test");
    await page.goto(`${baseURL()}/cases/${caseId}`);
    expect(await page.getByTestId("return-reason").textContent()).toContain("Extend the span to 750 K");
    await page.getByRole("link", { name: "Edit" }).click();
    await page.getByLabel("To (K)").fill("750");
    await page.getByRole("button", { name: "Save changes" }).click();
    await page.waitForURL(new RegExp(`/cases/${caseId}$`));
    await page.getByTestId("input-temperatures").getByText("480 K to 750 K, step 5 K").waitFor();
    await page.getByRole("button", { name: "Resubmit for review" }).click();
    await page.getByRole("dialog").getByRole("button", { name: "Resubmit", exact: true }).click();
    await page.getByTestId("results-source").getByText("Frozen snapshot · revision 2").waitFor();
    await page.getByRole("link", { name: "Revision 1", exact: true }).click();
    await page.getByTestId("results-source").getByText("Frozen snapshot · revision 1").waitFor();
    await signOut(page);
  });

  it("the reviewer compares the revisions and approves", async () => {
    const { page } = b;
    await signIn(page, "rory.reviewer@example.test");
    await page.goto(`${baseURL()}/cases/${caseId}`);
    await page.getByRole("link", { name: "Compare with revision 1" }).click();
    await page.getByTestId("diff").getByText("temperatures.toK").waitFor();
    await shot(page, "case-diff");
    await page.getByRole("link", { name: "Back to the case" }).click();
    await page.getByLabel("Approve").check();
    await page.getByRole("button", { name: "Approve case" }).click();
    await page.getByRole("dialog").getByRole("button", { name: "Approve", exact: true }).click();
    await page.waitForFunction(() => document.querySelector('[data-testid="case-status"]')?.getAttribute("data-status") === "approved");
    expect(await page.getByTestId("snapshots").locator("li").count()).toBe(2);
    await page.getByTestId("snapshot-hash").waitFor();
    await shot(page, "case-approved");

    await page.getByRole("link", { name: "Printable report" }).click();
    await page.getByTestId("report").waitFor();
    await page.getByTestId("report").getByTestId("chart-dg").locator("svg").first().waitFor();
    expect(await page.getByTestId("report-hash").textContent()).toMatch(/^[0-9a-f]{64}$/);
    await page.emulateMedia({ media: "print" });
    await shot(page, "case-report-print");
    await page.emulateMedia({ media: "screen" });
    await signOut(page);
  });
});

describe("seeded cases and small screens", () => {
  it("the cold box draft shows its extrapolation warnings, on a phone too", async () => {
    const phone = await openBrowser({ width: 390, height: 844 });
    try {
      const p = phone.page;
      await signIn(p, "erin.engineer@example.test");
      await p.goto(`${baseURL()}/cases`);
      await p.getByRole("link", { name: "Cold box CO trace near 90 K" }).click();
      await p.getByTestId("warnings").getByText("extrapolation").first().waitFor();
      const width = await p.evaluate(() => document.documentElement.scrollWidth);
      expect(width).toBeLessThanOrEqual(390);
      await shot(p, "case-cold-box-phone");
      await p.getByTestId("chart-dg").scrollIntoViewIfNeeded();
      await p.screenshot({ path: path.join(SHOTS, "case-cold-box-phone-charts.png") });
      await p.getByTestId("warnings").scrollIntoViewIfNeeded();
      await p.screenshot({ path: path.join(SHOTS, "case-cold-box-phone-warnings.png") });
    } finally {
      await phone.close();
    }
  });
});
