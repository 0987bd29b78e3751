import { describe, expect, it } from "vitest";
import { checkEquilibriumForm, checkFeedUnit, checkPressure, checkReactionLine, checkSpeciesKey, feedUnitHint, MASS_FEED_UNITS } from "@/lib/cases/equilibrium-form";
import { feedAmounts } from "@/lib/thermo/equilibrium";
import { FEED_UNITS } from "@/lib/thermo/schema";
import { warningMeaning } from "@/lib/cases/warnings";
import { caseEquilibriumSchema } from "@/lib/validation/equilibrium";
import { fieldErrorsOf } from "@/lib/cases/zod-errors";

// Synthetic inputs, invented for this test.
describe("equilibrium panel checks", () => {
  it("refuses an unknown element, a unit that is not an amount and a pressure that is not one", () => {
    expect(checkSpeciesKey("N2(g)")).toBeNull();
    expect(checkSpeciesKey("Xx(g)")).toContain("“Xx(g)” is not a species");
    expect(checkFeedUnit("kmol/h")).toBeNull();
    expect(checkFeedUnit("bananas")).toContain("“bananas” is not a unit of amount");
    expect(checkPressure("2.5 MPa")).toBeNull();
    expect(checkPressure(30)).toBeNull();
    expect(checkPressure("abc")).toContain("“abc” is not a pressure");
    expect(checkPressure("0 bar")).toBe("The pressure must be above 0.");
    expect(checkPressure("-3 bar")).toBe("The pressure must be above 0.");
  });

  it("flags a reaction line that is not one, a coefficient that is not a number, and an unbalanced line", () => {
    expect(checkReactionLine("CO(g) + H2O(g) -> CO2(g) + H2(g)")).toBeNull();
    expect(checkReactionLine("CH4(g) + 2 H2O(g) = CO2(g) + 4 H2(g)")).toBeNull();
    expect(checkReactionLine("1/2 N2(g) + 3/2 H2(g) -> NH3(g)")).toBeNull();
    expect(checkReactionLine("banana")).toContain("“banana” is not a reaction");
    expect(checkReactionLine("x CO(g) + H2O(g) -> CO2(g) + H2(g)")).toBe("The coefficient “x” of CO(g) is not a number.");
    expect(checkReactionLine("CO(g) -> CO2(g)")).toContain("Not balanced: O +1");
  });

  it("reports every field at once", () => {
    const found = checkEquilibriumForm({ amounts: { "CH4(g)": "lots", "H2O(g)": "2" }, feedUnit: "bananas", pressure: "abc", key: "CH4(g)", reactions: ["banana"] });
    expect(Object.keys(found).sort()).toEqual(["feed.CH4(g)", "feedUnit", "key", "pressure", "reactions.0"]);
  });

  it("the stored shape refuses the same things, each on its own path", () => {
    const r = caseEquilibriumSchema.safeParse({ feed: { "CH4(g)": 1, "Xx(g)": 1 }, feedUnit: "bananas", pressure: "abc", key: "CH4(g)", reactions: ["x CO(g) -> CO2(g)"] });
    expect(r.success).toBe(false);
    expect(Object.keys(fieldErrorsOf(r.error!.issues)).sort()).toEqual(["feed.Xx(g)", "feedUnit", "pressure", "reactions.0"]);
  });

  it("gives equilibrium-not-converged a meaning in plain words", () => {
    expect(warningMeaning("equilibrium-not-converged")).toContain("did not settle");
  });
});

describe("the feed unit's hint", () => {
  it("names the unit the engine gives the moles in, for every feed unit the engine takes", () => {
    for (const unit of FEED_UNITS) {
      const { amountUnit, molarMass } = feedAmounts({ "H2O(g)": 1 }, unit);
      // A mass unit goes through the molar mass; the panel's table of mass units says so and names the engine's amount unit.
      expect(MASS_FEED_UNITS[unit] ?? unit, unit).toBe(amountUnit);
      expect(Boolean(MASS_FEED_UNITS[unit]), unit).toBe(molarMass !== undefined);
      expect(feedUnitHint(unit), unit).toBe(
        molarMass ? `A mass: each species is converted with its molar mass (from its formula); moles come back in ${amountUnit}.` : "Moles come back in the same unit.",
      );
    }
  });
});
