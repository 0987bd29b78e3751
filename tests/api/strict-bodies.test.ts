import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeDb, models } from "@/lib/db";
import * as session from "@/app/api/v1/session/route";
import * as comments from "@/app/api/v1/cases/[id]/comments/route";
import * as eqPreview from "@/app/api/v1/equilibrium/preview/route";
import * as eqSave from "@/app/api/v1/equilibrium/cases/[id]/route";
import { signInAs } from "../helpers/actors";
import { freshDatabase, tableCounts } from "../helpers/db";
import { bodyOf, ctx, jsonRequest } from "../helpers/request";

beforeAll(() => freshDatabase());
afterAll(() => closeDb());

/** Every request object is strict: a misspelt field is refused (422), never ignored, and nothing is written. */
describe("misspelt fields in request bodies are refused", () => {
  it("sign-in with an extra field", async () => {
    await signInAs("anonymous");
    const response = await session.POST(jsonRequest("POST", "/api/v1/session", { email: "erin.engineer@example.test", password: "larkspur-demo-2026", remeber: true }), undefined);
    expect(response.status).toBe(422);
    expect(JSON.stringify(await bodyOf(response))).toContain("remeber");
  });

  it("a comment with `revison` instead of `revision` is not attached to another revision", async () => {
    const submitted = await models().Case.findOne({ where: { status: "submitted" } });
    await signInAs("reviewer");
    const before = await tableCounts();
    const response = await comments.POST(
      jsonRequest("POST", `/api/v1/cases/${submitted!.id}/comments`, { body: "Check the purge (synthetic, invented for this test).", revison: 1 }),
      ctx({ id: String(submitted!.id) }) as { params: Promise<{ id: string }> },
    );
    expect(response.status).toBe(422);
    expect(JSON.stringify(await bodyOf(response))).toContain("revison");
    expect(await tableCounts()).toEqual(before);
  });

  it("equilibrium preview and save with a stray top-level field", async () => {
    const draft = await models().Case.findOne({ where: { status: "draft" } });
    await signInAs("engineer");
    const preview = await eqPreview.POST(jsonRequest("POST", "/api/v1/equilibrium/preview", { caseId: draft!.id, equilibrium: null, caseID: 1 }), undefined);
    expect(preview.status).toBe(422);
    expect(JSON.stringify(await bodyOf(preview))).toContain("caseID");
    const before = await tableCounts();
    const save = await eqSave.PUT(
      jsonRequest("PUT", `/api/v1/equilibrium/cases/${draft!.id}`, { lockVersion: draft!.lockVersion, equilibrium: null, lockversion: 0 }),
      ctx({ id: String(draft!.id) }) as { params: Promise<{ id: string }> },
    );
    expect(save.status).toBe(422);
    expect(JSON.stringify(await bodyOf(save))).toContain("lockversion");
    expect(await tableCounts()).toEqual(before);
  });
});
