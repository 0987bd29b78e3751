/**
 * Screens a practitioner can trust (issue 11, items 1–4, 10–13, 15), driven in chromium against
 * `next start`: nothing typed is lost or reinterpreted, the report is a sign-off record, review
 * steps are confirmed, the audit trail is on screen, and library work can be taken back.
 * Demo data is the invented Larkspur Hydrogen Works; numbers typed here are synthetic,
 * invented for this test. Screenshots land in test-results/screens/.
 */
import type { Page } from "playwright-core";
import { describe, expect, it } from "vitest";
import { baseURL, browserForFile, shot, signIn, signOut } from "./browser";

const b = browserForFile();

const AMMONIA = "Ammonia loop near 700 K";
type CaseJson = {
  case: {
    id: number;
    lockVersion: number;
    status: string;
    inputs: { temperatures: { fromK: number; toK: number; stepK: number }; equilibrium: { feed: Record<string, number>; pressure: string | number; feedUnit: string } | null };
  };
};

async function openCase(page: Page, title: string): Promise<string> {
  await page.goto(`${baseURL()}/cases`);
  await page.getByRole("link", { name: title }).first().click();
  await page.waitForURL(/\/cases\/\d+$/);
  return page.url().split("/").pop()!;
}

async function caseJson(page: Page, id: string): Promise<CaseJson["case"]> {
  return ((await (await page.request.get(`${baseURL()}/api/v1/cases/${id}`)).json()) as CaseJson).case;
}

async function statusOf(page: Page) {
  return page.getByTestId("case-status").getAttribute("data-status");
}

/** The signed-in user's caught mail (demo mode), waiting for the worker to deliver it. */
async function waitForMail(page: Page, subject: string) {
  await page.goto(`${baseURL()}/outbox`);
  const mail = page.getByTestId("caught-message").filter({ hasText: subject }).first();
  for (let i = 0; i < 30 && (await mail.count()) === 0; i++) {
    await page.waitForTimeout(500);
    await page.reload();
  }
  await mail.waitFor();
  return mail;
}

/** The value of an <option> whose text matches, so tests need not know database ids. */
async function optionValue(page: Page, label: string, text: RegExp): Promise<string> {
  const value = await page.getByLabel(label, { exact: true }).locator("option", { hasText: text }).first().getAttribute("value");
  expect(value).not.toBeNull();
  return value!;
}

describe("a case edit keeps what the form does not show (item 1) and review is confirmed (items 11, 12)", () => {
  let id = "";

  it("editing only the step of the returned ammonia loop keeps its saved feed", async () => {
    const { page } = b;
    await signIn(page, "erin.engineer@example.test");
    id = await openCase(page, AMMONIA);
    const before = await caseJson(page, id);
    expect(before.status).toBe("returned");
    expect(before.inputs.equilibrium).not.toBeNull();
    await page.getByRole("link", { name: "Edit" }).click();
    await page.getByLabel("Step (K)").fill("10");
    await page.getByRole("button", { name: "Save changes" }).click();
    await page.waitForURL(new RegExp(`/cases/${id}$`));
    await page.getByTestId("input-temperatures").getByText("step 10 K").waitFor();
    const after = await caseJson(page, id);
    expect(after.inputs.temperatures.stepK).toBe(10);
    expect(after.inputs.equilibrium).toEqual(before.inputs.equilibrium);
    // The panel shows the saved feed, not the defaults.
    expect(await page.getByTestId("equilibrium-panel").locator('input[name="pressure"]').inputValue()).toBe("150 bar");
    await shot(page, "trust-ammonia-after-edit");
  });

  it("resubmitting asks first; Cancel sends nothing, Resubmit freezes revision 2", async () => {
    const { page } = b;
    await page.getByRole("button", { name: "Resubmit for review" }).click();
    const dialog = page.getByRole("dialog");
    await dialog.getByText("This freezes revision 2").waitFor();
    await shot(page, "trust-submit-confirm");
    await dialog.getByRole("button", { name: "Cancel" }).click();
    await dialog.waitFor({ state: "hidden" });
    expect(await statusOf(page)).toBe("returned");
    await page.getByRole("button", { name: "Resubmit for review" }).click();
    await page.getByRole("dialog").getByRole("button", { name: "Resubmit", exact: true }).click();
    await page.getByTestId("results-source").getByText("Frozen snapshot · revision 2").waitFor();
    expect(await statusOf(page)).toBe("submitted");
    await signOut(page);
  });

  it("the reviewer's decision starts unchosen, is confirmed, and a comment mails the author", async () => {
    const { page } = b;
    await signIn(page, "rory.reviewer@example.test");
    await page.goto(`${baseURL()}/cases/${id}`);
    const panel = page.getByRole("form", { name: "Review decision" });
    expect(await panel.getByLabel("Approve").isChecked()).toBe(false);
    expect(await panel.getByLabel("Return to the author").isChecked()).toBe(false);
    await panel.getByRole("button", { name: "Record decision" }).click();
    await panel.getByText("Choose whether to approve the case or return it to the author.").waitFor();
    await panel.getByLabel("Return to the author").check();
    await panel.getByLabel("Reason (required)").fill("State the purge rate used for the inert build-up (invented review).");
    await panel.getByRole("button", { name: "Return case" }).click();
    const dialog = page.getByRole("dialog");
    await dialog.getByTestId("confirm-reason").getByText("State the purge rate").waitFor();
    await shot(page, "trust-return-confirm");
    await dialog.getByRole("button", { name: "Return", exact: true }).click();
    await page.getByTestId("return-reason").waitFor();
    expect(await statusOf(page)).toBe("returned");
    await page.getByLabel(/Add a comment/).fill("The feed H2/N2 ratio looks right to me.");
    await page.getByRole("button", { name: "Post comment" }).click();
    await page.getByTestId("comments").getByText("The feed H2/N2 ratio looks right to me.").waitFor();
    await signOut(page);
  });

  it("the author is mailed the comment and replies; the reply mails the reviewer", async () => {
    const { page } = b;
    await signIn(page, "erin.engineer@example.test");
    const mail = await waitForMail(page, `Comment on ${AMMONIA}`);
    expect(await mail.textContent()).toContain("The feed H2/N2 ratio looks right to me.");
    await page.goto(`${baseURL()}/cases/${id}`);
    await page.getByLabel(/Add a comment/).fill("Purge at 2 % of the loop flow (invented); added to the notes.");
    await page.getByRole("button", { name: "Post comment" }).click();
    await page.getByTestId("comments").getByText("Purge at 2 %").waitFor();
    // Drop the feed on purpose (a PATCH that names it) and start the span in extrapolation, then resubmit.
    const c = await caseJson(page, id);
    const patched = await page.request.patch(`${baseURL()}/api/v1/cases/${id}`, {
      data: { equilibrium: null, temperatures: { fromK: 150, toK: 800, stepK: 10 }, lockVersion: c.lockVersion },
    });
    expect(patched.status()).toBe(200);
    await page.reload();
    await page.getByRole("button", { name: "Resubmit for review" }).click();
    await page.getByRole("dialog").getByRole("button", { name: "Resubmit", exact: true }).click();
    await page.getByTestId("results-source").getByText("Frozen snapshot · revision 3").waitFor();
    await signOut(page);
  });

  it("the revision diff says the equilibrium results were lost, and a dropped warning is not green", async () => {
    const { page } = b;
    await signIn(page, "rory.reviewer@example.test");
    const mail = await waitForMail(page, `Comment on ${AMMONIA}`);
    expect(await mail.textContent()).toContain("Purge at 2 %");
    await page.goto(`${baseURL()}/cases/${id}/diff?from=2&to=3`);
    const eq = page.getByTestId("diff-equilibrium");
    expect(await eq.getAttribute("data-status")).toBe("lost");
    await eq.getByText("Revision 3 has no equilibrium results: revision 2 had them").waitFor();
    expect(await page.getByTestId("warning-added").count()).toBeGreaterThan(0);
    await shot(page, "trust-diff-lost");
    // The other way round the warnings went away: shown neutrally, not as good news.
    await page.goto(`${baseURL()}/cases/${id}/diff?from=3&to=2`);
    expect(await page.getByTestId("diff-equilibrium").getAttribute("data-status")).toBe("added");
    const removed = page.getByTestId("warning-removed").first();
    await removed.waitFor();
    expect(await removed.getAttribute("class")).not.toMatch(/moss|green/);
    expect(await removed.textContent()).toMatch(/^− no longer raised: /);
    await shot(page, "trust-diff-removed-warning");
  });

  it("approving asks first and carries the optional note into the sign-off record", async () => {
    const { page } = b;
    await page.goto(`${baseURL()}/cases/${id}`);
    const panel = page.getByRole("form", { name: "Review decision" });
    await panel.getByLabel("Approve").check();
    await panel.getByLabel("Note for the record (optional)").fill("Accepted as a screening estimate at 1 bar ideal gas (invented).");
    await panel.getByRole("button", { name: "Approve case" }).click();
    const dialog = page.getByRole("dialog");
    await dialog.getByText("Approve revision 3?").waitFor();
    await dialog.getByTestId("confirm-reason").getByText("Note: Accepted as a screening estimate").waitFor();
    await dialog.getByRole("button", { name: "Approve", exact: true }).click();
    await page.waitForFunction(() => document.querySelector('[data-testid="case-status"]')?.getAttribute("data-status") === "approved");
    expect(await page.getByTestId("decided-by").textContent()).toMatch(/^by Rory Achebe, \d{4}-\d{2}-\d{2} \d{2}:\d{2} UTC$/);
    await page.goto(`${baseURL()}/cases/${id}/report`);
    const record = page.getByTestId("sign-off");
    expect(await record.getByTestId("sign-off-status").textContent()).toMatch(/^Approved by Rory Achebe, \d{4}-\d{2}-\d{2} \d{2}:\d{2} UTC$/);
    expect(await record.getByTestId("sign-off-reason").textContent()).toBe("Accepted as a screening estimate at 1 bar ideal gas (invented).");
    expect(await record.getByTestId("sign-off-author").textContent()).toBe("Erin Okafor");
    await signOut(page);
  });
});

describe("the printed report is a sign-off record (item 10)", () => {
  it("the approved reformer names its reviewer, the decision, the hash, the engine and each pin's approver", async () => {
    const { page } = b;
    await signIn(page, "erin.engineer@example.test");
    const id = await openCase(page, "Reformer outlet near 1100 K");
    // The status line names the reviewer after the decision, and the author separately.
    const line = (await page.getByTestId("status-line").textContent())!;
    expect(line).toMatch(/^Approved\s*by Rory Achebe, /);
    expect(line).toContain("Author: Erin Okafor");
    expect(line).not.toMatch(/Approved\s*by Erin/);
    await page.goto(`${baseURL()}/cases/${id}/report`);
    const record = page.getByTestId("sign-off");
    await record.waitFor();
    expect(await record.getByTestId("sign-off-status").textContent()).toMatch(/^Approved by Rory Achebe, /);
    expect(await record.getByTestId("sign-off-author").textContent()).toBe("Erin Okafor");
    expect(await record.getByTestId("sign-off-reviewer").textContent()).toBe("Rory Achebe");
    expect(await record.getByTestId("sign-off-decision").textContent()).toBe("Approved");
    expect(await record.getByTestId("sign-off-at").textContent()).toMatch(/^\d{4}-\d{2}-\d{2} \d{2}:\d{2} UTC$/);
    expect(await record.getByTestId("sign-off-engine").textContent()).toMatch(/\S/);
    expect(await record.textContent()).toMatch(/Revision\s*1, submitted by Erin Okafor/);
    expect(await record.locator("code").textContent()).toMatch(/^[0-9a-f]{64}$/);
    const approvers = await page.getByTestId("pin-approver").allTextContents();
    expect(approvers.length).toBeGreaterThanOrEqual(4);
    for (const a of approvers) expect(a).toBe("published reference set");
    await page.emulateMedia({ media: "print" });
    await shot(page, "report-sign-off-print");
    await page.emulateMedia({ media: "screen" });
    await shot(page, "report-sign-off");
    await signOut(page);
  });
});

describe("the builder converts what was typed when the unit changes (item 2)", () => {
  it("300 and 1500 K become 26.85 and 1226.85 °C; a 10 K step becomes 18 °F; 298.15 K reads 25 °C", async () => {
    const { page } = b;
    await signIn(page, "erin.engineer@example.test");
    await page.goto(`${baseURL()}/cases/new`);
    await page.getByLabel("From (K)").fill("300");
    await page.getByLabel("To (K)").fill("1500");
    await page.getByLabel("Step (K)").fill("10");
    await page.getByLabel("Temperature unit", { exact: true }).selectOption("degC");
    expect(await page.getByLabel("From (°C)").inputValue()).toBe("26.85");
    expect(await page.getByLabel("To (°C)").inputValue()).toBe("1226.85");
    expect(await page.getByLabel("Step (°C)").inputValue()).toBe("10");
    await page.getByLabel("Temperature unit", { exact: true }).selectOption("degF");
    expect(await page.getByLabel("From (°F)").inputValue()).toBe("80.33");
    expect(await page.getByLabel("Step (°F)").inputValue()).toBe("18");
    await page.getByLabel("Temperature unit", { exact: true }).selectOption("K");
    expect(await page.getByLabel("From (K)").inputValue()).toBe("300");
    expect(await page.getByLabel("To (K)").inputValue()).toBe("1500");
    expect(await page.getByLabel("Step (K)").inputValue()).toBe("10");
    await page.getByLabel("Reference temperature unit").selectOption("degC");
    expect(await page.getByLabel("Reference temperature", { exact: true }).inputValue()).toBe("25");
    await page.getByLabel("Temperature unit", { exact: true }).selectOption("degC");
    await shot(page, "trust-builder-unit-switch");
    await signOut(page);
  });
});

describe("the team page shows the stored role (item 3)", () => {
  it("after Role saved the select shows the new role, and a second save does not put the old one back", async () => {
    const { page } = b;
    await signIn(page, "alex.admin@example.test");
    await page.goto(`${baseURL()}/team`);
    const row = page.getByTestId("member-row").filter({ hasText: "stella.steward@example.test" });
    const select = row.getByLabel("Role of Stella Marsh");
    const save = async (label: string) => {
      const done = page.waitForResponse((r) => r.request().method() === "POST" && r.url().includes("/team"));
      await row.getByRole("button", { name: "Save role" }).click();
      await done;
      await row.getByText(`Role saved: ${label}.`).waitFor();
      // Let the transition that carries the answer finish rendering.
      await row.locator("button:not([disabled])", { hasText: "Save role" }).waitFor();
      await page.waitForTimeout(300);
    };
    expect(await select.inputValue()).toBe("steward");
    try {
      await select.selectOption("reviewer");
      await save("Reviewer");
      expect(await select.inputValue()).toBe("reviewer");
      await shot(page, "team-role-saved");
      // Saving again keeps what is stored.
      await save("Reviewer");
      expect(await select.inputValue()).toBe("reviewer");
      await page.reload();
      expect(await select.inputValue()).toBe("reviewer");
    } finally {
      // Put Stella back for the other tests, whatever happened above.
      await page.goto(`${baseURL()}/team`);
      await select.selectOption("steward");
      await save("Steward");
    }
    expect(await select.inputValue()).toBe("steward");
    await page.reload();
    expect(await select.inputValue()).toBe("steward");
    await shot(page, "team");
    await signOut(page);
  });
});

describe("phase is chosen, never a silent cr (item 4), and library work can be taken back (item 15)", () => {
  it("fitting N2 data offers its gas phase by default, a new species asks, and the fit keeps the phase", async () => {
    const { page } = b;
    await signIn(page, "sam.steward@example.test");
    await page.goto(`${baseURL()}/library/upload`);
    await page.getByLabel("Species measured").selectOption(await optionValue(page, "Species measured", /^N2 · /));
    expect(await page.getByLabel("Phase measured").inputValue()).toBe("g");
    await page.getByLabel("Species measured").selectOption("new");
    expect(await page.getByLabel("Phase measured").inputValue()).toBe("");
    await page.getByLabel("Species measured").selectOption(await optionValue(page, "Species measured", /^N2 · /));
    expect(await page.getByLabel("Phase measured").inputValue()).toBe("g");
    await page.getByLabel("Dataset name").fill("N2 Cp check (synthetic)");
    // Synthetic, invented for this test (close to the published N2 Cp, from memory).
    await page.getByLabel("Pasted data").fill("T (K)\tCp (J/mol/K)\n300\t29.1\n400\t29.2\n500\t29.6\n600\t30.1\n700\t30.8\n800\t31.4\n");
    await page.getByRole("button", { name: "Check the rows" }).click();
    await page.getByTestId("csv-preview").getByText("6 rows").waitFor();
    await page.getByRole("button", { name: "Upload dataset" }).click();
    await page.getByText(/Saved “N2 Cp check \(synthetic\)”: 6 points/).waitFor();
    expect(await page.getByLabel("Phase", { exact: true }).inputValue()).toBe("g");
    const options = await page.getByLabel("Phase", { exact: true }).locator("option").allTextContents();
    expect(options).toEqual(expect.arrayContaining(["Choose a phase…", "gas (g) · in the library", "liquid (l)", "solid (cr)"]));
    await shot(page, "trust-fit-phase");
  });

  it("the dataset list and detail show the upload with its phase and points", async () => {
    const { page } = b;
    await page.goto(`${baseURL()}/library`);
    await page.getByRole("link", { name: "Datasets" }).click();
    const row = page.getByTestId("dataset-list").locator("tr", { hasText: "N2 Cp check (synthetic)" });
    expect(await row.textContent()).toContain("gas (g)");
    await row.getByRole("link").click();
    await page.getByRole("heading", { level: 1, name: "N2 Cp check (synthetic)" }).waitFor();
    expect(await page.getByTestId("dataset-points").locator("tbody tr").count()).toBe(6);
    expect(await page.getByTestId("dataset-record").textContent()).toContain("Phase measuredgas (g)");
    await page.getByTestId("dataset-chart").locator("svg").first().waitFor();
    await shot(page, "library-dataset");
  });

  it("a new model of N2 starts in the gas phase; a species with several phases must be told", async () => {
    const { page } = b;
    await page.goto(`${baseURL()}/library/new`);
    await page.getByLabel("Species", { exact: true }).selectOption(await optionValue(page, "Species", /^H2O · /));
    expect(await page.getByLabel("Segment 1 phase").inputValue()).toBe("");
    await page.getByText("Choose a phase.").first().waitFor();
    await page.getByLabel("Species", { exact: true }).selectOption(await optionValue(page, "Species", /^N2 · /));
    expect(await page.getByLabel("Segment 1 phase").inputValue()).toBe("g");
    await page.getByLabel("Model name").fill("N2 take-back check (synthetic)");
    await page.getByLabel("Segment 1 cpJ").fill("29.1");
    await page.getByRole("checkbox", { name: "Anchor (H and S at one temperature)" }).check();
    expect(await page.getByLabel("Anchor phase").inputValue()).toBe("g");
    await page.getByLabel("Anchor H (kJ/mol)").fill("0");
    await page.getByLabel("Anchor S (J/(mol·K))").fill("191.6");
    await page.getByLabel("Citation").fill("Synthetic, invented for this test");
    await page.getByRole("button", { name: "Create draft" }).click();
    await page.waitForURL(/\/library\/versions\/\d+$/);
    expect(await page.getByTestId("segments-table").textContent()).toContain("gas");
  });

  it("the author proposes, withdraws and deletes the draft, each after a confirmation", async () => {
    const { page } = b;
    const url = page.url();
    await page.getByRole("button", { name: "Propose for approval" }).click();
    await page.locator('[data-testid="version-status"][data-status="proposed"]').first().waitFor();
    await page.getByRole("button", { name: "Withdraw proposal" }).click();
    await page.getByRole("dialog").getByText("Withdraw this proposal?").waitFor();
    await page.getByRole("dialog").getByRole("button", { name: "Withdraw", exact: true }).click();
    await page.locator('[data-testid="version-status"][data-status="draft"]').first().waitFor();
    await page.getByRole("button", { name: "Delete…" }).click();
    await shot(page, "trust-delete-confirm");
    await page.getByRole("dialog").getByRole("button", { name: "Cancel" }).click();
    expect(page.url()).toBe(url);
    await page.getByRole("button", { name: "Delete…" }).click();
    await page.getByRole("dialog").getByRole("button", { name: "Delete", exact: true }).click();
    await page.waitForURL(/\/library\/species\/\d+$/);
    expect((await page.request.get(`${baseURL()}/api/v1/versions/${url.split("/").pop()}`)).status()).toBe(404);
  });

  it("an export's file name says what it holds and the date", async () => {
    const { page } = b;
    await page.goto(`${baseURL()}/library/transfer`);
    const day = new Date().toISOString().slice(0, 10);
    const [all] = await Promise.all([page.waitForEvent("download"), page.getByRole("link", { name: "Export approved versions" }).click()]);
    expect(all.suggestedFilename()).toBe(`heatpath-library-all-sets-approved-${day}.json`);
    await signOut(page);
  });
});

describe("the audit trail on screen, and proposals from Home (item 13)", () => {
  it("a steward filters the trail by record, action and actor", async () => {
    const { page } = b;
    await signIn(page, "sam.steward@example.test");
    const id = await openCase(page, AMMONIA);
    await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Audit" }).click();
    await page.getByRole("heading", { level: 1, name: "Audit trail" }).waitFor();
    await page.getByLabel("Record type").selectOption("case");
    await page.getByLabel("Record id").fill(id);
    await page.getByRole("button", { name: "Filter" }).click();
    await page.waitForURL(/entityType=case/);
    const rows = page.getByTestId("audit-row");
    const records = await rows.locator("td:nth-child(4) a:first-child").allTextContents();
    expect(records.length).toBeGreaterThan(3);
    for (const r of records) expect(r).toBe(`case ${id}`);
    expect(await page.getByTestId("audit-table").textContent()).toContain("case.updated");
    await shot(page, "audit-filtered");
    await page.getByLabel("Action").selectOption("case.returned");
    await page.getByRole("button", { name: "Filter" }).click();
    await page.waitForURL(/action=case.returned/);
    for (const a of await rows.locator("td:nth-child(3)").allTextContents()) expect(a).toBe("case.returned");
    await page.goto(`${baseURL()}/audit`);
    await page.getByLabel("Actor").selectOption({ label: "Rory Achebe" });
    await page.getByRole("button", { name: "Filter" }).click();
    await page.waitForURL(/actorId=\d+/);
    const actors = await rows.locator("td:nth-child(2)").allTextContents();
    expect(actors.length).toBeGreaterThan(0);
    for (const a of actors) expect(a).toBe("Rory Achebe");
    await signOut(page);
  });

  it("an engineer has no audit link and is sent home from /audit", async () => {
    const { page } = b;
    await signIn(page, "erin.engineer@example.test");
    expect(await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Audit" }).count()).toBe(0);
    await page.goto(`${baseURL()}/audit`);
    await page.waitForURL((u) => u.pathname === "/");
    await signOut(page);
  });

  it("Home links a steward straight to a colleague's proposal", async () => {
    const { page } = b;
    // Sam proposes a model of his own (synthetic, invented for this test), so the list does not hang on demo data.
    await signIn(page, "sam.steward@example.test");
    const species = (await (await page.request.get(`${baseURL()}/api/v1/species?q=N2`)).json()) as { items: { id: number; formula: string }[] };
    const n2 = species.items.find((x) => x.formula === "N2")!;
    const data = { segments: [{ phase: "g", form: "constant", tminK: 298.15, tmaxK: 1000, coeffs: { cpJ: 29.1 } }], reference: { tK: 298.15, phase: "g", hkJ: 0, sJ: 191.6 } };
    const created = await page.request.post(`${baseURL()}/api/v1/models`, {
      data: { speciesId: n2.id, name: "N2 home-link check (synthetic)", version: { data, citation: "Synthetic, invented for this test" } },
    });
    expect(created.status()).toBe(201);
    const versionId = ((await created.json()) as { version: { id: number } }).version.id;
    expect((await page.request.post(`${baseURL()}/api/v1/versions/${versionId}/propose`)).status()).toBe(200);
    await signOut(page);

    await signIn(page, "stella.steward@example.test");
    const list = page.getByTestId("home-proposal-list");
    await list.waitFor();
    const link = list.getByRole("link", { name: /^N2 home-link check \(synthetic\) · v1$/ });
    await link.click();
    await page.waitForURL(new RegExp(`/library/versions/${versionId}$`));
    expect(await page.getByRole("heading", { level: 1 }).textContent()).toContain("N2 home-link check (synthetic)");
    expect(await page.getByTestId("version-status").first().getAttribute("data-status")).toBe("proposed");
    await page.getByRole("button", { name: "Approve" }).waitFor();
    await shot(page, "home-proposal-opened");
    await signOut(page);
  });
});
