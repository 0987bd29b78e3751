/**
 * The builder's unit switch converts what was typed (issue 11, item 2): an absolute
 * temperature moves by the scale and offset, a step by the scale only. The relations
 * T/K = t/°C + 273.15 and Δ(°F) = 1.8 Δ(K) are the SI definitions (common practice).
 */
import { describe, expect, it } from "vitest";
import { convertDifference, convertTemperature, convertTyped, convertTypedList, toKelvin, toKelvinDifference } from "@/lib/cases/temperature";

describe("switching the unit of typed temperatures", () => {
  it("moves a span from K to °C and °F without changing the temperatures", () => {
    // The example: 300 and 1500 K are 26.85 and 1226.85 °C.
    expect(convertTemperature(300, "K", "degC")).toBe(26.85);
    expect(convertTemperature(1500, "K", "degC")).toBe(1226.85);
    expect(convertTemperature(233.15, "K", "degF")).toBe(-40);
    expect(convertTemperature(212, "degF", "degC")).toBe(100);
    expect(convertTemperature(26.85, "degC", "K")).toBe(300);
    for (const k of [80, 298.15, 300, 1234.5]) {
      const c = convertTemperature(k, "K", "degC");
      const f = convertTemperature(k, "K", "degF");
      expect(toKelvin(`${c} degC`)).toBeCloseTo(k, 9);
      expect(toKelvin(`${f} degF`)).toBeCloseTo(k, 9);
    }
  });

  it("moves a step as a difference: 10 K is 10 °C and 18 °F", () => {
    expect(convertDifference(10, "K", "degC")).toBe(10);
    expect(convertDifference(10, "K", "degF")).toBe(18);
    expect(convertDifference(18, "degF", "K")).toBe(10);
    expect(convertDifference(9, "degF", "degC")).toBe(5);
    expect(toKelvinDifference(`${convertDifference(7.5, "K", "degF")} degF`)).toBeCloseTo(7.5, 12);
  });

  it("converts typed text, and leaves what is not a number as typed", () => {
    expect(convertTyped("300", "K", "degC")).toBe("26.85");
    expect(convertTyped(" 5 ", "K", "degF", "difference")).toBe("9");
    expect(convertTyped("", "K", "degC")).toBe("");
    expect(convertTyped("abc", "K", "degC")).toBe("abc");
    expect(convertTypedList("300, 400 500", "K", "degC")).toBe("26.85, 126.85 226.85");
  });
});
