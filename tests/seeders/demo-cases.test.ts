import { afterAll, describe, expect, it, vi } from "vitest";
import { closeDb, registry } from "@/lib/db";
import { getResults, verifySnapshot } from "@/lib/services/cases";
import { seed as demoTeam } from "@/seeders/01-demo-team";
import { DEMO_CASES, seed as demoCases } from "@/seeders/04-demo-cases";
import { actorOf } from "../helpers/actors";
import { freshDatabase, tableCounts } from "../helpers/db";

afterAll(() => closeDb());

describe("04-demo-cases", () => {
  it("skips cleanly, with a console line, when the reference versions are missing", async () => {
    const ctx = await freshDatabase({ seed: false });
    await demoTeam(ctx);
    const log = vi.spyOn(console, "log").mockImplementation(() => undefined);
    await demoCases(ctx);
    expect(log.mock.calls.flat().join("\n")).toMatch(/04-demo-cases: skipped: no approved nasa7-2015 reference version of CH4/);
    log.mockRestore();
    expect(await ctx.models.Case.count()).toBe(0);
  });

  it("seeds the scenario's cases in every state, with valid snapshots, and is safe to repeat", async () => {
    await freshDatabase();
    const { models, sequelize } = registry();
    const rows = await models.Case.findAll({ order: [["id", "ASC"]] });
    expect(rows.map((r) => [r.title, r.status])).toEqual(DEMO_CASES.map((c) => [c.title, c.flow]));
    for (const s of await models.CaseSnapshot.findAll()) expect(verifySnapshot(s)).toBe(true);
    const returned = rows.find((r) => r.status === "returned")!;
    const review = await models.Review.findOne({ where: { caseId: returned.id } });
    expect(review!.reason).toMatch(/150 bar/);

    const before = await tableCounts();
    await demoCases({ models, sequelize });
    expect(await tableCounts()).toEqual(before);
  });

  it("the cold box draft shows extrapolation warnings below the models' 200 K limit", async () => {
    const { models } = registry();
    const cold = await models.Case.findOne({ where: { title: "Cold box CO trace near 90 K" } });
    const r = await getResults(await actorOf("engineer"), cold!.id);
    expect(r.source).toBe("live");
    const codes = new Set(r.result.warnings.map((w) => w.code));
    expect(codes.has("extrapolation")).toBe(true);
    expect(r.result.warnings.filter((w) => w.code === "extrapolation").map((w) => w.species)).toEqual(expect.arrayContaining(["CO(g)", "H2(g)", "CH4(g)"]));
  });
});
