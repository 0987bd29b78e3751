/**
 * The library in the browser: a steward uploads measured data (invented numbers), checks the
 * rows, fits, saves a draft and proposes it; the author cannot approve; a second steward does.
 * Also the list, a species page with an overlay, and the editor's live preview. Screenshots go
 * to test-results/screens/library-*.png.
 */
import { describe, expect, it } from "vitest";
import { baseURL, openBrowser, browserForFile, shot, signIn, signOut } from "./browser";

const b = browserForFile();

// Invented measurements of a catalyst support: Cp = 150 + 0.03 T − 2.5e6/T² (J/(mol·K)).
const rows = Array.from({ length: 15 }, (_, i) => {
  const t = 320 + 40 * i;
  return `${t}\t${(150 + 0.03 * t - 2.5e6 / t ** 2 + (i % 2 ? 0.3 : -0.3)).toFixed(2)}`;
});
const goodPaste = ["T (K)\tCp (J/mol/K)", ...rows].join("\n");
const badPaste = ["T (K)\tCp (J/mol/K)", rows[0], "360\tn/a", ...rows.slice(2)].join("\n");

describe("library", () => {
  it("lists models with status marks and searches by formula", async () => {
    const { page } = b;
    await signIn(page, "erin.engineer@example.test");
    await page.goto(`${baseURL()}/library`);
    await page.getByRole("heading", { level: 1, name: "Cp library" }).waitFor();
    await shot(page, "library-list");
    await page.getByLabel("Formula or name").fill("NiAl2O4");
    await page.getByRole("button", { name: "Search" }).click();
    await page.waitForURL(/q=NiAl2O4/);
    const row = page.getByTestId("model-row").filter({ hasText: "fitted to support lot 7" });
    expect(await row.getByTestId("version-status").getAttribute("data-status")).toBe("proposed");
    await page.getByLabel("Formula or name").fill("no-such-thing");
    await page.getByRole("button", { name: "Search" }).click();
    await page.getByText("No models match these filters.").waitFor();
    await signOut(page);
  });

  it("shows a species page with Cp, H and S and two versions overlaid", async () => {
    const { page } = b;
    await signIn(page, "rory.reviewer@example.test");
    await page.goto(`${baseURL()}/library?q=CH4&status=approved`);
    await page.getByRole("link", { name: "CH4 · Shomate (NIST-JANAF fit)", exact: true }).click();
    await page.getByTestId("chart-cp").waitFor();
    await page.getByRole("link", { name: "overlay on chosen" }).first().click();
    await page.getByTestId("chart-dcp").waitFor();
    await page.locator(".recharts-line").first().waitFor();
    await shot(page, "library-species-overlay");
    await signOut(page);
  });

  it("a steward uploads, fits and proposes; the author cannot approve; a second steward approves", async () => {
    const { page } = b;
    await signIn(page, "stella.steward@example.test");
    await page.goto(`${baseURL()}/library/upload`);
    await page.getByLabel("Dataset name").fill("Support lot 9, DSC (invented)");
    await page.getByLabel("Species measured").selectOption({ label: "NiAl2O4 · Ni–alumina catalyst support (invented demo data)" });
    // A bad row first: named by row and column, and the upload stays disabled.
    await page.getByLabel("Pasted data").fill(badPaste);
    await page.getByRole("button", { name: "Check the rows" }).click();
    await page.getByTestId("csv-errors").getByText('Row 3, column "Cp (J/mol/K)": "n/a" is not a number.').waitFor();
    expect(await page.getByRole("button", { name: "Upload dataset" }).isDisabled()).toBe(true);
    await shot(page, "library-upload-bad-row");
    await page.getByLabel("Pasted data").fill(goodPaste);
    await page.getByRole("button", { name: "Check the rows" }).click();
    await page.getByTestId("csv-preview").getByText("15 rows").waitFor();
    await page.getByRole("button", { name: "Upload dataset" }).click();
    await page.getByText(/Saved “Support lot 9, DSC \(invented\)”: 15 points/).waitFor();
    await page.getByLabel("Anchor H (kJ/mol)").fill("-1925");
    await page.getByLabel("Anchor S (J/(mol·K))").fill("98");
    await page.getByRole("button", { name: "Fit", exact: true }).click();
    await page.getByTestId("fit-result").waitFor();
    expect(Number((await page.getByTestId("fit-rms").textContent())!.split(" ")[0])).toBeLessThan(0.5);
    await page.getByLabel("Citation").fill("Larkspur lab, DSC run on support lot 9 (invented demo data)");
    await shot(page, "library-fit");
    await page.getByRole("button", { name: "Save as draft" }).click();
    await page.waitForURL(/\/library\/versions\/\d+$/);
    const versionUrl = page.url();
    expect(await page.getByTestId("version-status").getAttribute("data-status")).toBe("draft");
    await page.getByRole("button", { name: "Propose for approval" }).click();
    await page.getByTestId("own-work-note").waitFor();
    expect(await page.getByTestId("version-status").getAttribute("data-status")).toBe("proposed");
    expect(await page.getByRole("button", { name: "Approve" }).count()).toBe(0);
    await shot(page, "library-proposed-author");
    // The server refuses the author too, whatever the page shows.
    const id = versionUrl.split("/").pop();
    const refused = await page.evaluate(async (v) => (await fetch(`/api/v1/versions/${v}/approve`, { method: "POST" })).status, id);
    expect(refused).toBe(403);
    await signOut(page);

    await signIn(page, "sam.steward@example.test");
    await page.goto(versionUrl);
    await page.getByRole("button", { name: "Approve" }).click();
    await page.locator('[data-testid="version-status"][data-status="approved"]').first().waitFor();
    await page.getByTestId("audit-trail").getByText("Sam Lindqvist approved it").waitFor();
    await shot(page, "library-approved");
    await signOut(page);
  });

  it("the editor shows inline errors and a live preview while typing", async () => {
    const { page } = b;
    await signIn(page, "sam.steward@example.test");
    await page.goto(`${baseURL()}/library/new`);
    await page.getByLabel("Model name").fill("Alumina check");
    await page.getByLabel("Segment 1 cpJ").fill("abc");
    await page.getByText("expected a number or a string with a unit").first().waitFor();
    await page.getByLabel("Segment 1 cpJ").fill("79");
    await page.getByLabel("Segment 1 phase").selectOption("cr");
    await page.getByRole("checkbox", { name: "Anchor (H and S at one temperature)" }).check();
    await page.getByLabel("Anchor H (kJ/mol)").fill("-1675.7");
    await page.getByLabel("Anchor S (J/(mol·K))").fill("50.9");
    // Constant Cp draws a flat line (no height to be "visible"); H and S rise.
    await page.getByTestId("editor-preview").getByTestId("chart-h").locator(".recharts-line-curve").first().waitFor();
    await shot(page, "library-editor");
    await signOut(page);
  });

  it("reads on a phone", async () => {
    const phone = await openBrowser({ width: 390, height: 844 });
    try {
      await signIn(phone.page, "sam.steward@example.test");
      await phone.page.goto(`${baseURL()}/library`);
      await phone.page.getByTestId("model-row").first().waitFor();
      await shot(phone.page, "library-list-phone");
      const overflow = await phone.page.evaluate(() => document.documentElement.scrollWidth > window.innerWidth + 1);
      expect(overflow).toBe(false);
    } finally {
      await phone.close();
    }
  });
});
