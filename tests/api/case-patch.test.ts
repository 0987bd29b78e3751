/**
 * PATCH /api/v1/cases/[id] changes only what its body names: the equilibrium feed the builder
 * does not show survives an edit of the step (issue 11, item 1). Feed and pressure are
 * synthetic, invented for this test.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import * as caseRoute from "@/app/api/v1/cases/[id]/route";
import { closeDb } from "@/lib/db";
import { createCase, type CaseDto } from "@/lib/services/cases";
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

// Synthetic, invented for this test.
const equilibrium = { feed: { "CO(g)": 1, "H2O(g)": 3 }, feedUnit: "kmol/h", pressure: "30 bar", key: "CO(g)", reactions: [], extraTerms: [], inert: [] };

async function patch(id: number, body: unknown) {
  const response = await caseRoute.PATCH(jsonRequest("PATCH", `/api/v1/cases/${id}`, body), ctx({ id: String(id) }) as { params: Promise<{ id: string }> });
  return { status: response.status, body: (await bodyOf(response)) as { case: CaseDto; error?: { code: string; details?: { fields?: Record<string, string> } } } };
}

describe("PATCH a case", () => {
  it("keeps the saved equilibrium feed when the body sends the builder's fields only", async () => {
    const erin = (await signInAs("engineer"))!;
    const c = await createCase(erin, caseInputSchema.parse(shiftCase(pins, { equilibrium })));
    // What the builder sends: every field it shows, no equilibrium.
    const { equilibrium: _omitted, ...shown } = caseInputSchema.parse(shiftCase(pins, { temperatures: { fromK: 480, toK: 700, stepK: 10 } }));
    const answer = await patch(c.id, { ...shown, lockVersion: c.lockVersion });
    expect(answer.status).toBe(200);
    expect(answer.body.case.inputs.temperatures).toEqual({ fromK: 480, toK: 700, stepK: 10 });
    expect(answer.body.case.inputs.equilibrium).toEqual(equilibrium);
  });

  it("changes one field and leaves every other one as stored", async () => {
    const erin = (await signInAs("engineer"))!;
    const c = await createCase(erin, caseInputSchema.parse(shiftCase(pins, { equilibrium, notes: "Kept notes", toleranceKFactor: 2 })));
    const answer = await patch(c.id, { temperatures: { fromK: 480, toK: 700, stepK: 5 }, lockVersion: c.lockVersion });
    expect(answer.status).toBe(200);
    const after = answer.body.case;
    expect(after.title).toBe(c.title);
    expect(after.notes).toBe("Kept notes");
    expect(after.inputs).toEqual({ ...c.inputs, temperatures: { fromK: 480, toK: 700, stepK: 5 } });
    expect(after.lockVersion).toBe(c.lockVersion + 1);
  });

  it("clears the feed only when the body says equilibrium: null", async () => {
    const erin = (await signInAs("engineer"))!;
    const c = await createCase(erin, caseInputSchema.parse(shiftCase(pins, { equilibrium })));
    const answer = await patch(c.id, { equilibrium: null, lockVersion: c.lockVersion });
    expect(answer.status).toBe(200);
    expect(answer.body.case.inputs.equilibrium).toBeNull();
  });

  it("refuses a misspelt field and checks the merged case as a whole", async () => {
    const erin = (await signInAs("engineer"))!;
    const c = await createCase(erin, caseInputSchema.parse(shiftCase(pins)));
    const misspelt = await patch(c.id, { titel: "Typo", lockVersion: c.lockVersion });
    expect(misspelt.status).toBe(422);
    // The stored span ends at 700 K; a start above it is refused although the body names only the start.
    const merged = await patch(c.id, { temperatures: { fromK: 900, toK: 700, stepK: 20 }, lockVersion: c.lockVersion });
    expect(merged.status).toBe(422);
    expect(merged.body.error?.details?.fields?.["temperatures.toK"]).toBe("The span must end above where it starts.");
    const noLock = await patch(c.id, { title: "No lock" });
    expect(noLock.status).toBe(422);
  });
});
