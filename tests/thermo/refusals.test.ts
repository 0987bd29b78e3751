/** Every refusal: a stable code and an exact message (EngineRefusal → HTTP 422 / exit 2). */
import { describe, expect, it } from "vitest";
import { EngineRefusal, evaluate, speciesProperties, type SpeciesInput } from "@/lib/thermo";
import { speciesEntry } from "./reference-data";

const shomate = (sp: string) => speciesEntry("shomate-janaf", sp, "g");
const base = () => ({
  reaction: "CO(g) + H2O(g) -> CO2(g) + H2(g)",
  species: { "CO(g)": shomate("CO"), "H2O(g)": shomate("H2O"), "CO2(g)": shomate("CO2"), "H2(g)": shomate("H2") } as Record<string, SpeciesInput>,
  temperatures: { fromK: 500, toK: 700, stepK: 100 } as Record<string, unknown>,
});

function refusal(fn: () => unknown): EngineRefusal {
  try {
    fn();
  } catch (e) {
    if (e instanceof EngineRefusal) return e;
    throw e;
  }
  throw new Error("expected a refusal");
}

// Synthetic, invented for this test: a constant-Cp gas for the constant-less cases.
const constantGas = (extra: Partial<SpeciesInput> = {}): SpeciesInput => ({
  segments: [{ phase: "g", form: "constant", tminK: 300, tmaxK: 1000, coeffs: { cpJ: 30 } }],
  ...extra,
});

const cases: [string, () => unknown, string, string][] = [
  ["a request that is not an object", () => evaluate(42), "invalid-request", "invalid request: request: Invalid input: expected object, received number"],
  ["a missing field", () => evaluate({ ...base(), temperatures: undefined }), "invalid-request", "invalid request: temperatures: required"],
  [
    "a coefficient of the wrong type, naming its path",
    () => {
      const r = base();
      (r.species["CO(g)"].segments[0].coeffs as Record<string, unknown>).A = "25.6";
      return evaluate(r);
    },
    "invalid-request",
    'invalid request: species["CO(g)"].segments[0].coeffs.A: expected a finite number',
  ],
  [
    "an unknown form",
    () => evaluate({ ...base(), species: { ...base().species, "CO(g)": { segments: [{ phase: "g", form: "cubic", tminK: 1, tmaxK: 2, coeffs: {} }] } } }),
    "invalid-request",
    'invalid request: species["CO(g)"].segments[0].form: expected form to be one of constant, shomate, nasa7, nasa9, maier-kelley, power, table, expression',
  ],
  [
    "an unbalanced reaction, naming the elements",
    () => evaluate({ ...base(), reaction: "CO(g) + H2O(g) -> CO2(g)" }),
    "unbalanced-reaction",
    "the reaction is not balanced: H -2 (products minus reactants)",
  ],
  [
    "an unbalanced reaction with two elements",
    () => evaluate({ ...base(), reaction: "2 CO(g) + H2O(g) -> CO2(g) + H2(g)" }),
    "unbalanced-reaction",
    "the reaction is not balanced: C -1, O -1 (products minus reactants)",
  ],
  [
    "a reaction without an arrow",
    () => evaluate({ ...base(), reaction: "CO(g) + H2O(g)" }),
    "invalid-reaction",
    'reaction "CO(g) + H2O(g)": expected reactants and products separated by one "->" or "="',
  ],
  [
    "a missing species key",
    () => evaluate({ ...base(), species: { ...base().species, "H2(g)": undefined as unknown as SpeciesInput } }),
    "invalid-request",
    'invalid request: species["H2(g)"]: required',
  ],
  [
    "a species key absent from species",
    () => {
      const r = base();
      delete r.species["H2(g)"];
      return evaluate(r);
    },
    "missing-species",
    'species "H2(g)" is used in the reaction but has no entry in species',
  ],
  [
    "T = 0 K in a grid",
    () => evaluate({ ...base(), temperatures: { fromK: 0, toK: 700, stepK: 100 } }),
    "nonpositive-temperature",
    "temperatures.fromK: temperatures must be above 0 K (got 0 K)",
  ],
  [
    "T < 0 K in a list (with a unit)",
    () => evaluate({ ...base(), temperatures: { listK: [500, "-300 degC"] } }),
    "nonpositive-temperature",
    "temperatures.listK[1]: temperatures must be above 0 K (got -26.850000000000023 K)",
  ],
  ["a reference temperature of 0 K", () => evaluate({ ...base(), referenceK: 0 }), "nonpositive-temperature", "referenceK: temperatures must be above 0 K (got 0 K)"],
  [
    "a gap in a chain",
    () => {
      const r = base();
      r.species["CO(g)"].segments[1].tminK = 1400;
      return evaluate(r);
    },
    "chain-gap",
    'species "CO(g)": gap in the g chain between 1300 K and 1400 K',
  ],
  [
    "a zero coefficient",
    () => evaluate({ reaction: "N2(g) -> N2(g) + 0 H2(g)", species: { "N2(g)": constantGas() }, temperatures: { listK: [500] } }),
    "invalid-reaction",
    'reaction "N2(g) -> N2(g) + 0 H2(g)": coefficient of H2(g) must be positive',
  ],
  [
    "a phase without an anchor (constant form, no reference)",
    () => evaluate({ ...base(), species: { ...base().species, "H2(g)": constantGas() } }),
    "no-anchor",
    'species "H2(g)": the g phase has no anchor; its forms carry no integration constants, so give a reference {tK, phase, hkJ, sJ} or a transition to a phase that has one',
  ],
  [
    "a marked phase the entry does not have",
    () => evaluate({ ...base(), reaction: "CO(l) + H2O(g) -> CO2(g) + H2(g)", species: { ...base().species, "CO(l)": shomate("CO") } }),
    "missing-phase",
    'species "CO(l)": the key asks for the l phase but no segment has phase "l"',
  ],
  [
    "a step with the wrong dimension",
    () => evaluate({ ...base(), temperatures: { fromK: 500, toK: 700, stepK: "10 kJ/mol" } }),
    "unit-error",
    'temperatures.stepK: "10 kJ/mol" is not a temperature (K, degC or degF)',
  ],
  [
    "an enthalpy with the wrong dimension",
    () => evaluate({ ...base(), species: { ...base().species, "H2(g)": constantGas({ reference: { tK: 298.15, phase: "g", hkJ: "5 K", sJ: 130 } }) } }),
    "unit-error",
    'species["H2(g)"].reference.hkJ: "5 K" is not an energy per amount (J/mol, kJ/mol, cal/mol, kcal/mol)',
  ],
  [
    "an unreadable quantity",
    () => evaluate({ ...base(), referenceK: "warm" }),
    "unit-error",
    'referenceK: cannot read "warm" as a quantity; expected a temperature (K, degC or degF)',
  ],
  [
    "more than 100 000 points",
    () => evaluate({ ...base(), temperatures: { fromK: 300, toK: 1300, stepK: 0.001 } }),
    "too-many-points",
    "temperatures: 1000001 points exceed the limit of 100000; use a larger stepK",
  ],
  [
    "a table range beyond its points",
    () =>
      speciesProperties(
        {
          segments: [
            {
              phase: "g",
              form: "table",
              tminK: 300,
              tmaxK: 600,
              coeffs: {
                points: [
                  [300, 29],
                  [500, 30],
                ],
              },
            },
          ],
          reference: { tK: 300, phase: "g", hkJ: 0, sJ: 100 },
        },
        [400],
      ),
    "invalid-table",
    "species.segments[0]: the range 300–600 K runs beyond the table points (300–500 K); a table is not extrapolated silently",
  ],
];

describe("refusals", () => {
  it.each(cases)("%s", (_name, fn, code, message) => {
    const e = refusal(fn);
    expect(e.code).toBe(code);
    expect(e.message).toBe(message);
    expect(e.message).not.toContain("\n");
  });
});

describe("Cp expressions: compiled once, T the only symbol, dangerous features refused", () => {
  const withCp = (cp: string) => () =>
    speciesProperties({ segments: [{ phase: "g", form: "expression", tminK: 300, tmaxK: 1000, coeffs: { cp } }], reference: { tK: 300, phase: "g", hkJ: 0, sJ: 100 } }, [500]);
  const label = "species.segments[0].coeffs.cp";
  it.each([
    ["import({x: 1})", `${label}: "import" is not allowed in a Cp expression`],
    ['createUnit("foo")', `${label}: "createUnit" is not allowed in a Cp expression`],
    ['evaluate("1 + 1")', `${label}: "evaluate" is not allowed in a Cp expression`],
    ['parse("T")', `${label}: "parse" is not allowed in a Cp expression`],
    ["a = 30", `${label}: assignment is not allowed in a Cp expression`],
    ["f(x) = 30 + x", `${label}: function definition is not allowed in a Cp expression`],
    ["30 + 0.01 * x", `${label}: unknown symbol "x"; T (in K) is the only variable`],
    ["30; 40", `${label}: only one expression is allowed (no ';' or line breaks)`],
    ["[30, 40]", `${label}: array syntax is not allowed in a Cp expression`],
  ])("%s", (cp, message) => {
    const e = refusal(withCp(cp));
    expect(e.code).toBe("invalid-expression");
    expect(e.message).toBe(message);
  });

  it("allows whitelisted functions of T", () => {
    // Synthetic, invented for this test.
    const out = speciesProperties(
      {
        segments: [{ phase: "g", form: "expression", tminK: 300, tmaxK: 1000, coeffs: { cp: "29 + 2*exp(-300/T) + sqrt(T)/100" } }],
        reference: { tK: 300, phase: "g", hkJ: 0, sJ: 100 },
      },
      [300, 600],
    );
    expect(out.rows[1].cpJ).toBeCloseTo(29 + 2 * Math.exp(-0.5) + Math.sqrt(600) / 100, 12);
  });
});
