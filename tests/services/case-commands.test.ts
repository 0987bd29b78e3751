/**
 * The case writes present the row they wrote: each answers exactly what a fresh read answers,
 * a submission loads the case once, and a case that moved while it was being evaluated is
 * refused in the write itself.
 */
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { closeDb, models } from "@/lib/db";
import { addComment, createCase, getCase, listComments, submitCase, updateCase } from "@/lib/services/cases";
import { decideCase } from "@/lib/services/reviews";
import { caseInputSchema } from "@/lib/validation/cases";
import { actorOf } from "../helpers/actors";
import { shiftCase } from "../helpers/cases";
import { freshDatabase, tableCounts } from "../helpers/db";
import { ensureReferenceLibrary, type RefFormula } from "../helpers/reference-library";

let pins: Record<RefFormula, number>;
beforeAll(async () => {
  await freshDatabase();
  pins = await ensureReferenceLibrary();
});
afterAll(() => closeDb());

describe("case writes", () => {
  it("answer what a fresh read answers: create, edit, comment, submit, decide", async () => {
    const erin = await actorOf("engineer");
    const rory = await actorOf("reviewer");
    const created = await createCase(erin, caseInputSchema.parse(shiftCase(pins, { title: "Presented from its row" })));
    expect(created).toEqual(await getCase(erin, created.id));
    const edited = await updateCase(erin, created.id, { ...caseInputSchema.parse(shiftCase(pins, { title: "Presented, edited" })), lockVersion: created.lockVersion });
    expect(edited.title).toBe("Presented, edited");
    expect(edited).toEqual(await getCase(erin, created.id));
    const comment = await addComment(rory, created.id, { body: "Draft looks fine so far." });
    expect([comment]).toEqual(await listComments(erin, created.id));
    const submitted = await submitCase(erin, created.id, edited.lockVersion);
    expect(submitted.status).toBe("submitted");
    expect(submitted.latestRevision).toBe(1);
    expect(submitted).toEqual(await getCase(erin, created.id));
    const onRevision = await addComment(rory, created.id, { body: "Reading revision 1.", revision: 1 });
    expect(onRevision.revision).toBe(1);
    expect((await listComments(erin, created.id)).at(-1)).toEqual(onRevision);
    const decided = await decideCase(rory, created.id, { decision: "returned", reason: "Say which bed." });
    expect(decided.status).toBe("returned");
    expect(decided).toEqual(await getCase(rory, created.id));
  });

  it("a submission loads the case once", async () => {
    const erin = await actorOf("engineer");
    const c = await createCase(erin, caseInputSchema.parse(shiftCase(pins, { title: "Loaded once" })));
    const findByPk = vi.spyOn(models().Case, "findByPk");
    try {
      await submitCase(erin, c.id, c.lockVersion);
      expect(findByPk).toHaveBeenCalledTimes(1);
    } finally {
      findByPk.mockRestore();
    }
  });

  it("a case edited while its submission was being evaluated is refused (409 with the current lockVersion), nothing written", async () => {
    const erin = await actorOf("engineer");
    const c = await createCase(erin, caseInputSchema.parse(shiftCase(pins, { title: "Moved meanwhile" })));
    const before = await tableCounts();
    const { ModelVersion, Case } = models();
    const original = ModelVersion.findAll.bind(ModelVersion);
    // The submission loads its pins before it evaluates: someone else's edit lands right then.
    const findAll = vi.spyOn(ModelVersion, "findAll").mockImplementationOnce(async (options) => {
      await Case.update({ lockVersion: c.lockVersion + 1 }, { where: { id: c.id } });
      return original(options);
    });
    try {
      await expect(submitCase(erin, c.id, c.lockVersion)).rejects.toMatchObject({ status: 409, details: { lockVersion: c.lockVersion + 1 } });
    } finally {
      findAll.mockRestore();
    }
    expect(await tableCounts()).toEqual(before);
    expect((await getCase(erin, c.id)).status).toBe("draft");
  });
});
