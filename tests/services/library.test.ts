/**
 * The library workflow through its services: drafts with optimistic locking, proposals,
 * four-eyes decisions, supersession, immutability (service and database), copies of
 * reference versions, visibility across teams, mail, audit, and the JSON round trip.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeDb, models, registry } from "@/lib/db";
import * as lib from "@/lib/services/library";
import { computeCurve } from "@/lib/thermo/curve";
import type { ListModelsQuery } from "@/lib/validation/library";
import { actorOf } from "../helpers/actors";
import { freshDatabase, tableCounts } from "../helpers/db";
import { createDraft, solidData as solid, uniqueName } from "../helpers/library";
import { refusal } from "../helpers/refusal";

beforeAll(() => freshDatabase());
afterAll(() => closeDb());

const newDraft = (who: "steward" | "engineer" = "steward", name = uniqueName("Test model")) => createDraft(who, name);

describe("drafts and optimistic locking", () => {
  it("an edit with the current lockVersion saves and bumps it; a stale one is 409 with the current version", async () => {
    const sam = await actorOf("steward");
    const stella = await actorOf("steward2");
    const { version } = await newDraft();
    expect(version).toMatchObject({ status: "draft", versionNumber: 1, lockVersion: 0, scope: "team" });
    const saved = await lib.editVersion(sam, version.id, { lockVersion: 0, data: solid(125), changeNote: "Cp raised" });
    expect(saved.lockVersion).toBe(1);
    // Stella opened lockVersion 0 before Sam saved.
    const stale = await refusal(lib.editVersion(stella, version.id, { lockVersion: 0, data: solid(130) }));
    expect(stale.status).toBe(409);
    expect(stale.message).toBe("Someone saved version 1 after you opened it; review their changes and edit again.");
    const current = (stale.details as { current: lib.VersionDto }).current;
    expect(current.lockVersion).toBe(1);
    expect(current.data.segments[0].coeffs).toEqual({ cpJ: 125 });
    expect((await lib.getVersion(sam, version.id)).data.segments[0].coeffs).toEqual({ cpJ: 125 });
  });

  it("an engineer edits only her own drafts; a reviewer drafts nothing", async () => {
    const erin = await actorOf("engineer");
    const rory = await actorOf("reviewer");
    const { version } = await newDraft("steward");
    const e = await refusal(lib.editVersion(erin, version.id, { lockVersion: 0, changeNote: "x" }));
    expect([e.status, e.message]).toEqual([403, "Only the author or a steward can change this draft."]);
    const own = await newDraft("engineer");
    await expect(lib.editVersion(erin, own.version.id, { lockVersion: 0, changeNote: "mine" })).resolves.toMatchObject({ changeNote: "mine" });
    expect((await refusal(newDraft("reviewer" as "engineer"))).status).toBe(403);
    expect((await refusal(lib.editVersion(rory, own.version.id, { lockVersion: 1 }))).status).toBe(403);
  });
});

describe("proposal, four-eyes decision and supersession", () => {
  it("the author cannot approve; another steward can, and the previous approved version becomes superseded", async () => {
    const sam = await actorOf("steward");
    const stella = await actorOf("steward2");
    const { model, version: v1 } = await newDraft();
    await lib.proposeVersion(sam, v1.id);
    const own = await refusal(lib.approveVersion(sam, v1.id));
    expect([own.status, own.code, own.message]).toEqual([403, "own-work", "You wrote this version: another steward must approve or reject it."]);
    expect((await refusal(lib.rejectVersion(sam, v1.id, "no"))).code).toBe("own-work");
    const approved1 = await lib.approveVersion(stella, v1.id, "Looks right.");
    expect(approved1).toMatchObject({ status: "approved", decidedByName: "Stella Marsh", decisionReason: "Looks right." });

    const v2 = await lib.createVersion(sam, model.id, { fromVersionId: v1.id });
    expect(v2).toMatchObject({ versionNumber: 2, status: "draft" });
    await lib.editVersion(sam, v2.id, { lockVersion: 0, data: solid(122) });
    await lib.proposeVersion(sam, v2.id);
    await lib.approveVersion(stella, v2.id);
    const detail = await lib.getModel(sam, model.id);
    expect(detail.versions.map((v) => [v.versionNumber, v.status])).toEqual([
      [2, "approved"],
      [1, "superseded"],
    ]);

    const trail = await lib.versionAudit(sam, v1.id);
    expect(trail.map((e) => e.action)).toEqual(["model-version.created", "model-version.proposed", "model-version.approved", "model-version.superseded"]);
    expect(trail[2].actorName).toBe("Stella Marsh");
  });

  it("a rejection needs a steward other than the author and keeps the reason; proposals and decisions are mailed", async () => {
    const erin = await actorOf("engineer");
    const stella = await actorOf("steward2");
    const { version } = await newDraft("engineer");
    const before = await models().MailMessage.count();
    await lib.proposeVersion(erin, version.id);
    const proposedMail = await models().MailMessage.findAll({ where: { kind: "model-proposed" }, order: [["id", "ASC"]] });
    // Both Larkspur stewards hear of Erin's proposal.
    expect(
      proposedMail
        .slice(-2)
        .flatMap((m) => m.recipients)
        .sort(),
    ).toEqual(["sam.steward@example.test", "stella.steward@example.test"]);
    const rejected = await lib.rejectVersion(stella, version.id, "Range stops at 900 K; the reformer runs at 1100 K.");
    expect(rejected).toMatchObject({ status: "rejected", decisionReason: "Range stops at 900 K; the reformer runs at 1100 K." });
    const decided = await models().MailMessage.findOne({ where: { kind: "model-decided" }, order: [["id", "DESC"]] });
    expect(decided!.recipients).toEqual(["erin.engineer@example.test"]);
    expect(decided!.body).toContain("Reason: Range stops at 900 K");
    expect(await models().MailMessage.count()).toBe(before + 3);
    expect((await refusal(lib.approveVersion(stella, version.id))).status).toBe(409);
  });

  it("a draft the engine cannot evaluate is not proposed", async () => {
    const sam = await actorOf("steward");
    const { version } = await lib.createModel(sam, {
      species: { formula: "ZrO2", displayName: "Zirconia" },
      name: "No anchor",
      version: { data: { segments: [{ phase: "cr", form: "constant", tminK: 250, tmaxK: 900, coeffs: { cpJ: 100 } }] }, citation: "Synthetic, invented for this test" },
    });
    await expect(lib.proposeVersion(sam, version.id)).rejects.toMatchObject({ name: "EngineRefusal" });
    expect((await lib.getVersion(sam, version.id)).status).toBe("draft");
  });
});

describe("immutability", () => {
  it("the service refuses to edit approved and superseded versions", async () => {
    const sam = await actorOf("steward");
    const stella = await actorOf("steward2");
    const { model, version } = await newDraft();
    await lib.proposeVersion(sam, version.id);
    await lib.approveVersion(stella, version.id);
    const e = await refusal(lib.editVersion(sam, version.id, { lockVersion: 2, data: solid(1) }));
    expect([e.status, e.code, e.message]).toEqual([409, "immutable", "Version 1 is approved and can never change; start a new draft from it instead."]);
    const v2 = await lib.createVersion(sam, model.id, { fromVersionId: version.id });
    await lib.proposeVersion(sam, v2.id);
    await lib.approveVersion(stella, v2.id);
    expect((await refusal(lib.editVersion(stella, version.id, { lockVersion: 3, citation: "changed" }))).message).toBe(
      "Version 1 is superseded and can never change; start a new draft from it instead.",
    );
  });

  it("the database refuses too: a direct UPDATE of an approved row aborts, approved → superseded passes", async () => {
    const { sequelize } = registry();
    const dbError = async (sql: string) => {
      try {
        await sequelize.query(sql);
      } catch (e) {
        const err = e as { original?: Error; message: string };
        return err.original?.message ?? err.message;
      }
      return "no error";
    };
    const ref = await models().ModelVersion.findOne({ where: { teamId: null, status: "approved" } });
    expect(await dbError(`UPDATE model_versions SET citation = 'tampered' WHERE id = ${ref!.id}`)).toMatch(/approved model versions are immutable/);
    expect(await dbError(`UPDATE model_versions SET status = 'draft' WHERE id = ${ref!.id}`)).toMatch(/approved model versions are immutable/);
    expect(await dbError(`DELETE FROM model_versions WHERE id = ${ref!.id}`)).toMatch(/approved model versions cannot be deleted/);
    expect((await models().ModelVersion.findByPk(ref!.id))!.citation).not.toBe("tampered");
    const sam = await actorOf("steward");
    const stella = await actorOf("steward2");
    const { version } = await newDraft();
    await lib.proposeVersion(sam, version.id);
    await lib.approveVersion(stella, version.id);
    expect(await dbError(`UPDATE model_versions SET status = 'superseded' WHERE id = ${version.id}`)).toBe("no error");
    expect(await dbError(`UPDATE model_versions SET status = 'approved' WHERE id = ${version.id}`)).toMatch(/immutable/);
  });

  it("the reference library is read-only; a steward copies a reference version into a team model", async () => {
    const sam = await actorOf("steward");
    const erin = await actorOf("engineer");
    const ref = await models().ModelVersion.findOne({ where: { teamId: null, status: "approved" } });
    const e = await refusal(lib.editVersion(sam, ref!.id, { lockVersion: 0, citation: "x" }));
    expect([e.status, e.code]).toEqual([403, "read-only"]);
    expect((await refusal(lib.copyReferenceVersion(erin, ref!.id))).status).toBe(403);
    const copy = await lib.copyReferenceVersion(sam, ref!.id);
    expect(copy).toMatchObject({ status: "draft", scope: "team", data: ref!.data, citation: ref!.citation });
    expect(copy.model.copiedFromId).toBe(ref!.modelId);
    // A second copy lands in the same team model.
    const again = await lib.copyReferenceVersion(sam, ref!.id);
    expect([again.modelId, again.versionNumber]).toEqual([copy.modelId, 2]);
  });
});

describe("visibility", () => {
  it("another team's records are 404; the reference library is visible to all", async () => {
    const tom = await actorOf("other");
    const { model, version } = await newDraft();
    expect((await refusal(lib.getVersion(tom, version.id))).status).toBe(404);
    expect((await refusal(lib.getModel(tom, model.id))).status).toBe(404);
    const list = await lib.listModels(tom, { q: "", phase: "", form: "", status: "all", scope: "all", page: 1, pageSize: 100 });
    expect(list.items.every((m) => m.scope === "reference")).toBe(true);
    // 60 reference models: 26 from cp-coefficients.json, 34 from cp-coefficients-more.json.
    expect(list.total).toBe(60);
  });

  it("the list shows approved versions by default and open drafts marked; it searches, filters and pages on the server", async () => {
    const erin = await actorOf("engineer");
    const q: ListModelsQuery = { q: "", phase: "", form: "", status: "current", scope: "all", page: 1, pageSize: 10 };
    const page1 = await lib.listModels(erin, q);
    expect(page1.items).toHaveLength(10);
    expect(page1.pages).toBe(Math.ceil(page1.total / 10));
    const support = (await lib.listModels(erin, { ...q, q: "NiAl2O4", pageSize: 50 })).items;
    // The demo support model has no approved version: its proposal shows, marked proposed.
    expect(support.find((m) => m.name.startsWith("NiAl2O4 · fitted"))?.shown?.status).toBe("proposed");
    const methane = (await lib.listModels(erin, { ...q, q: "methane", pageSize: 50 })).items;
    expect(methane.map((m) => m.species.formula).every((f) => f === "CH4")).toBe(true);
    expect(methane.length).toBe(5); // 2015 anharmonic + RRHO, GRI, Shomate, Larkspur's team copy
    const shomateOnly = (await lib.listModels(erin, { ...q, form: "shomate", pageSize: 100 })).items;
    expect(shomateOnly.every((m) => m.shown!.forms.includes("shomate"))).toBe(true);
    const liquids = (await lib.listModels(erin, { ...q, phase: "l", status: "approved", pageSize: 100 })).items.map((m) => m.name);
    expect(liquids.sort()).toEqual(["H2O · NASA-7 ice, liquid and gas (third-millennium 2015)", "H2O · Shomate liquid (NIST-JANAF fit)"]);
  });
});

describe("export and import", () => {
  it("round-trips: export → import as drafts → export again gives the same models and data", async () => {
    const sam = await actorOf("steward");
    const list = await lib.listModels(sam, { q: "CO2", phase: "", form: "", status: "approved", scope: "reference", page: 1, pageSize: 10 });
    const ids = list.items.map((m) => m.id);
    expect(ids).toHaveLength(3);
    const file = await lib.exportLibrary(sam, { models: ids, versions: "approved" });
    expect(file.format).toBe("heatpath.cp-library");
    const imported = await lib.importLibrary(sam, JSON.parse(JSON.stringify(file)));
    expect(imported.versions).toBe(3);
    const again = await lib.exportLibrary(sam, { models: imported.models.map((m) => m.id), versions: "all" });
    const strip = (f: typeof file) => f.models.map((m) => ({ ...m, versions: m.versions.map((v) => ({ data: v.data, citation: v.citation, uncertainty: v.uncertainty })) }));
    expect(strip(again)).toEqual(strip(file));
    const drafts = await Promise.all(imported.models.flatMap((m) => m.versionIds).map((id) => lib.getVersion(sam, id)));
    expect(drafts.every((d) => d.status === "draft" && d.scope === "team")).toBe(true);
  });

  it("a broken file is refused with the field named and nothing is saved", async () => {
    const sam = await actorOf("steward");
    const before = await tableCounts();
    const bad = {
      format: "heatpath.cp-library",
      formatVersion: 1,
      models: [
        { species: { formula: "SiO2", displayName: "Silica" }, name: "Silica", family: "custom", versions: [{ versionNumber: 1, status: "draft", data: solid(), citation: "ok" }] },
        {
          species: { formula: "SiO2", displayName: "Silica" },
          name: "Silica 2",
          family: "custom",
          versions: [{ versionNumber: 1, status: "draft", data: { segments: [{ phase: "cr", form: "nasa7", tminK: 300, tmaxK: 900, coeffs: [1, 2, 3] }] }, citation: "ok" }],
        },
      ],
    };
    const e = await refusal(lib.importLibrary(sam, bad));
    expect([e.status, e.message]).toEqual([422, "models.1.versions.0.data.segments.0.coeffs: expected 7 coefficients a1..a7"]);
    expect((await refusal(lib.importLibrary(sam, { format: "other" }))).message).toBe('format: Not a Heatpath library file: "format" must be "heatpath.cp-library".');
    expect(await tableCounts()).toEqual(before);
  });
});

describe("curves", () => {
  it("mark extrapolated points outside each chain's range", async () => {
    const sam = await actorOf("steward");
    const c = computeCurve(solid(), { fromK: 200, toK: 1000, points: 9 });
    expect(c.chains).toEqual([{ phase: "cr", tminK: 250, tmaxK: 900 }]);
    expect(c.points.filter((p) => p.extrapolated).map((p) => p.tK)).toEqual([200, 1000]);
    // Constant Cp: H(T) − H(298.15) = Cp·ΔT (common practice closed form).
    const at = c.points.find((p) => p.tK === 400)!;
    expect(at.hkJ).toBeCloseTo(-1000 + (120 * (400 - 298.15)) / 1000, 9);
    await expect(lib.previewCurve(sam, { data: { segments: [] } })).rejects.toMatchObject({ name: "EngineRefusal" });
    // An empty span is the engine's refusal too (the route answers it 422), not an HTTP error thrown from the computation.
    expect(() => computeCurve(solid(), { fromK: 500, toK: 400 })).toThrow(
      expect.objectContaining({ name: "EngineRefusal", code: "invalid-request", message: "toK: the upper temperature must be above the lower one." }),
    );
  });
});

describe("species phase points", () => {
  it("a reference species shows its boiling and triple points with the source; a team species has none", async () => {
    const erin = await actorOf("engineer");
    const ch4 = await models().Species.findOne({ where: { teamId: null, formula: "CH4" } });
    const dto = await lib.getSpecies(erin, ch4!.id);
    // CRC Handbook of Chemistry and Physics (from memory): CH4 111.66 K, 90.69 K.
    expect(dto.phasePoints).toEqual({ boilingPointK: 111.66, triplePointK: 90.69, citation: expect.stringMatching(/\(from memory\)/) });
    const mine = await lib.createSpecies(erin, { formula: "C4H10", displayName: "Butane (team, for this test)" });
    expect(mine.phasePoints).toBeNull();
  });
});
