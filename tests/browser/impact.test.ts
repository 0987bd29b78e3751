/**
 * The impact panel in the browser: Erin's case pins the team copy of the CH4 model; Sam
 * proposes a v2 whose ΔfH° is 1.5 kJ/mol higher (synthetic, invented for this test); Stella
 * opens the version page, watches the background run finish and sees the case flagged beyond
 * its 1 kJ/mol tolerance, approves, and the run after approval appears. Also the real-gas and
 * adiabatic demo draft's equilibrium panel and its cautions' wording. Screenshots: test-results/screens/impact-*.png,
 * equilibrium-real-gas-*.png.
 */
import type { Page } from "playwright-core";
import { describe, expect, it } from "vitest";
import { baseURL, browserForFile, shot, signIn, signOut } from "./browser";

const b = browserForFile({ width: 1280, height: 1000 });

async function api<T>(page: Page, method: string, path: string, data?: unknown): Promise<{ status: number; body: T }> {
  const r = await page.request.fetch(`${baseURL()}${path}`, { method, ...(data !== undefined ? { data, headers: { "content-type": "application/json" } } : {}) });
  return { status: r.status(), body: (await r.json()) as T };
}

type PinOption = { versionId: number; status: string; scope: string; phases: string[]; family: string };
type ShomateSeg = { form: string; coeffs: Record<string, number> };

describe("impact of a model version on pinned cases", () => {
  let versionId = 0;
  const title = "Reformer on the team CH4 copy (impact test)";

  it("a proposed version's page runs the impact in the background and flags the case", async () => {
    const { page } = b;
    await signIn(page, "erin.engineer@example.test");
    const models = await api<{ items: { id: number; name: string; approvedVersionId: number | null }[] }>(page, "GET", "/api/v1/models?q=CH4&scope=team");
    const copy = models.body.items.find((m) => m.name.endsWith("(team copy)"))!;
    const pin = async (formula: string) => {
      const r = await api<{ versions: PinOption[] }>(page, "GET", `/api/v1/pins?formula=${formula}`);
      return r.body.versions.find((v) => v.status === "approved" && v.scope === "reference" && v.phases.includes("g") && v.family === "nasa7-2015")!.versionId;
    };
    const created = await api<{ case: { id: number } }>(page, "POST", "/api/v1/cases", {
      title,
      notes: "Impact panel test (invented).",
      terms: [
        { formula: "CH4", phase: "g", coefficient: -1, versionId: copy.approvedVersionId },
        { formula: "H2O", phase: "g", coefficient: -1, versionId: await pin("H2O") },
        { formula: "CO", phase: "g", coefficient: 1, versionId: await pin("CO") },
        { formula: "H2", phase: "g", coefficient: 3, versionId: await pin("H2") },
      ],
      temperatures: { fromK: 900, toK: 1200, stepK: 50 },
      referenceK: 298.15,
      toleranceKJ: 1,
      toleranceKFactor: null,
    });
    expect(created.status).toBe(201);
    await signOut(page);

    await signIn(page, "sam.steward@example.test");
    const draft = await api<{ version: { id: number; lockVersion: number; data: { segments: ShomateSeg[] } } }>(page, "POST", `/api/v1/models/${copy.id}/versions`, {
      fromVersionId: copy.approvedVersionId,
    });
    expect(draft.status).toBe(201);
    versionId = draft.body.version.id;
    const data = {
      ...draft.body.version.data,
      segments: draft.body.version.data.segments.map((s) => ({ ...s, coeffs: { ...s.coeffs, F: s.coeffs.F + 1.5, H: s.coeffs.H + 1.5 } })),
    };
    const edited = await api(page, "PATCH", `/api/v1/versions/${versionId}`, {
      lockVersion: draft.body.version.lockVersion,
      data,
      changeNote: "ΔfH° raised by 1.5 kJ/mol (synthetic, for the impact test).",
    });
    expect(edited.status).toBe(200);
    expect((await api(page, "POST", `/api/v1/versions/${versionId}/propose`)).status).toBe(200);
    await signOut(page);

    await signIn(page, "stella.steward@example.test");
    await page.goto(`${baseURL()}/library/versions/${versionId}`);
    const panel = page.getByTestId("impact-panel");
    await panel.waitFor();
    await panel.getByTestId("impact-status").getByText("done").waitFor({ timeout: 60_000 });
    const row = panel.getByTestId("impact-row").filter({ hasText: title });
    await row.waitFor();
    // CH4 is a reactant: ΔrG falls by exactly 1.5 kJ/mol, beyond the case's 1 kJ/mol.
    expect(await row.locator("td").nth(2).innerText()).toBe("1.5");
    await row.getByTestId("impact-flag").waitFor();
    await panel.getByText("after proposal").waitFor();
    await shot(page, "impact-proposed");
  });

  it("approving queues the run after approval, shown on the same panel", async () => {
    const { page } = b;
    await page.getByRole("button", { name: "Approve" }).click();
    const panel = page.getByTestId("impact-panel");
    await panel.getByText("after approval").waitFor({ timeout: 60_000 });
    await panel.getByTestId("impact-row").filter({ hasText: title }).waitFor();
    await shot(page, "impact-approved");
    // The reviewer reads the panel but has no button to start a run.
    await signOut(page);
    await signIn(page, "rory.reviewer@example.test");
    await page.goto(`${baseURL()}/library/versions/${versionId}`);
    await page.getByTestId("impact-panel").getByTestId("impact-row").first().waitFor();
    expect(await page.getByTestId("impact-run").count()).toBe(0);
    await signOut(page);
  });
});

describe("real gas and adiabatic outlet in the equilibrium panel", () => {
  it("the ammonia bed draft shows Peng–Robinson φ, the ideal-gas answer beside and the adiabatic outlet", async () => {
    const { page } = b;
    await signIn(page, "erin.engineer@example.test");
    const cases = await api<{ cases: { id: number; title: string }[] }>(page, "GET", "/api/v1/cases");
    const bed = cases.body.cases.find((c) => c.title === "Ammonia bed temperature rise at 150 bar")!;
    await page.goto(`${baseURL()}/cases/${bed.id}`);
    const panel = page.getByTestId("equilibrium-panel");
    await panel.getByTestId("fugacity-table").waitFor({ timeout: 30_000 });
    expect(await panel.getByLabel("Gas model").inputValue()).toBe("peng-robinson");
    const outlet = await panel.getByTestId("adiabatic-outlet").innerText();
    expect(Number(outlet.split(" ")[0])).toBeGreaterThan(750);
    // The cautions name the gas model: Peng–Robinson fugacity coefficients, not ideal-gas activities.
    const caution = panel.getByTestId("caution");
    expect(await caution.getAttribute("data-gas")).toBe("peng-robinson");
    expect(await caution.innerText()).toContain("Peng–Robinson fugacity coefficients");
    expect(await caution.innerText()).not.toContain("ideal-gas activities");
    expect(await panel.getByTestId("equilibrium-caution").innerText()).toContain("beyond what the Peng–Robinson equation captures");
    const resultsCaution = page.getByTestId("results").getByTestId("caution").first();
    await resultsCaution.waitFor();
    expect(await resultsCaution.getAttribute("data-gas")).toBe("peng-robinson");
    await panel.getByTestId("adiabatic-summary").scrollIntoViewIfNeeded();
    await shot(page, "equilibrium-real-gas-ammonia-bed");
    // Back to ideal gas for a trial: the fugacity table goes, the adiabatic outlet stays.
    await panel.getByLabel("Gas model").selectOption("ideal");
    await panel.getByRole("button", { name: "Solve" }).click();
    await panel.getByText("Trial run, not saved").waitFor();
    expect(await panel.getByTestId("fugacity-table").count()).toBe(0);
    await panel.getByTestId("adiabatic-summary").waitFor();
    expect(await caution.getAttribute("data-gas")).toBe("ideal");
    expect(await caution.innerText()).toContain("ideal-gas activities");
    await signOut(page);
  });
});
