import { describe, expect, it } from "vitest";
import { elementBalance, reactionText } from "@/lib/cases/balance";
import { downsample, sampleIndices } from "@/lib/cases/downsample";
import { joinQuantity, splitQuantity, toKelvin, toKelvinDifference } from "@/lib/cases/temperature";

describe("downsample (drawing only)", () => {
  it("thins 10 000 points to at most the limit, keeping both ends and every bucket's extremes", () => {
    const rows = Array.from({ length: 10_000 }, (_, i) => ({ tK: 300 + i * 0.1, y: Math.sin(i / 50) + (i === 4321 ? 5 : 0) }));
    const out = downsample(rows, ["y"], 1200);
    expect(out.length).toBeLessThanOrEqual(1200);
    expect(out[0]).toBe(rows[0]);
    expect(out[out.length - 1]).toBe(rows[rows.length - 1]);
    expect(out).toContain(rows[4321]);
    expect(out.map((r) => r.tK)).toEqual([...out.map((r) => r.tK)].sort((a, b) => a - b));
  });

  it("leaves a short series alone", () => {
    const rows = [
      { tK: 1, y: 1 },
      { tK: 2, y: 2 },
    ];
    expect(downsample(rows, ["y"])).toEqual(rows);
  });
});

describe("sampleIndices (the columns variant, synthetic, invented for this test)", () => {
  const n = 10_000;
  const rising = Array.from({ length: n }, (_, i) => i / n);
  const falling = rising.map((v) => 1 - v);
  const spike = rising.map((v, i) => Math.sin(i / 50) + (i === 4321 ? 5 : 0));
  // A stretch of 3 points beyond tolerance inside one bucket.
  const beyond = rising.map((_, i) => i >= 7000 && i < 7003);

  it("keeps both ends and every bucket's extremes, ascending, within the limit, with nulls skipped", () => {
    const withNulls = spike.map((v, i) => (i % 7 === 0 ? null : v));
    const out = sampleIndices(n, [withNulls, rising], 1200);
    expect(out.length).toBeLessThanOrEqual(1200);
    expect(out[0]).toBe(0);
    expect(out[out.length - 1]).toBe(n - 1);
    expect(out).toContain(4321);
    expect(out).toEqual([...out].sort((a, b) => a - b));
  });

  it("a boolean series counts as 0/1, so a short stretch beyond tolerance keeps a point", () => {
    expect(sampleIndices(n, [rising, beyond], 200).some((i) => beyond[i])).toBe(true);
  });

  it("monotone series share their extremes at the bucket ends: more buckets fill the limit instead of the rule's floor", () => {
    // The rule alone: 6 series → 12 per bucket → 99 buckets → about 200 distinct points.
    const out = sampleIndices(n, [rising, falling, rising, falling, rising, falling], 1200);
    expect(out.length).toBeLessThanOrEqual(1200);
    expect(out.length).toBeGreaterThan(1000);
  });

  it("every index when the series fit", () => {
    expect(sampleIndices(3, [[1, 2, 3]], 1200)).toEqual([0, 1, 2]);
  });
});

describe("temperatures as entered", () => {
  it("convert °C and °F, and treat a step as a difference (common practice)", () => {
    expect(toKelvin("25 degC")).toBeCloseTo(298.15, 12);
    expect(toKelvin("-40 degF")).toBeCloseTo(233.15, 12);
    expect(toKelvin(500)).toBe(500);
    expect(toKelvinDifference("18 degF")).toBeCloseTo(10, 12);
    expect(toKelvinDifference("10 degC")).toBe(10);
    expect(joinQuantity(400, "degC")).toBe("400 degC");
    expect(joinQuantity(400, "K")).toBe(400);
    expect(splitQuantity("abc")).toBeNull();
  });
});

describe("element balance", () => {
  it("names the elements that do not balance, products minus reactants", () => {
    expect(
      elementBalance([
        { formula: "N2", coefficient: -1 },
        { formula: "H2", coefficient: -3 },
        { formula: "NH3", coefficient: 2 },
      ]),
    ).toEqual({ ok: true, elements: { N: 0, H: 0 } });
    const off = elementBalance([
      { formula: "CH4", coefficient: -1 },
      { formula: "H2O", coefficient: -1 },
      { formula: "CO", coefficient: 1 },
      { formula: "H2", coefficient: 2 },
    ]);
    expect(off).toMatchObject({ ok: false, message: "Not balanced: H -2 (products minus reactants)." });
    expect(
      reactionText([
        { key: "N2(g)", coefficient: -1 },
        { key: "H2(g)", coefficient: -3 },
        { key: "NH3(g)", coefficient: 2 },
      ]),
    ).toBe("N2(g) + 3 H2(g) → 2 NH3(g)");
  });
});
