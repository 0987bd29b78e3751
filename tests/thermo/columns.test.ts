/**
 * evaluate(request, { format: "columns" }) builds the columns straight from the engine's typed
 * arrays; it must be the same answer as building the rows and turning them into columns
 * (lib/thermo/columns.ts toColumnar), number for number and key for key.
 */
import { describe, expect, it } from "vitest";
import { evaluate, type SpeciesInput } from "@/lib/thermo";
import { toColumnar } from "@/lib/thermo/columns";
import { speciesEntry } from "./reference-data";

// Shomate sets fitted to NIST-JANAF (Chase 1998), ../shared/reference/.
const sh = (sp: string) => speciesEntry("shomate-janaf", sp, "g");
// Standard uncertainties: synthetic, invented for this test.
const withU = (e: SpeciesInput): SpeciesInput => ({ ...e, uncertainty: { dfHkJ: 0.3, sJ: 0.2, cpRelative: 0.01 } });
const shift = (u: boolean) => {
  const s: Record<string, SpeciesInput> = { "CO(g)": sh("CO"), "H2O(g)": sh("H2O"), "CO2(g)": sh("CO2"), "H2(g)": sh("H2") };
  return u ? Object.fromEntries(Object.entries(s).map(([k, v]) => [k, withU(v)])) : s;
};

describe("the columnar answer", () => {
  const cases: [string, Record<string, unknown>][] = [
    ["plain grid with a tolerance", { reaction: "CO(g) + H2O(g) -> CO2(g) + H2(g)", species: shift(false), temperatures: { fromK: 400, toK: 1400, stepK: 0.7 }, toleranceKJ: 0.5 }],
    [
      "uncertainty, species rows and contributions",
      {
        reaction: "CO(g) + H2O(g) -> CO2(g) + H2(g)",
        species: shift(true),
        temperatures: { fromK: 400, toK: 1400, stepK: 25 },
        include: ["species", "contributions"],
        toleranceKFactor: 1.5,
      },
    ],
    [
      "equilibrium and adiabatic outlet",
      {
        reaction: "CO(g) + H2O(g) -> CO2(g) + H2(g)",
        species: shift(false),
        temperatures: { listK: [500, 600, 800] },
        equilibrium: { feed: { "CO(g)": 1, "H2O(g)": 1 }, pressureBar: 20 },
        adiabatic: { inletK: 600 },
      },
    ],
  ];
  for (const [name, request] of cases) {
    it(`${name}: same numbers and key order as the rows turned into columns`, () => {
      const direct = evaluate(request, { format: "columns" });
      const viaRows = toColumnar(evaluate(request));
      expect(JSON.stringify(direct)).toBe(JSON.stringify(viaRows));
      expect(Object.keys(direct)[0]).toBe("columns");
    });
  }
});
