/**
 * Units, formulas, reactions, and the command-line door (spawned) against evaluate().
 * Bounds of 1e-6 and tighter compare two computations of one number (closed form, independent
 * solver, unit round trip): round-off allowances, common practice.
 */
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { evaluate, parseFormula, parseMolarEnergyKJ, parseReaction, parseTemperatureDifferenceK, parseTemperatureK, type SpeciesInput } from "@/lib/thermo";
import { repoRoot, speciesEntry } from "./reference-data";

describe("units", () => {
  it.each([
    ["25 degC", 298.15],
    ["900 degF", 755.3722222222222],
    [300, 300],
    ["300", 300],
    ["1.5 kK", 1500],
  ] as const)("temperature %s → %s K", (v, k) => expect(parseTemperatureK(v, "t")).toBeCloseTo(k, 9));
  it("steps in degC/degF are differences", () => {
    expect(parseTemperatureDifferenceK("10 degC", "s")).toBeCloseTo(10, 12);
    expect(parseTemperatureDifferenceK("18 degF", "s")).toBeCloseTo(10, 12);
  });
  it("energies: the thermochemical calorie is 4.184 J (README constants)", () => {
    expect(parseMolarEnergyKJ("6.01 kJ/mol", "e")).toBeCloseTo(6.01, 12);
    expect(parseMolarEnergyKJ("1.44 kcal/mol", "e")).toBeCloseTo(1.44 * 4.184, 12);
    expect(parseMolarEnergyKJ("1 cal/mol", "e")).toBeCloseTo(0.004184, 15);
  });
});

describe("formulas and reactions", () => {
  it.each([
    // IUPAC standard atomic weights (abridged), molar masses (from memory)
    ["H2O", { H: 2, O: 1 }, 18.015],
    ["CO2", { C: 1, O: 2 }, 44.009],
    ["Ca(OH)2", { Ca: 1, O: 2, H: 2 }, 74.092],
    ["CH3(CH2)2CH3", { C: 4, H: 10 }, 58.124],
  ] as const)("%s", (f, elements, m) => {
    const p = parseFormula(f);
    expect(p.elements).toEqual(elements);
    expect(p.molarMassGPerMol).toBeCloseTo(m, 3);
  });
  it("parses coefficients, markers and both arrows", () => {
    const r = parseReaction("N2(g) + 3 H2(g) -> 2 NH3(g)");
    expect(r.terms.map((t) => [t.key, t.nu, t.formula, t.phase])).toEqual([
      ["N2(g)", -1, "N2", "g"],
      ["H2(g)", -3, "H2", "g"],
      ["NH3(g)", 2, "NH3", "g"],
    ]);
    expect(parseReaction("H2O(cr-ih) = H2O").terms.map((t) => t.phase)).toEqual(["cr-ih", undefined]);
    expect(parseReaction("0.5 O2(g) + H2(g) -> H2O(l)").terms[0].nu).toBe(-0.5);
  });
});

describe("command line: npm run -s evaluate -- request.json", () => {
  const shomate = (sp: string) => speciesEntry("shomate-janaf", sp, "g");
  const request = {
    reaction: "CO(g) + H2O(g) -> CO2(g) + H2(g)",
    species: { "CO(g)": shomate("CO"), "H2O(g)": shomate("H2O"), "CO2(g)": shomate("CO2"), "H2(g)": shomate("H2") } as Record<string, SpeciesInput>,
    temperatures: { fromK: 480, toK: 700, stepK: 20 },
    include: ["species"],
  };
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "heatpath-cli-"));
  const run = (body: unknown) => {
    const file = path.join(dir, `req-${Math.random().toString(36).slice(2)}.json`);
    fs.writeFileSync(file, typeof body === "string" ? body : JSON.stringify(body));
    return spawnSync(process.execPath, ["--import", "tsx", path.join(repoRoot, "scripts/evaluate.ts"), file], { cwd: repoRoot, encoding: "utf8" });
  };

  it("prints the same result as evaluate() and exits 0", () => {
    const out = run(request);
    expect(out.stderr).toBe("");
    expect(out.status).toBe(0);
    expect(JSON.parse(out.stdout)).toEqual(JSON.parse(JSON.stringify(evaluate(request))));
  });

  it("an invalid request exits 2 with one line on stderr and nothing on stdout", () => {
    const unbalanced = run({ ...request, reaction: "CO(g) + H2O(g) -> CO2(g)" });
    expect(unbalanced.status).toBe(2);
    expect(unbalanced.stdout).toBe("");
    expect(unbalanced.stderr).toBe("the reaction is not balanced: H -2 (products minus reactants) (unbalanced-reaction)\n");
    const notJson = run("{ not json");
    expect(notJson.status).toBe(2);
    expect(notJson.stdout).toBe("");
    expect(notJson.stderr.trim().split("\n")).toHaveLength(1);
  });
});
