/**
 * Issue 12, items 1–10, and issue 10 item 3 (the expression budget): what the engine does
 * when it should refuse, and requests it refused although the docs say it takes them.
 * Each test failed on the engine before these fixes, except the controls (an ordinary
 * expression, a step in Cp, the ends of the range, the 3.3 K grid of the double root) that
 * show the fixes refuse nothing they should answer.
 * Bounds of 1e-6 and tighter compare two computations of one number (closed form, independent
 * solver, unit round trip): round-off allowances, common practice.
 */
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { EngineRefusal, evaluate, parseFormula, R, speciesProperties, type SpeciesInput } from "@/lib/thermo";
import { Integrator, WORK_BUDGET } from "@/lib/thermo/integrate";
import { toErrorResponse } from "@/lib/http";
import { janafRows, repoRoot, speciesEntry } from "./reference-data";
import { NASA9_N2_RANGES, NASA9_WATER_LIQUID_COEFFS as W, nasa9N2, nasa9WaterLiquid } from "./nasa9-sets";

function refusal(fn: () => unknown): EngineRefusal {
  try {
    fn();
  } catch (e) {
    if (e instanceof EngineRefusal) return e;
    throw e;
  }
  throw new Error("expected a refusal");
}

const shomate = (sp: string) => speciesEntry("shomate-janaf", sp, "g");
const shift = () => ({
  reaction: "CO(g) + H2O(g) -> CO2(g) + H2(g)",
  species: { "CO(g)": shomate("CO"), "H2O(g)": shomate("H2O"), "CO2(g)": shomate("CO2"), "H2(g)": shomate("H2") } as Record<string, SpeciesInput>,
  temperatures: { fromK: 500, toK: 700, stepK: 100 } as Record<string, unknown>,
});

/** A gas with a free Cp expression anchored at 298.15 K (synthetic, invented for this test). */
const exprGas = (cp: string, tminK = 200, tmaxK = 1500): SpeciesInput => ({
  segments: [{ phase: "g", form: "expression", tminK, tmaxK, coeffs: { cp } }],
  reference: { tK: 298.15, phase: "g", hkJ: 0, sJ: 200 },
});
/** N2(g) -> N2(g) + nothing is not a reaction; an isomer-like pair keyed by phase is. */
const withExpression = (cp: string, temperatures: Record<string, unknown> = { listK: [600] }) => ({
  reaction: "H2O(g) -> H2O(l)",
  species: {
    "H2O(g)": exprGas(cp),
    "H2O(l)": { segments: [{ phase: "l", form: "constant", tminK: 200, tmaxK: 1500, coeffs: { cpJ: 75 } }], reference: { tK: 298.15, phase: "l", hkJ: -44, sJ: 70 } },
  } as Record<string, SpeciesInput>,
  temperatures,
});

function runCli(request: unknown, raw?: string): { status: number | null; stdout: string; stderr: string } {
  const file = path.join(fs.mkdtempSync(path.join(os.tmpdir(), "heatpath-robust-")), "req.json");
  fs.writeFileSync(file, raw ?? JSON.stringify(request));
  const r = spawnSync(process.execPath, ["--import", "tsx", path.join(repoRoot, "scripts/evaluate.ts"), file], { cwd: repoRoot, encoding: "utf8" });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}

// NASA-9 closed form of the H2O(L) card (its own equations), J/mol and J/(mol·K).
const H9 = (T: number) => R * (-W[0] / T + W[1] * Math.log(T) + T * (W[2] + T * (W[3] / 2 + T * (W[4] / 3 + T * (W[5] / 4 + T * (W[6] / 5)))))) + R * W[7];
const S9 = (T: number) => R * (-W[0] / (2 * T * T) - W[1] / T + W[2] * Math.log(T) + T * (W[3] + T * (W[4] / 2 + T * (W[5] / 3 + T * (W[6] / 4)))) + W[8]);

describe("1. integration: rounding-aware tolerance and a work budget", () => {
  it("NASA-9 liquid water (McBride, Zehe & Gordon 2002; coefficients of order 1e9) on listK [300, 310] takes a few dozen Cp evaluations and matches its closed form", () => {
    const integrator = new Integrator(WORK_BUDGET);
    const r = evaluate(
      {
        reaction: "H2O(l) -> H2O(g)",
        species: { "H2O(l)": nasa9WaterLiquid(), "H2O(g)": speciesEntry("nasa7-2015", "H2O", "g") },
        temperatures: { listK: [300, 310] },
        include: ["species"],
      },
      { integrator },
    );
    // Before: ~34 s of bisection to the depth limit (about 1e8 evaluations).
    expect(integrator.evaluations).toBeLessThan(5000);
    for (const row of r.species!["H2O(l)"]) {
      // The closed form itself carries ~2e-7 J/mol (H) and ~2e-9 J/(mol·K) (S) of rounding at these term sizes.
      expect(Math.abs(row.hkJ * 1000 - H9(row.tK))).toBeLessThan(1e-6);
      expect(Math.abs(row.sJ - S9(row.tK))).toBeLessThan(1e-8);
    }
    // The card against NIST-JANAF H2O(l) at 298.15 K (Chase 1998, ../shared/reference/janaf-check-rows.json): S 69.95.
    const janaf = janafRows().find((j) => j.species === "H2O" && j.phase === "l" && j.T === 298.15)!;
    const at = speciesProperties(nasa9WaterLiquid(), [298.15]).rows[0];
    expect(Math.abs(at.sJ - janaf.S)).toBeLessThan(0.05);
    expect(Math.abs(at.hkJ - -285.83)).toBeLessThan(0.005); // the card's dfH298, −285.830 kJ/mol
  }, 180_000);

  it("the NASA-9 N2 set's 6000–20000 K range (a1 ≈ 8e8) on 10 000 points stays a few evaluations per point; N2 matches NIST-JANAF", () => {
    const list = Array.from({ length: 10000 }, (_, i) => 6000 + (14000 * i) / 9999);
    const integrator = new Integrator(WORK_BUDGET);
    const r = speciesProperties(nasa9N2(), list, { integrator });
    // Before: more than 60 s.
    expect(integrator.evaluations).toBeLessThan(100_000);
    // Closed form of the 6000–20000 K range from its own constants (the reference README's
    // 1e-9 kJ/mol and 1e-9 J/(mol·K) floors; the closed form itself rounds at ~1e-8 J/mol here).
    const c = NASA9_N2_RANGES[2].coeffs;
    const h = (T: number) => R * (-c[0] / T + c[1] * Math.log(T) + T * (c[2] + T * (c[3] / 2 + T * (c[4] / 3 + T * (c[5] / 4 + T * (c[6] / 5)))))) + R * c[7];
    const s = (T: number) => R * (-c[0] / (2 * T * T) - c[1] / T + c[2] * Math.log(T) + T * (c[3] + T * (c[4] / 2 + T * (c[5] / 3 + T * (c[6] / 4)))) + c[8]);
    for (const row of r.rows) {
      if (row.tK <= 6000) continue;
      expect(Math.abs(row.hkJ * 1000 - h(row.tK))).toBeLessThan(1e-6);
      expect(Math.abs(row.sJ - s(row.tK))).toBeLessThan(1e-9);
    }
    // NIST-JANAF N2 (table N-023, Chase 1998; ../shared/reference/janaf-check-rows.json), at the README's Shomate
    // tolerances (Cp 0.05, S 0.02 J/(mol·K), H 0.005 kJ/mol).
    const rows = speciesProperties(nasa9N2(), [298.15, 1000]).rows;
    for (const j of janafRows().filter((x) => x.species === "N2")) {
      const row = rows.find((x) => x.tK === j.T)!;
      expect(Math.abs(row.cpJ - j.Cp)).toBeLessThan(0.05);
      expect(Math.abs(row.sJ - j.S)).toBeLessThan(0.02);
      expect(Math.abs(row.hkJ - j.HmH298)).toBeLessThan(0.005);
    }
  }, 300_000);

  it("a Cp that cannot be integrated within the work budget is refused as integration-budget, naming species and range", () => {
    // Cp oscillating a million times per kelvin (synthetic, invented for this test).
    const e = refusal(() => evaluate(withExpression("30 + sin(1e6 * T)"), { integrator: new Integrator(200_000) }));
    expect(e.code).toBe("integration-budget");
    expect(e.message).toMatch(
      /^species "H2O\(g\)": the g segment 200–1500 K: integrating Cp between [\d.]+ K and [\d.]+ K exceeded the work budget of \d+ Cp evaluations for one request; /,
    );
  });
});

describe("2 (and issue 10 item 3). the expression budget", () => {
  const flat = [
    ["3 000 terms 1+1+…", Array(3000).fill("1").join("+"), "is 5999 characters long; at most 2000 are allowed"],
    ["2 000 unary minus signs", `${"-".repeat(2000)}T`, "is 2001 characters long; at most 2000 are allowed"],
    ["10 000 terms 0.01*T+…", Array(10000).fill("0.01*T").join("+"), "is 69999 characters long; at most 2000 are allowed"],
  ] as const;
  for (const [name, cp, tail] of flat) {
    it(`${name}: exit 2 on the CLI with the budget's message (was a stack overflow, exit 1)`, () => {
      const cli = runCli(withExpression(cp));
      expect(cli.stdout).toBe("");
      expect(cli.stderr.trim()).toBe(`species["H2O(g)"].segments[0].coeffs.cp: the Cp expression ${tail} (expression-budget)`);
      expect(cli.status).toBe(2);
    }, 60_000);
  }
  it("within the length: too many nodes, too deep, and deep unary chains are refused before parsing", () => {
    const nodes = refusal(() => evaluate(withExpression(Array(300).fill("T").join("+"))));
    expect(nodes.code).toBe("expression-budget");
    expect(nodes.message).toBe('species["H2O(g)"].segments[0].coeffs.cp: the Cp expression has 599 nodes (numbers, symbols, operators and calls); at most 400 are allowed');
    const unary = refusal(() => evaluate(withExpression(`30 + ${"-".repeat(600)}T`)));
    expect(unary.message).toBe('species["H2O(g)"].segments[0].coeffs.cp: the Cp expression nests 600 levels deep; at most 48 are allowed');
    const parens = refusal(() => evaluate(withExpression(`${"(".repeat(60)}T${")".repeat(60)}`)));
    expect(parens.message).toBe('species["H2O(g)"].segments[0].coeffs.cp: the Cp expression nests 60 levels deep; at most 48 are allowed');
    // A long left-assoc chain within the node budget is deep as a tree.
    const chain = refusal(() => evaluate(withExpression(Array(60).fill("1").join("+"))));
    expect(chain.message).toMatch(/nests \d+ levels deep; at most 48 are allowed$/);
  });
  it("a formula nested 20 000 groups deep is refused, not a stack overflow", () => {
    const deep = `${"(".repeat(20000)}H${")".repeat(20000)}2`;
    const sp: SpeciesInput = { segments: [{ phase: "g", form: "constant", tminK: 200, tmaxK: 1000, coeffs: { cpJ: 30 } }], reference: { tK: 298.15, phase: "g", hkJ: 0, sJ: 100 } };
    const e = refusal(() => evaluate({ reaction: `${deep}(g) -> H2(g)`, species: { [`${deep}(g)`]: sp, "H2(g)": sp }, temperatures: { listK: [300] } }));
    expect(e.code).toBe("invalid-formula");
    expect(e.message).toBe(`formula "${"(".repeat(60)}…": is 40002 characters long; at most 200 are allowed`);
    const nested = `${"(".repeat(17)}H${")".repeat(17)}2`;
    expect(refusal(() => parseFormula(nested)).message).toBe(`formula "${nested}": groups nest more than 16 deep`);
  });
  it("the HTTP door maps the refusal to 422 with the error shape", async () => {
    const e = refusal(() => evaluate(withExpression(Array(3000).fill("1").join("+"))));
    const res = toErrorResponse(e);
    expect(res.status).toBe(422);
    expect(await res.json()).toMatchObject({ error: { code: "expression-budget", message: e.message } });
  });
  it("an ordinary polynomial expression still evaluates", () => {
    const r = evaluate(withExpression("29.1 + 0.002*T - 1.1e5/T^2"));
    expect(r.points[0].dCpJ).toBeCloseTo(75 - (29.1 + 1.2 - 1.1e5 / 360000), 9);
  });
});

describe("3. every object of the request is strict", () => {
  const cases: [string, (r: ReturnType<typeof shift> & Record<string, unknown>) => void, string][] = [
    [
      "equilibrium.presureBar",
      (r) => (r.equilibrium = { feed: { "CO(g)": 1, "H2O(g)": 1 }, presureBar: 300 }),
      'invalid request: equilibrium: unknown field "presureBar" (did you mean "pressureBar"?)',
    ],
    ["referenceT", (r) => (r.referenceT = 500), 'invalid request: request: unknown field "referenceT" (did you mean "referenceK"?)'],
    ["equilibrum", (r) => (r.equilibrum = { feed: { "CO(g)": 1 } }), 'invalid request: request: unknown field "equilibrum" (did you mean "equilibrium"?)'],
    [
      "uncertainty.dfhkJ",
      (r) => (r.species["CO(g)"] = { ...r.species["CO(g)"], uncertainty: { dfhkJ: 0.2 } as never }),
      'invalid request: species["CO(g)"].uncertainty: unknown field "dfhkJ" (did you mean "dfHkJ"?)',
    ],
    [
      "a segment's field",
      (r) => ((r.species["CO(g)"].segments[0] as Record<string, unknown>).tmax = 1300),
      'invalid request: species["CO(g)"].segments[0]: unknown field "tmax" (did you mean "tmaxK"?)',
    ],
    [
      "a coefficient name",
      (r) => ((r.species["CO(g)"].segments[0].coeffs as Record<string, unknown>).Q = 1),
      'invalid request: species["CO(g)"].segments[0].coeffs: unknown field "Q" (known fields: A, B, C, D, E, F, G, H)',
    ],
    ["a grid field", (r) => (r.temperatures = { fromK: 500, toK: 700, stpK: 100 }), 'invalid request: temperatures: unknown field "stpK" (did you mean "stepK"?)'],
    [
      "a species entry",
      (r) => (r.species["CO(g)"] = { ...r.species["CO(g)"], refrence: {} } as never),
      'invalid request: species["CO(g)"]: unknown field "refrence" (did you mean "reference"?)',
    ],
  ];
  for (const [name, edit, message] of cases) {
    it(`${name} is refused, naming the nearest known field`, () => {
      const r = shift() as ReturnType<typeof shift> & Record<string, unknown>;
      edit(r);
      const e = refusal(() => evaluate(r));
      expect(e.code).toBe("invalid-request");
      expect(e.message).toBe(message);
    });
  }
});

describe("4. non-finite or divergent Cp", () => {
  it('"T^1000" and "Infinity" are refused as nonfinite-cp, never answered with nulls', () => {
    for (const cp of ["T^1000", "Infinity"]) {
      const e = refusal(() => evaluate(withExpression(cp)));
      expect(e.code).toBe("nonfinite-cp");
      expect(e.message).toMatch(/^species "H2O\(g\)": the g segment 200–1500 K: Cp is not finite at [\d.]+ K \(got Infinity\); the model cannot be integrated there$/);
    }
  });
  it('"30 + 1/(T-500)^2" on 200–1500 K is refused across its pole at 500 K', () => {
    const e = refusal(() => evaluate(withExpression("30 + 1/(T-500)^2", { listK: [600] })));
    expect(e.code).toBe("nonfinite-cp");
    expect(e.message).toMatch(
      /^species "H2O\(g\)": the g segment 200–1500 K: Cp (grows without bound near 500(\.\d+)? K and cannot be integrated across it|is not finite at 500 K \(got Infinity\); the model cannot be integrated there)$/,
    );
  });
  it("a step in Cp (a conditional expression) is integrable and still answered", () => {
    const r = evaluate(withExpression("T < 500 ? 30 : 40", { listK: [600] }));
    // ∫ from 298.15 K: 30·(500 − 298.15) + 40·(600 − 500) J/mol (synthetic, invented for this test).
    const hG = (30 * (500 - 298.15) + 40 * 100) / 1000;
    const hL = -44 + (75 * (600 - 298.15)) / 1000;
    expect(r.points[0].dHkJ).toBeCloseTo(hL - hG, 9);
  });
});

describe("5. the supported temperature range and absurd coefficients", () => {
  it("listK [1e308] and [5e-324] are refused with the range", () => {
    const hi = refusal(() => evaluate({ ...shift(), temperatures: { listK: [1e308] } }));
    expect(hi.code).toBe("temperature-out-of-range");
    expect(hi.message).toBe("temperatures.listK[0]: 1e+308 K is outside the supported range of 1 K to 100000 K");
    const lo = refusal(() => evaluate({ ...shift(), temperatures: { listK: [5e-324] } }));
    expect(lo.message).toBe("temperatures.listK[0]: 5e-324 K is outside the supported range of 1 K to 100000 K");
  });
  it("referenceK 1e308 is refused", () => {
    const e = refusal(() => evaluate({ ...shift(), referenceK: 1e308 }));
    expect(e.code).toBe("temperature-out-of-range");
    expect(e.message).toBe("referenceK: 1e+308 K is outside the supported range of 1 K to 100000 K");
  });
  it("Shomate A = 1e308 is refused instead of answering with null fields", () => {
    const r = shift();
    (r.species["CO(g)"].segments[0].coeffs as Record<string, number>).A = 1e308;
    const e = refusal(() => evaluate(r));
    expect(["nonfinite-cp", "nonfinite-value"]).toContain(e.code);
    expect(e.message).toMatch(/^species "CO\(g\)": /);
  });
  it("100 000 K and 1 K are inside the range", () => {
    expect(() => evaluate({ ...shift(), temperatures: { listK: [1, 100000] } })).not.toThrow();
  });
});

describe("6. a grid with both listK and fromK/toK/stepK", () => {
  it("is refused, not silently reduced to the span", () => {
    const e = refusal(() => evaluate({ ...shift(), temperatures: { fromK: 500, toK: 700, stepK: 100, listK: [550] } }));
    expect(e.code).toBe("invalid-request");
    expect(e.message).toBe("invalid request: temperatures: give either listK or fromK, toK and stepK, not both");
  });
});

describe("7. feedUnit is a closed set; mass units go through the molar mass", () => {
  const eqRequest = (equilibrium: Record<string, unknown>) => ({ ...shift(), equilibrium });
  it('"banana" is refused, naming the set', () => {
    const e = refusal(() => evaluate(eqRequest({ feed: { "CO(g)": 1, "H2O(g)": 1 }, feedUnit: "banana" })));
    expect(e.code).toBe("invalid-request");
    expect(e.message).toBe("invalid request: equilibrium.feedUnit: expected one of mol, kmol, mol/s, kmol/s, kmol/h, g, kg, kg/h, t/h");
  });
  it("kg/h is converted through each species' molar mass and stated in the result", () => {
    // 1 kmol/h CO and 3 kmol/h H2O as mass flows, with the IUPAC abridged atomic weights (lib/thermo/formula.ts).
    const mCO = 12.011 + 15.999;
    const mH2O = 2 * 1.008 + 15.999;
    const byMass = evaluate(eqRequest({ feed: { "CO(g)": mCO, "H2O(g)": 3 * mH2O }, feedUnit: "kg/h" }));
    const byAmount = evaluate(eqRequest({ feed: { "CO(g)": 1, "H2O(g)": 3 }, feedUnit: "kmol/h" }));
    expect(byMass.equilibriumInfo).toMatchObject({ feedUnit: "kg/h", amountUnit: "kmol/h" });
    expect(byMass.equilibriumInfo!.molarMassGPerMol!["CO(g)"]).toBeCloseTo(mCO, 12);
    expect(byMass.equilibriumInfo!.feed["H2O(g)"]).toBeCloseTo(3, 12);
    byMass.equilibrium!.forEach((p, i) => expect(p.extent).toBeCloseTo(byAmount.equilibrium![i].extent!, 12));
    const tph = evaluate(eqRequest({ feed: { "CO(g)": mCO / 1000, "H2O(g)": (3 * mH2O) / 1000 }, feedUnit: "t/h" }));
    expect(tph.equilibriumInfo!.feed["CO(g)"]).toBeCloseTo(1, 12);
  });
  it("a feed amount may carry a unit of the set; an amount among rates is refused", () => {
    const r = evaluate(eqRequest({ feed: { "CO(g)": "1 kmol/h", "H2O(g)": "3000 mol/s" }, feedUnit: "kmol/h" }));
    expect(r.equilibriumInfo!.feed).toMatchObject({ "CO(g)": 1, "H2O(g)": 3000 * 3.6 });
    const e = refusal(() => evaluate(eqRequest({ feed: { "CO(g)": "28 kg", "H2O(g)": 3 }, feedUnit: "kmol/h" })));
    expect(e.code).toBe("unit-error");
    expect(e.message).toBe('equilibrium.feed["CO(g)"]: "28 kg" is an amount but feedUnit "kmol/h" is a rate; give every feed amount as a rate');
    const odd = refusal(() => evaluate(eqRequest({ feed: { "CO(g)": "1 banana", "H2O(g)": 3 } })));
    expect(odd.message).toBe(
      'equilibrium.feed["CO(g)"]: cannot read "1 banana" as a feed amount; expected a number with one of mol, kmol, mol/s, kmol/s, kmol/h, g, kg, kg/h, t/h',
    );
  });
});

describe("8. the equilibrium convergence test is scaled to the rounding floor", () => {
  const species = () => Object.fromEntries(["CH4", "H2O", "CO", "H2", "CO2"].map((k) => [`${k}(g)`, shomate(k)]));
  const reactions = ["CH4(g) + H2O(g) -> CO(g) + 3 H2(g)", "CO(g) + H2O(g) -> CO2(g) + H2(g)"];
  it("5 000-point reforming + shift at 25 bar (Shomate fits to JANAF): no rows near 541 K falsely flagged", () => {
    const r = evaluate({
      reaction: reactions[0],
      species: species(),
      temperatures: { fromK: 500, toK: 1200, stepK: 700 / 4999 },
      equilibrium: { feed: { "CH4(g)": 1, "H2O(g)": 3 }, pressureBar: 25, reactions },
    });
    expect(r.warnings.filter((w) => w.code === "equilibrium-not-converged")).toEqual([]);
    expect(r.equilibrium!.every((p) => p.converged && p.naive.converged)).toBe(true);
  }, 120_000);
  it("the warning says which rows are corrected and which naive", () => {
    // Near 300 K the reforming extent is ~1e-15 of the feed and the solver stops short (a real miss).
    const r = evaluate({
      reaction: reactions[0],
      species: species(),
      temperatures: { listK: [301.2, 301.44, 301.68, 700] },
      equilibrium: { feed: { "CH4(g)": 1, "H2O(g)": 3 }, pressureBar: 25, reactions },
    });
    const w = r.warnings.find((x) => x.code === "equilibrium-not-converged")!;
    expect(w).toBeDefined();
    const pts = r.equilibrium!;
    expect(w.correctedK).toEqual(pts.filter((p) => !p.converged).map((p) => p.tK));
    expect(w.naiveK).toEqual(pts.filter((p) => !p.naive.converged).map((p) => p.tK));
    expect(w.message).toMatch(/: corrected rows (none|\d+ \([^)]*K\)), naive rows (none|\d+ \([^)]*K\)); see diagnostics\.residual$/);
  });
});

describe("9. a double root of ΔrG", () => {
  // ΔrH = ΔrS = 0 at 600 K and ΔrCp = 50 J/(mol·K): ΔrG(T) = 50[(T − 600) − T ln(T/600)] ≤ 0,
  // touching zero at 600 K without changing sign (synthetic, invented for this test).
  const sp = (phase: string, cpJ: number): SpeciesInput => ({
    segments: [{ phase, form: "constant", tminK: 300, tmaxK: 1000, coeffs: { cpJ } }],
    reference: { tK: 600, phase, hkJ: 0, sJ: 100 },
  });
  for (const stepK of [7, 13, 17, 3.3]) {
    it(`appears once in correctedK (grid step ${stepK} K, not landing on 600 K)`, () => {
      const r = evaluate({ reaction: "H2O(g) -> H2O(l)", species: { "H2O(g)": sp("g", 30), "H2O(l)": sp("l", 80) }, temperatures: { fromK: 500, toK: 700, stepK } });
      expect(r.crossover.correctedK).toHaveLength(1);
      expect(Math.abs(r.crossover.correctedK[0] - 600)).toBeLessThan(1e-6);
    });
  }
});

describe("10. messages, and quantities with units as docs/engine.md says", () => {
  it('"=>" is an arrow', () => {
    const r = evaluate({ ...shift(), reaction: "CO(g) + H2O(g) => CO2(g) + H2(g)" });
    expect(r.points).toHaveLength(3);
  });
  it('"-1 CO2(g)" is the documented positive-coefficient refusal', () => {
    const e = refusal(() => evaluate({ ...shift(), reaction: "CO(g) + H2O(g) -> -1 CO2(g) + H2(g)" }));
    expect(e.code).toBe("invalid-reaction");
    expect(e.message).toBe('reaction "CO(g) + H2O(g) -> -1 CO2(g) + H2(g)": coefficient of CO2(g) must be positive');
  });
  it('"1e300 CO(g)" names CO(g), not "e300 CO(g)"', () => {
    const e = refusal(() => evaluate({ ...shift(), reaction: "1e300 CO(g) + H2O(g) -> CO2(g) + H2(g)" }));
    expect(e.code).toBe("invalid-reaction");
    expect(e.message).toBe('reaction "1e300 CO(g) + H2O(g) -> CO2(g) + H2(g)": coefficient of CO(g) is 1e+300; coefficients above 1000 are refused');
  });
  it('"25 °C" is a temperature', () => {
    const r = evaluate({ ...shift(), temperatures: { listK: ["226.85 °C", "500 K"] }, referenceK: "25 °C" });
    expect(r.points[0].tK).toBeCloseTo(500, 12);
    expect(r.reference.tK).toBeCloseTo(298.15, 12);
  });
  it("a UTF-8 byte-order mark before the JSON is accepted by the CLI", () => {
    const cli = runCli(null, `\uFEFF${JSON.stringify(shift())}`);
    expect(cli.stderr).toBe("");
    expect(cli.status).toBe(0);
    expect(JSON.parse(cli.stdout).points).toHaveLength(3);
  }, 60_000);
  it('toleranceKJ "0.24 kcal/mol" and standardPressurePa "1 atm" are read with their units', () => {
    const base = evaluate({ ...shift(), toleranceKJ: 0.24 * 4.184 });
    const withUnit = evaluate({ ...shift(), toleranceKJ: "0.24 kcal/mol" });
    expect(withUnit.points.map((p) => p.exceedsTolerance)).toEqual(base.points.map((p) => p.exceedsTolerance));
    const gri = speciesEntry("nasa7-gri30", "N2", "g"); // GRI-Mech 3.0 N2, 1 atm basis (Smith et al. 1999)
    const atm = speciesProperties({ ...gri, standardPressurePa: "1 atm" }, [500]).rows[0];
    const pa = speciesProperties({ ...gri, standardPressurePa: 101325 }, [500]).rows[0];
    expect(atm.sJ).toBe(pa.sJ);
    const neg = refusal(() => evaluate({ ...shift(), toleranceKJ: "-1 kJ/mol" }));
    expect(neg.message).toBe("invalid request: toleranceKJ: expected a tolerance of 0 or more (got -1 kJ/mol)");
  });
});

describe("a reaction value that overflows at one grid temperature (issue 14, item 4: the typed-array pipeline)", () => {
  it("is refused naming the first such temperature and field, while the reference stays finite", () => {
    // Synthetic, invented for this test: S° of ±2.5e305 J/(mol·K) makes ΔrS = 5e305, so T·ΔrS is
    // finite up to 359 K (the reference 298.15 K and the grid's 300 and 350 K) and overflows at 400 K.
    const sp = (sJ: number): SpeciesInput => ({
      segments: [{ phase: "g", form: "constant", tminK: 200, tmaxK: 2000, coeffs: { cpJ: 30 } }],
      reference: { tK: 298.15, phase: "g", hkJ: 0, sJ },
    });
    const e = refusal(() =>
      evaluate({ reaction: "C2H5OH(g) -> CH3OCH3(g)", species: { "C2H5OH(g)": sp(-2.5e305), "CH3OCH3(g)": sp(2.5e305) }, temperatures: { fromK: 300, toK: 450, stepK: 50 } }),
    );
    expect(e.code).toBe("nonfinite-value");
    expect(e.message).toBe("points at 400 K: dGkJ is not finite in double precision; the models' coefficients are outside any physical range");
  });
});
