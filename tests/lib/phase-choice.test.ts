import { describe, expect, it } from "vitest";
import { phaseForSpecies } from "@/lib/cases/phase-choice";

// Synthetic options, invented for this test (formulas and phases only).
const options = [
  { formula: "C", phases: ["cr"] },
  { formula: "H2O", phases: ["g"] },
  { formula: "H2O", phases: ["l"] },
  { formula: "N2", phases: ["g"] },
];

describe("builder row phase after a species is picked (no silent gas default)", () => {
  it("a solid-only species gets its own phase, not gas", () => {
    expect(phaseForSpecies(options, "C", "")).toBe("cr");
    expect(phaseForSpecies(options, "C", "g")).toBe("cr");
  });
  it("a species with several phases keeps a phase it has, else shows stable phase", () => {
    expect(phaseForSpecies(options, "H2O", "l")).toBe("l");
    expect(phaseForSpecies(options, "H2O", "cr")).toBe("");
    expect(phaseForSpecies(options, "H2O", "")).toBe("");
  });
  it("a gas-only species gets gas because its versions say so", () => {
    expect(phaseForSpecies(options, "N2", "")).toBe("g");
  });
});
