/**
 * Seeding again on a database seeded before the 36 further sets, the species' phase points and
 * the methanol and carbon cases existed: the library as it was (cp-coefficients.json only, no
 * boiling or triple points) and the five earlier demo cases, then every seeder as it is now.
 */
import { afterAll, describe, expect, it } from "vitest";
import { closeDb } from "@/lib/db";
import { verifySnapshot } from "@/lib/cases/snapshot";
import { runSeeders } from "@/seeders";
import { seed as demoTeam } from "@/seeders/01-demo-team";
import { seed as referenceLibrary } from "@/seeders/02-reference-library";
import { seed as demoLibrary } from "@/seeders/03-demo-library";
import { DEMO_CASES, seed as demoCases } from "@/seeders/04-demo-cases";
import sets from "@/seeders/data/reference-sets.json";
import type { ReferenceRecord } from "@/seeders/reference-sets";
import { freshDatabase, tableCounts } from "../helpers/db";

afterAll(() => closeDb());

const EARLIER_CASES = DEMO_CASES.slice(0, 5);

describe("re-seeding a database seeded by the earlier seeders", () => {
  it("adds the new sets, phase points and cases, and leaves every earlier record as it was", async () => {
    const ctx = await freshDatabase({ seed: false });
    const { models } = ctx;
    await demoTeam(ctx);
    await referenceLibrary(ctx, { records: sets as unknown as ReferenceRecord[], phasePoints: false });
    await demoLibrary(ctx);
    await demoCases(ctx, { plans: EARLIER_CASES });
    expect(await models.Species.count({ where: { teamId: null } })).toBe(8);
    expect(await models.Case.count()).toBe(5);
    const versionsBefore = (await models.ModelVersion.findAll({ order: [["id", "ASC"]] })).map((v) => v.toJSON());
    const snapshotsBefore = (await models.CaseSnapshot.findAll({ order: [["id", "ASC"]] })).map((s) => [s.id, s.hash]);
    const ch4Before = await models.Species.findOne({ where: { teamId: null, formula: "CH4" } });
    expect(ch4Before!.boilingPointK).toBeNull();

    await runSeeders(ctx, { demo: true });

    // Earlier versions and snapshots: untouched, still verifying.
    const versionsAfter = (await models.ModelVersion.findAll({ order: [["id", "ASC"]] })).map((v) => v.toJSON());
    expect(versionsAfter.slice(0, versionsBefore.length)).toEqual(versionsBefore);
    const snaps = await models.CaseSnapshot.findAll({ order: [["id", "ASC"]] });
    expect(snaps.slice(0, snapshotsBefore.length).map((s) => [s.id, s.hash])).toEqual(snapshotsBefore);
    for (const s of snaps) expect(verifySnapshot(s)).toBe(true);
    // New: 20 species, 34 reference models, phase points on the earlier species (audited), 3 cases.
    expect(await models.Species.count({ where: { teamId: null } })).toBe(28);
    expect(await models.ModelVersion.count({ where: { teamId: null } })).toBe(60);
    const ch4 = await models.Species.findOne({ where: { teamId: null, formula: "CH4" } });
    expect(ch4!.id).toBe(ch4Before!.id);
    expect(ch4!.boilingPointK).toBe(111.66);
    const audited = await models.AuditEvent.findAll({ where: { action: "species.phase-points-seeded" } });
    // The earlier eight species, each once (CO2 gets its triple point and its sublimation note).
    expect(audited).toHaveLength(8);
    expect((await models.Case.findAll({ order: [["id", "ASC"]] })).map((c) => c.title)).toEqual(DEMO_CASES.map((c) => c.title));

    // And once more: nothing changes.
    const counts = await tableCounts();
    await runSeeders(ctx, { demo: true });
    expect(await tableCounts()).toEqual(counts);
  });
});
