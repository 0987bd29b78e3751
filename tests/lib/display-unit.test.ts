import { describe, expect, it } from "vitest";
import { differenceFromKelvin, enteredUnit, formatTemperature, fromKelvin, gridValue, niceTicks } from "@/lib/cases/display-unit";
import { signCaseSentence, type SignCaseInput } from "@/lib/cases/sign-case";

describe("display units", () => {
  // t/°C = T/K − 273.15 and t/°F = 1.8·t/°C + 32 (SI Brochure, 9th ed., 2019; common practice).
  it.each([
    [273.15, "degC", 0],
    [373.15, "degC", 100],
    [233.15, "degF", -40],
    [373.15, "degF", 212],
    [500, "K", 500],
  ] as const)("%s K reads %s %s", (tK, unit, expected) => {
    expect(fromKelvin(tK, unit)).toBeCloseTo(expected, 10);
  });

  it("converts a difference without the offset (a 10 K step is 10 °C and 18 °F)", () => {
    expect(differenceFromKelvin(10, "degC")).toBe(10);
    expect(differenceFromKelvin(10, "degF")).toBeCloseTo(18, 12);
  });

  it("prints to 0.1 of the unit without float noise", () => {
    expect(formatTemperature(673.15, "degC")).toBe("400.0 °C");
    expect(formatTemperature(1096.64, "K")).toBe("1096.6 K");
    expect(formatTemperature(173.15, "degC")).toBe("−100.0 °C");
    expect(gridValue(673.15, "degC")).toBe("400");
    expect(gridValue(298.15, "K")).toBe("298.15");
  });

  it("opens a case in the unit it was entered in", () => {
    expect(enteredUnit({ fromK: "400 degC" })).toBe("degC");
    expect(enteredUnit({ listK: ["100 degF"] })).toBe("degF");
    expect(enteredUnit({ fromK: 480 })).toBe("K");
  });

  it("gives round ticks, not the data's own end points (synthetic span 400–900 °C)", () => {
    expect(niceTicks(400, 900)).toEqual([400, 500, 600, 700, 800, 900]);
    expect(niceTicks(673.15 - 273.15, 1173.15 - 273.15)).toEqual([400, 500, 600, 700, 800, 900]);
    expect(niceTicks(480, 700)).toEqual([500, 550, 600, 650, 700]);
    expect(niceTicks(-73.15, 26.85)).toEqual([-60, -40, -20, 0, 20]);
    for (const t of niceTicks(126.85, 1226.85)) expect(Number.isInteger(t / 100) || Number.isInteger(t / 250)).toBe(true);
  });
});

// Synthetic results, invented for this test: only the crossover fields matter.
const base = (crossover: SignCaseInput["crossover"], correctedAgrees: boolean, points: SignCaseInput["points"] = []): SignCaseInput => ({
  signCase: { code: "favourable-above", correctedAgrees },
  crossover,
  points,
});

describe("sign-case sentence", () => {
  it("says how far the corrected crossover moved instead of 'differs somewhere'", () => {
    const s = signCaseSentence(base({ naiveK: 1096.6, naiveInSpan: true, correctedK: [1028.6] }, false));
    expect(s).toBe("The corrected curve does not agree with this over the span: the corrected crossover is 68 K lower than the naive one (1028.6 K against 1096.6 K).");
    expect(s).not.toContain("differs somewhere");
  });

  it("gives the shift in the reader's unit (a difference: 68 K is 122.4 °F)", () => {
    const s = signCaseSentence(base({ naiveK: 1096.6, naiveInSpan: true, correctedK: [1028.6] }, false), "degF");
    expect(s).toContain("is 122.4 °F lower than the naive one");
    expect(signCaseSentence(base({ naiveK: 900, naiveInSpan: true, correctedK: [910] }, false), "degC")).toContain("10 °C higher");
  });

  it("names a crossing the naive line never makes, and one the corrected curve does not make", () => {
    expect(signCaseSentence(base({ naiveK: null, naiveInSpan: false, correctedK: [850] }, false))).toContain("crosses zero at 850.0 K, which the naive line never does");
    expect(signCaseSentence(base({ naiveK: 700, naiveInSpan: true, correctedK: [] }, false))).toContain(
      "the naive line crosses zero at 700.0 K, but the corrected ΔrG keeps one sign",
    );
  });

  it("counts several corrected crossings", () => {
    expect(signCaseSentence(base({ naiveK: 500, naiveInSpan: true, correctedK: [480, 620] }, false))).toContain("changes sign 2 times in the span (at 480.0 K, 620.0 K)");
  });

  it("still reports the shift when the curves agree", () => {
    expect(signCaseSentence(base({ naiveK: 980, naiveInSpan: true, correctedK: [983.2] }, true))).toBe(
      "The corrected curve agrees with this over the span; the corrected crossover is 3.2 K higher than the naive one (983.2 K against 980.0 K).",
    );
    expect(signCaseSentence(base({ naiveK: null, naiveInSpan: false, correctedK: [] }, true))).toBe("The corrected curve agrees with this over the span.");
  });
});
