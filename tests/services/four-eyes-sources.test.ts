/**
 * Four-eyes beyond the editor: the uploader of the measured data a version was fitted to took part
 * in it, and the "proposed" mail goes only to stewards who may decide (not to contributors).
 * Cp numbers are synthetic, invented for this test.
 */
import { Op } from "sequelize";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeDb, models } from "@/lib/db";
import * as ds from "@/lib/services/datasets";
import * as lib from "@/lib/services/library";
import { actorOf } from "../helpers/actors";
import { freshDatabase } from "../helpers/db";
import { createDraft, MAGNESIA, MGO_ANCHOR, solidData as solid, syntheticCpCsv as csv } from "../helpers/library";
import { refusal } from "../helpers/refusal";

beforeAll(() => freshDatabase());
afterAll(() => closeDb());

// The synthetic Cp data (tests/helpers/library.ts), fitted with the MgO anchor.
const fit = { form: "maier-kelley" as const, phase: "cr" as const, reference: MGO_ANCHOR };

let n = 0;
/** A dataset uploaded by `who`, fitted and saved as a draft by Sam. */
async function fittedBySam(uploader: "steward2" | "steward" | "engineer") {
  const up = await actorOf(uploader);
  const dataset = await ds.uploadDataset(up, { name: `Four-eyes run ${++n}`, text: csv, species: MAGNESIA });
  return ds.saveFitAsDraft(await actorOf("steward"), dataset.id, { fit, citation: "Synthetic, invented for this test" });
}

/** Who the "proposed" mail queued by `propose` goes to (one queue row per recipient or several). */
async function proposedMailOf(propose: () => Promise<unknown>): Promise<string[]> {
  const mark = ((await models().MailMessage.max("id")) as number | null) ?? 0;
  await propose();
  const rows = await models().MailMessage.findAll({ where: { kind: "model-proposed", id: { [Op.gt]: mark } } });
  return rows.flatMap((m) => m.recipients).sort();
}

describe("the uploader of a dataset contributed to a version fitted from it", () => {
  it("Stella uploads, Sam fits: Stella is listed as uploader and may not decide; the admin may", async () => {
    const stella = await actorOf("steward2");
    const sam = await actorOf("steward");
    const draft = await fittedBySam("steward2");
    expect(draft.contributors.map((c) => [c.name, c.roles])).toEqual([
      ["Sam Lindqvist", ["author"]],
      ["Stella Marsh", ["uploader"]],
    ]);
    await lib.proposeVersion(sam, draft.id);
    const e = await refusal(lib.approveVersion(stella, draft.id));
    expect([e.status, e.code]).toEqual([403, "own-work"]);
    expect((await refusal(lib.rejectVersion(stella, draft.id, "Range too short"))).code).toBe("own-work");
    await expect(lib.approveVersion(await actorOf("admin"), draft.id)).resolves.toMatchObject({ status: "approved" });
  });

  it("an uploader who fits their own data is only its author; a copy of the unchecked draft keeps the uploader as source", async () => {
    const sam = await actorOf("steward");
    const own = await fittedBySam("steward");
    expect(own.contributors.map((c) => [c.name, c.roles])).toEqual([["Sam Lindqvist", ["author"]]]);

    const erinsFit = await fittedBySam("engineer");
    const copy = await lib.createVersion(sam, erinsFit.modelId, { fromVersionId: erinsFit.id });
    expect(copy.contributors.map((c) => [c.name, c.roles])).toEqual([
      ["Sam Lindqvist", ["author"]],
      ["Erin Okafor", ["source"]],
    ]);
  });
});

describe("the proposed mail goes to the stewards who may decide", () => {
  it("an editing steward does not hear of the proposal; the other steward does", async () => {
    const erin = await actorOf("engineer");
    const sam = await actorOf("steward");
    const { version } = await createDraft("engineer", `Mail ${++n}`);
    await lib.editVersion(sam, version.id, { lockVersion: 0, data: solid(130) });
    expect(await proposedMailOf(() => lib.proposeVersion(erin, version.id))).toEqual(["stella.steward@example.test"]);
  });

  it("a proposing steward does not mail themself; the uploader is left out too", async () => {
    const sam = await actorOf("steward");
    const stella = await actorOf("steward2");
    const { version } = await createDraft("engineer", `Mail ${++n}`);
    expect(await proposedMailOf(() => lib.proposeVersion(stella, version.id))).toEqual(["sam.steward@example.test"]);

    // Stella uploaded, Sam fitted and proposed: no steward may decide, so the admin hears of it.
    const draft = await fittedBySam("steward2");
    expect(await proposedMailOf(() => lib.proposeVersion(sam, draft.id))).toEqual(["alex.admin@example.test"]);
  });
});
