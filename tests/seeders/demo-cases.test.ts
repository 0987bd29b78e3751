import { afterAll, describe, expect, it, vi } from "vitest";
import { closeDb, registry } from "@/lib/db";
import { verifySnapshot } from "@/lib/cases/snapshot";
import { getResults } from "@/lib/services/cases";
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

  it("the cold box's CH4(g) at 80 K is below its boiling point, passed from the species row into the request", async () => {
    const { models } = registry();
    const cold = await models.Case.findOne({ where: { title: "Cold box CO trace near 90 K" } });
    const r = await getResults(await actorOf("engineer"), cold!.id);
    // CRC Handbook of Chemistry and Physics (from memory): CH4 boils at 111.66 K, CO at 81.65 K (1 atm).
    expect(r.request.species["CH4(g)"].boilingPointK).toBe(111.66);
    const w = r.result.warnings.filter((x) => x.code === "below-boiling-point");
    expect(w.map((x) => [x.species, x.tK, x.toK])).toEqual([
      ["CO(g)", 80, 81],
      ["CH4(g)", 80, 111],
    ]);
    expect(r.pins.find((p) => p.key === "CH4(g)")!.phasePoints).toMatchObject({ boilingPointK: 111.66, triplePointK: 90.69 });
    // Its equilibrium at 30 bar: methane at about 3 bar partial pressure would condense below 111.66 K.
    const cond = r.result.warnings.filter((x) => x.code === "condensed-phase-possible");
    expect(cond.map((x) => [x.species, x.tK, x.toK])).toEqual([["CH4(g)", 80, 111]]);
    expect(cond[0].message).toMatch(/^would condense \(solid below its 90.69 K triple point\)/);
  });

  it("methanol synthesis and carbon deposition are demo cases on published sets, with equilibria and contributions", async () => {
    const { models } = registry();
    const erin = await actorOf("engineer");
    const byTitle = async (t: string) => getResults(erin, (await models.Case.findOne({ where: { title: t } }))!.id);

    const meoh = await byTitle("Methanol synthesis loop 450–600 K");
    expect(meoh.source).toBe("snapshot");
    expect(meoh.request.reaction).toBe("CO(g) + 2 H2(g) -> CH3OH(g)");
    expect(new Set(meoh.pins.map((p) => p.family))).toEqual(new Set(["nasa7-gri30"]));
    expect(Object.keys(meoh.result.contributions!)).toEqual(["CO(g)", "H2(g)", "CH3OH(g)"]);
    // Le Chatelier, common practice: exothermic, so conversion falls as T rises.
    const conv = meoh.result.equilibrium!.map((p) => p.keyConversion);
    expect(conv[0]).toBeGreaterThan(conv[conv.length - 1]);

    const boudouard = await byTitle("Reformer tubes: carbon from CO (Boudouard)");
    expect(boudouard.request.reaction).toBe("2 CO(g) -> C(cr) + CO2(g)");
    expect(boudouard.pins.find((p) => p.key === "C(cr)")!.modelName).toBe("C · NASA-7 graphite (third-millennium 2015)");
    expect(boudouard.result.signCase.code).toBe("favourable-below");
    expect(boudouard.result.crossover.correctedK).toHaveLength(1);

    const cracking = await byTitle("Reformer tubes: carbon from methane cracking");
    expect(cracking.request.reaction).toBe("CH4(g) -> C(cr) + 2 H2(g)");
    expect(cracking.result.signCase.code).toBe("favourable-above");
    const [root] = cracking.result.crossover.correctedK;
    // The notes promise: the corrected crossover sits about 100 K below the naive one.
    expect(cracking.result.crossover.naiveK! - root).toBeGreaterThan(80);
    for (const r of [boudouard, cracking]) {
      r.result.points.forEach((p, i) => {
        const sum = Object.values(r.result.contributions!).reduce((a, c) => a + c[i], 0);
        expect(Math.abs(sum + p.diffKJ)).toBeLessThanOrEqual(1e-9);
      });
    }
  });
});
