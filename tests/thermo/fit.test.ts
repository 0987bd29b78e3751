/**
 * Least-squares fitting: recovers known coefficients from synthetic noisy data; exact refusals.
 * Noise-free recoveries are held to 1e-7–1e-8 relative: double precision through a least-squares
 * solve loses digits with the condition number, so this is a round-off allowance (common practice).
 */
import { describe, expect, it } from "vitest";
import { EngineRefusal, fitCp, R, speciesProperties } from "@/lib/thermo";
import { janafRows, speciesEntry } from "./reference-data";
import { seededNormals } from "../helpers/random";

const rng = seededNormals;

// The CO(g) Shomate set 298–1300 K (fit to NIST-JANAF, Chase 1998) generates the data.
// NIST-JANAF Tables, 4th ed. (Chase 1998) rows: CO(g) table C-093 and N2(g) table N-023.
const janaf = (species: string, tK: number, table: string) => {
  const row = janafRows().find((r) => r.species === species && r.phase === "g" && r.T === tK)!;
  expect(row.janafTable).toBe(table);
  return row;
};
const co = speciesEntry("shomate-janaf", "CO", "g").segments[0];
if (co.form !== "shomate") throw new Error("expected the CO Shomate set");
const { A, B, C, D, E } = co.coeffs;
const cpShomate = (T: number) => {
  const t = T / 1000;
  return A + B * t + C * t * t + D * t ** 3 + E / (t * t);
};

function synthetic(n: number, sigma: number, seed: number, lo = 298, hi = 1300) {
  const normal = rng(seed);
  return Array.from({ length: n }, (_, i) => {
    const tK = lo + ((hi - lo) * i) / (n - 1);
    return { tK, cpJ: cpShomate(tK) + sigma * normal(), sigmaJ: sigma };
  });
}

describe("fitCp", () => {
  it("recovers the Shomate coefficients exactly from noise-free points", () => {
    const fit = fitCp({ form: "shomate", points: synthetic(60, 0, 1).map(({ tK, cpJ }) => ({ tK, cpJ })) });
    const want = { A, B, C, D, E };
    for (const [k, v] of Object.entries(want)) expect(Math.abs(fit.coefficients[k] - v)).toBeLessThanOrEqual(1e-8 * Math.max(1, Math.abs(v)));
    expect(fit.rmsJ).toBeLessThan(1e-10);
    expect(fit.r2).toBeCloseTo(1, 12);
    expect(fit.conditionNumber).toBeGreaterThan(1);
  });

  it("recovers the curve and constants from noisy points (σ = 0.02 J/(mol·K), seeded), weighted", () => {
    const sigma = 0.02;
    // NIST-JANAF C-093, CO(g) at 298.15 K: ΔfH° and S° as the reference
    const co298 = janaf("CO", 298.15, "C-093");
    const fit = fitCp({ form: "shomate", points: synthetic(400, sigma, 42), reference: { tK: 298.15, hkJ: co298.dfH!, sJ: co298.S } });
    // Derived: the rms of 400 N(0, σ) residuals estimates σ to about 1/√800 ≈ 3.5 %, so ±20 % is over five of
    // those; a 5σ residual has odds of about 2e-4 in 400 draws (normal tails).
    expect(fit.rmsJ).toBeGreaterThan(0.8 * sigma);
    expect(fit.rmsJ).toBeLessThan(1.2 * sigma);
    expect(fit.maxAbsJ).toBeLessThan(5 * sigma);
    for (let T = 300; T <= 1300; T += 50) {
      const t = T / 1000;
      const c = fit.coefficients;
      const cp = c.A + c.B * t + c.C * t * t + c.D * t ** 3 + c.E / (t * t);
      // Derived: 400 points pin a five-term curve far tighter than one point's σ.
      expect(Math.abs(cp - cpShomate(T))).toBeLessThan(sigma);
    }
    // The constants put the fitted curve on the given reference: H parameter = ΔfH°(298.15 K), S(298.15 K) = S°.
    expect(fit.integrationConstants!.H).toBeCloseTo(co298.dfH!, 9);
    const at298 = speciesProperties({ segments: [fit.segment!] }, [298.15]).rows[0];
    expect(at298.hkJ).toBeCloseTo(co298.dfH!, 9);
    expect(at298.sJ).toBeCloseTo(co298.S, 9);
    // The fitted segment drops straight into the engine and meets JANAF C-093 at 1000 K within the Shomate
    // tolerances of ../shared/reference/README.md (Cp 0.05, S 0.02 J/(mol·K)).
    const co1000 = janaf("CO", 1000, "C-093");
    const p = speciesProperties({ segments: [fit.segment!] }, [1000]).rows[0];
    expect(Math.abs(p.cpJ - co1000.Cp)).toBeLessThanOrEqual(0.05);
    expect(Math.abs(p.sJ - co1000.S)).toBeLessThanOrEqual(0.02);
  });

  it("nasa7, maier-kelley and power fits recover the polynomials they are given", () => {
    // The nasa7-2015 N2 low range (third-millennium database, 2015 update) generates exact data.
    const n2 = speciesEntry("nasa7-2015", "N2", "g").segments[0];
    if (n2.form !== "nasa7") throw new Error("nasa7 expected");
    const a = n2.coeffs;
    const cpN2 = (T: number) => R * (a[0] + a[1] * T + a[2] * T ** 2 + a[3] * T ** 3 + a[4] * T ** 4);
    const pts = Array.from({ length: 50 }, (_, i) => ({ tK: 200 + 16 * i, cpJ: cpN2(200 + 16 * i) }));
    // NIST-JANAF Tables, 4th ed. (Chase 1998), N2(g), table N-023, 298.15 K: S° (ΔfH° of an element is 0).
    const n2Row = janaf("N2", 298.15, "N-023");
    const nasa = fitCp({ form: "nasa7", points: pts, reference: { tK: 298.15, hkJ: 0, sJ: n2Row.S } });
    ["a1", "a2", "a3", "a4", "a5"].forEach((k, i) => expect(Math.abs(nasa.coefficients[k] / a[i] - 1)).toBeLessThan(1e-7));
    expect(nasa.segment!.form).toBe("nasa7");
    // Maier–Kelley and power data made in the test from the CO set's A, B, E terms.
    const mkPts = Array.from({ length: 30 }, (_, i) => {
      const T = 300 + 30 * i;
      return { tK: T, cpJ: A + (B / 1e3) * T + (E * 1e6) / T ** 2 };
    });
    const mk = fitCp({ form: "maier-kelley", points: mkPts });
    expect(mk.coefficients.a).toBeCloseTo(A, 8);
    expect(mk.coefficients.b).toBeCloseTo(B / 1e3, 11);
    expect(mk.coefficients.c / (E * 1e6)).toBeCloseTo(1, 8);
    const co298 = janaf("CO", 298.15, "C-093");
    const pw = fitCp({ form: "power", exponents: [0, 1, -2], points: mkPts, reference: { tK: 298.15, hkJ: co298.dfH!, sJ: co298.S } });
    expect(pw.coefficients["T^-2"] / (E * 1e6)).toBeCloseTo(1, 8);
    expect(pw.reference).toEqual({ tK: 298.15, phase: "g", hkJ: co298.dfH!, sJ: co298.S });
  });

  const refusal = (fn: () => unknown) => {
    try {
      fn();
    } catch (e) {
      if (e instanceof EngineRefusal) return e;
      throw e;
    }
    throw new Error("expected a refusal");
  };
  it.each([
    [
      "fewer points than coefficients",
      {
        form: "shomate",
        points: [
          { tK: 300, cpJ: 29 },
          { tK: 400, cpJ: 30 },
        ],
      },
      "fit-too-few-points",
      "fit: 2 points cannot determine the 5 coefficients of the shomate form",
    ],
    [
      "duplicate temperatures only",
      {
        form: "maier-kelley",
        points: [
          { tK: 300, cpJ: 29 },
          { tK: 300, cpJ: 29.1 },
          { tK: 300, cpJ: 28.9 },
        ],
      },
      "fit-duplicate-temperatures",
      "fit: only 1 distinct temperature for the 3 coefficients of the maier-kelley form; repeated temperatures add no information",
    ],
    [
      "a non-finite value",
      {
        form: "maier-kelley",
        points: [
          { tK: 300, cpJ: 29 },
          { tK: 400, cpJ: Number.NaN },
          { tK: 500, cpJ: 31 },
        ],
      },
      "fit-nonfinite",
      "fit: point 2 has a non-finite value",
    ],
    [
      "an infinite temperature",
      {
        form: "maier-kelley",
        points: [
          { tK: Infinity, cpJ: 29 },
          { tK: 400, cpJ: 30 },
          { tK: 500, cpJ: 31 },
        ],
      },
      "fit-nonfinite",
      "fit: point 1 has a non-finite value",
    ],
    [
      "negative kelvin",
      {
        form: "maier-kelley",
        points: [
          { tK: 300, cpJ: 29 },
          { tK: -40, cpJ: 30 },
          { tK: 500, cpJ: 31 },
        ],
      },
      "fit-nonpositive-temperature",
      "fit: point 2 is at -40 K; temperatures must be above 0 K",
    ],
    [
      "a non-positive sigma",
      {
        form: "maier-kelley",
        points: [
          { tK: 300, cpJ: 29, sigmaJ: 0 },
          { tK: 400, cpJ: 30 },
          { tK: 500, cpJ: 31 },
        ],
      },
      "fit-invalid-sigma",
      "fit: point 1 has sigmaJ 0; an uncertainty must be positive",
    ],
    ["an unknown form", { form: "cubic", points: [] }, "invalid-request", 'invalid fit request: form: Invalid option: expected one of "shomate"|"nasa7"|"maier-kelley"|"power"'],
  ] as const)("refuses %s", (_n, req, code, message) => {
    const e = refusal(() => fitCp(req as never));
    expect(e.code).toBe(code);
    expect(e.message).toBe(message);
  });
});
