import canonicalize from "canonicalize";
import { CAUTION_TEXT } from "@/lib/cases/caution";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeDb, models } from "@/lib/db";
import { snapshotHash, verifySnapshot } from "@/lib/cases/snapshot";
import { createCase, diffSnapshots, getCase, getResults, getSnapshot, submitCase, updateCase } from "@/lib/services/cases";
import { caseInputSchema } from "@/lib/validation/cases";
import { actorOf } from "../helpers/actors";
import { shiftCase } from "../helpers/cases";
import { freshDatabase, tableCounts } from "../helpers/db";
import { ensureReferenceLibrary, type RefFormula } from "../helpers/reference-library";
import { janafRows } from "../thermo/reference-data";

let pins: Record<RefFormula, number>;

beforeAll(async () => {
  await freshDatabase();
  pins = await ensureReferenceLibrary();
});
afterAll(() => closeDb());

describe("drafts", () => {
  it("an engineer creates a draft that pins the chosen versions and audits it", async () => {
    const erin = await actorOf("engineer");
    const c = await createCase(erin, caseInputSchema.parse(shiftCase(pins)));
    expect(c.status).toBe("draft");
    expect(c.lockVersion).toBe(0);
    expect(c.reaction).toBe("CO(g) + H2O(g) → CO2(g) + H2(g)");
    expect(c.pins.map((p) => p.versionId)).toEqual([pins.CO, pins.H2O, pins.CO2, pins.H2]);
    expect(c.can).toMatchObject({ edit: true, submit: true, review: false });
    expect(await models().AuditEvent.count({ where: { action: "case.created", entityId: String(c.id) } })).toBe(1);
  });

  it("refuses a stale edit with 409 and writes nothing", async () => {
    const erin = await actorOf("engineer");
    const c = await createCase(erin, caseInputSchema.parse(shiftCase(pins)));
    await updateCase(erin, c.id, { ...caseInputSchema.parse(shiftCase(pins, { title: "First edit" })), lockVersion: 0 });
    const before = await tableCounts();
    await expect(updateCase(erin, c.id, { ...caseInputSchema.parse(shiftCase(pins, { title: "Stale edit" })), lockVersion: 0 })).rejects.toMatchObject({
      status: 409,
      details: { lockVersion: 1 },
    });
    expect(await tableCounts()).toEqual(before);
    expect((await getCase(erin, c.id)).title).toBe("First edit");
  });

  it("refuses a pin of another species with the field named", async () => {
    const erin = await actorOf("engineer");
    const bad = shiftCase(pins);
    bad.terms[0].versionId = pins.CH4;
    await expect(createCase(erin, caseInputSchema.parse(bad))).rejects.toMatchObject({
      status: 422,
      details: { fields: { "terms.0.versionId": "That version belongs to CH4, not CO." } },
    });
  });

  it("refuses an unbalanced reaction in the schema", () => {
    const bad = shiftCase(pins);
    bad.terms[3].coefficient = 2;
    const parsed = caseInputSchema.safeParse(bad);
    expect(parsed.success).toBe(false);
    expect(parsed.error!.issues[0].message).toBe("Not balanced: H +2 (products minus reactants).");
  });

  it("a reviewer cannot create a case", async () => {
    await expect(createCase(await actorOf("reviewer"), caseInputSchema.parse(shiftCase(pins)))).rejects.toMatchObject({ status: 403 });
  });
});

describe("live results against published data", () => {
  it("the shift at 1000 K agrees with NIST-JANAF within the NASA-7 tolerance", async () => {
    const erin = await actorOf("engineer");
    const c = await createCase(erin, caseInputSchema.parse(shiftCase(pins, { temperatures: { listK: [1000] } })));
    const r = await getResults(erin, c.id);
    expect(r.source).toBe("live");
    const rows = janafRows().filter((x) => x.T === 1000);
    const dfG = (s: string) => rows.find((x) => x.species === s && x.phase === "g")!.dfG!;
    const logKf = (s: string) => rows.find((x) => x.species === s && x.phase === "g")!.logKf!;
    // NIST-JANAF Tables, 4th ed. (1998), ΔfG° and log Kf of CO2, CO, H2O(g) at 1000 K; tolerance for NASA-7 sets per reference/README.md
    const dG = dfG("CO2") - dfG("CO") - dfG("H2O");
    const log10K = logKf("CO2") - logKf("CO") - logKf("H2O");
    const p = r.result.points[0];
    expect(Math.abs(p.dGkJ - dG)).toBeLessThan(0.3);
    expect(Math.abs(p.log10K - log10K)).toBeLessThan(0.05);
  });
});

describe("submission freezes a snapshot", () => {
  it("stores inputs, pins with citations, engine version, request, result and a canonical hash; mails reviewers, not the author", async () => {
    const erin = await actorOf("engineer");
    const c = await createCase(erin, caseInputSchema.parse(shiftCase(pins)));
    const live = await getResults(erin, c.id);
    const submitted = await submitCase(erin, c.id, c.lockVersion);
    expect(submitted.status).toBe("submitted");
    expect(submitted.snapshots).toHaveLength(1);
    const snap = await models().CaseSnapshot.findOne({ where: { caseId: c.id } });
    expect(snap!.revision).toBe(1);
    expect(snap!.hash).toMatch(/^[0-9a-f]{64}$/);
    expect(snap!.pins.every((p) => p.citation.length > 0 && p.data)).toBe(true);
    expect(snap!.engineVersion).toBe(live.result.engine.version);
    expect(snap!.result.points).toEqual(live.result.points);
    expect(verifySnapshot(snap!)).toBe(true);

    const results = await getResults(erin, c.id);
    expect(results.source).toBe("snapshot");
    expect(results.hash).toBe(snap!.hash);

    const mails = await models().MailMessage.findAll({ where: { kind: "review-requested" } });
    const to = mails.flatMap((m) => m.recipients);
    expect(to).toEqual(expect.arrayContaining(["rory.reviewer@example.test", "alex.admin@example.test"]));
    expect(to).not.toContain("erin.engineer@example.test");
    // The full caution, not a shortened one (issue 11, item 16).
    for (const m of mails) expect(m.body).toContain(CAUTION_TEXT);
    expect(await models().AuditEvent.count({ where: { action: "case.submitted", entityId: String(c.id) } })).toBe(1);
  });

  it("a submitted case shows its stored snapshot and is never recomputed, even when a pinned draft changes", async () => {
    const erin = await actorOf("engineer");
    const { ModelVersion } = models();
    const h2 = await ModelVersion.findByPk(pins.H2);
    const draft = await ModelVersion.create({
      modelId: h2!.modelId,
      teamId: erin.teamId,
      versionNumber: 900,
      status: "draft",
      data: h2!.data,
      citation: "test draft copy",
      uncertainty: null,
      changeNote: null,
      decisionReason: null,
      datasetId: null,
      authorId: erin.userId,
      decidedById: null,
      proposedAt: null,
      decidedAt: null,
    });
    const input = shiftCase(pins);
    input.terms[3].versionId = draft.id;
    const c = await createCase(erin, caseInputSchema.parse(input));
    await submitCase(erin, c.id, c.lockVersion);
    const frozen = await getResults(erin, c.id);
    // Change the draft's Cp: a recomputation would move every number.
    const data = JSON.parse(JSON.stringify(draft.data));
    data.segments[0].coeffs[0] += 0.5;
    data.segments[1].coeffs[0] += 0.5;
    await draft.update({ data });
    const again = await getResults(erin, c.id);
    expect(again.result).toEqual(frozen.result);
    expect(again.hash).toBe(frozen.hash);
  });

  it("cannot be submitted twice, or by anyone but the author", async () => {
    const erin = await actorOf("engineer");
    const c = await createCase(erin, caseInputSchema.parse(shiftCase(pins)));
    await expect(submitCase(await actorOf("steward"), c.id, 0)).rejects.toMatchObject({ status: 403, code: "not-author" });
    await expect(submitCase(await actorOf("other"), c.id, 0)).rejects.toMatchObject({ status: 404 });
    await submitCase(erin, c.id, 0);
    await expect(submitCase(erin, c.id, 1)).rejects.toMatchObject({ status: 409 });
  });
});

describe("snapshot hash", () => {
  it("is the same for the same inputs, and canonical: key order does not matter", async () => {
    const erin = await actorOf("engineer");
    const a = await createCase(erin, caseInputSchema.parse(shiftCase(pins, { title: "Twin" })));
    const b = await createCase(erin, caseInputSchema.parse(shiftCase(pins, { title: "Twin" })));
    await submitCase(erin, a.id, 0);
    await submitCase(erin, b.id, 0);
    const sa = await models().CaseSnapshot.findOne({ where: { caseId: a.id } });
    const sb = await models().CaseSnapshot.findOne({ where: { caseId: b.id } });
    expect(sa!.hash).toBe(sb!.hash);

    const content = { inputs: sa!.inputs, pins: sa!.pins, engineVersion: sa!.engineVersion, request: sa!.request, result: sa!.result };
    const reordered = JSON.parse(JSON.stringify(content, Object.keys(content).reverse()));
    const shuffled = {
      result: content.result,
      request: content.request,
      engineVersion: content.engineVersion,
      pins: content.pins,
      inputs: { ...reordered.inputs, ...content.inputs },
    };
    expect(snapshotHash(shuffled)).toBe(sa!.hash);
    const changed = { ...content, inputs: { ...content.inputs, toleranceKJ: 2 } };
    expect(snapshotHash(changed)).not.toBe(sa!.hash);
  });

  it("uses RFC 8785 number and key serialisation", () => {
    // RFC 8785 §3.2.2 sample numbers (from memory): ES6 shortest form, exponent with sign.
    expect(canonicalize({ numbers: [333333333.33333329, 1e30, 4.5, 2e-3, 0.000000000000000000000000001] })).toBe('{"numbers":[333333333.3333333,1e+30,4.5,0.002,1e-27]}');
    // Keys sorted by UTF-16 code units (common practice for RFC 8785).
    expect(canonicalize({ b: 1, a: { d: 2, c: 3 } })).toBe('{"a":{"c":3,"d":2},"b":1}');
  });
});

describe("snapshot immutability", () => {
  // Sequelize reports RAISE(ABORT) as a constraint error; the trigger's words are on the driver's error.
  const refusal = (pattern: RegExp) => (e: unknown) => pattern.test(String((e as { parent?: Error }).parent?.message ?? e));
  async function aSnapshot() {
    const erin = await actorOf("engineer");
    const c = await createCase(erin, caseInputSchema.parse(shiftCase(pins)));
    await submitCase(erin, c.id, 0);
    return (await models().CaseSnapshot.findOne({ where: { caseId: c.id } }))!;
  }

  it("the database refuses to update a snapshot through the model", async () => {
    const s = await aSnapshot();
    await expect(s.update({ hash: "0".repeat(64) })).rejects.toSatisfy(refusal(/case snapshots are immutable/));
    await expect(s.update({ result: { ...s.result, points: [] } })).rejects.toSatisfy(refusal(/case snapshots are immutable/));
  });

  it("the database refuses raw UPDATE and DELETE", async () => {
    const s = await aSnapshot();
    const { CaseSnapshot } = models();
    const sequelize = CaseSnapshot.sequelize!;
    await expect(sequelize.query(`UPDATE case_snapshots SET revision = 99 WHERE id = ${s.id}`)).rejects.toSatisfy(refusal(/case snapshots are immutable/));
    await expect(sequelize.query(`DELETE FROM case_snapshots WHERE id = ${s.id}`)).rejects.toSatisfy(refusal(/case snapshots cannot be deleted/));
    await expect(s.destroy()).rejects.toSatisfy(refusal(/cannot be deleted/));
    const again = await CaseSnapshot.findByPk(s.id);
    expect(again!.hash).toBe(s.hash);
    expect(verifySnapshot(again!)).toBe(true);
  });
});

describe("snapshots of another team", () => {
  it("are answered 404", async () => {
    const erin = await actorOf("engineer");
    const c = await createCase(erin, caseInputSchema.parse(shiftCase(pins)));
    await submitCase(erin, c.id, 0);
    const other = await actorOf("other");
    await expect(getSnapshot(other, c.id, 1)).rejects.toMatchObject({ status: 404 });
    await expect(getResults(other, c.id)).rejects.toMatchObject({ status: 404 });
    await expect(diffSnapshots(other, c.id, 1, 1)).rejects.toMatchObject({ status: 404 });
  });
});
