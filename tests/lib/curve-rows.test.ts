import { describe, expect, it } from "vitest";
import { curveMarks, curveRows, phaseMismatch, type CurveLike } from "@/components/library/curve-rows";

// Synthetic curves, invented for this test: A liquid below 373.15 K and gas above; B gas only, stated from 300 K.
const grid = [250, 300, 350, 400, 450];
const a: CurveLike = {
  points: grid.map((tK) => ({ tK, cpJ: tK < 373.15 ? 75 : 34, hkJ: 0, sJ: 0, phase: tK < 373.15 ? "l" : "g", extrapolated: false })),
  chains: [
    { phase: "l", tminK: 200, tmaxK: 373.15 },
    { phase: "g", tminK: 200, tmaxK: 3000 },
  ],
  phaseChanges: [{ tK: 373.15, from: "l", to: "g" }],
};
const b: CurveLike = {
  points: grid.map((tK) => ({ tK, cpJ: 34, hkJ: 0, sJ: 0, phase: "g", extrapolated: tK < 300 })),
  chains: [{ phase: "g", tminK: 300, tmaxK: 3000 }],
};

describe("library overlay rows and marks", () => {
  it("draws each model only over its own range and takes the difference only where both are in range", () => {
    const rows = curveRows(a, b);
    expect(rows[0].cpB).toBeNull();
    expect(rows[0].dCp).toBeNull();
    expect(rows[1].cpB).toBe(34);
    expect(rows[1].dCp).toBe(41);
  });

  it("marks the phase change once, merges edges at one temperature, and tags the model", () => {
    const marks = curveMarks(a, b);
    expect(marks.map((m) => m.label)).toEqual(["B 300 K", "A l→g 373.15 K"]);
  });

  it("says where the difference compares different phases, up to the phase change", () => {
    expect(phaseMismatch(a, b)).toEqual([{ x1: 275, x2: 373.15, phaseA: "l", phaseB: "g" }]);
  });
});
