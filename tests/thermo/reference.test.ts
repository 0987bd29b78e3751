/**
 * Every published coefficient set against the NIST-JANAF check rows, and the numerical
 * integration against each set's own closed form. Data: ../shared/reference/ (see README there).
 */
import { describe, expect, it } from "vitest";
import { evaluate, R, speciesProperties, type SegmentInput, type SpeciesInput } from "@/lib/thermo";
import { FAMILY_SOURCE, janafRows, recordGroups, records, speciesEntry, type Family } from "./reference-data";

// Fair tolerances from ../shared/reference/README.md.
const TOL = {
  shomate: { cp: 0.05, s: 0.02, h: 0.005 },
  nasa7Gas: { cp: 0.25, s: 0.1, h: 0.1 },
  nasa7Liquid: { cp: 1.0, s: 0.05, h: 0.02 },
};
// README: CH4 and NH3 differ between families by design (different evaluated data), so
// the NASA-7 sets of those two are checked against their own equations only (below).
const DIFFERS_BY_DESIGN = new Set(["CH4", "NH3"]);

const rows = janafRows();
/** ΔfH°(298.15 K) from the JANAF row; elements in their reference state are 0. */
const dfH298 = (species: string, phase: string) => rows.find((r) => r.species === species && r.phase === phase && r.T === 298.15)?.dfH ?? 0;

describe("published sets vs NIST-JANAF Tables, 4th ed. (Chase 1998), 1 bar", () => {
  const cases = recordGroups().flatMap((g) =>
    rows
      .filter((r) => r.species === g.species && r.phase === g.phase)
      .filter(() => g.family === "shomate-janaf" || !DIFFERS_BY_DESIGN.has(g.species))
      .map((row) => ({ ...g, row })),
  );

  it("covers every record family", () => {
    expect(new Set(cases.map((c) => c.family))).toEqual(new Set<Family>(["nasa7-2015", "nasa7-gri30", "shomate-janaf"]));
    expect(cases.length).toBeGreaterThanOrEqual(40);
  });

  it.each(cases.map((c) => [`${c.family} ${c.species}(${c.phase}) #${c.variant} at ${c.row.T} K (JANAF ${c.row.janafTable})`, c] as const))("%s", (_name, c) => {
    const tol = c.family === "shomate-janaf" ? TOL.shomate : c.phase === "l" ? TOL.nasa7Liquid : TOL.nasa7Gas;
    // The GRI-Mech N2 set is on 1 atm; after the engine converts it, S is within 0.04.
    const sTol = c.family === "nasa7-gri30" && c.species === "N2" ? 0.04 : tol.s;
    const { rows: out } = speciesProperties(c.entry, [c.row.T]);
    const p = out[0];
    expect(Math.abs(p.cpJ - c.row.Cp), "Cp").toBeLessThanOrEqual(tol.cp);
    expect(Math.abs(p.sJ - c.row.S), "S").toBeLessThanOrEqual(sTol);
    expect(Math.abs(p.hkJ - (dfH298(c.species, c.phase) + c.row.HmH298)), "H").toBeLessThanOrEqual(tol.h);
  });

  it("GRI-Mech 3.0 N2 (1 atm basis) is within S 0.04 of JANAF only after the 1 atm → 1 bar conversion", () => {
    const gri = speciesEntry("nasa7-gri30", "N2", "g");
    expect(gri.standardPressurePa).toBe(101325);
    const unconverted: SpeciesInput = { ...gri, standardPressurePa: 100000 };
    for (const row of rows.filter((r) => r.species === "N2")) {
      // NIST-JANAF Tables, 4th ed. (Chase 1998), N2(g), table N-023, 298.15 K and 1000 K
      const converted = speciesProperties(gri, [row.T]).rows[0].sJ;
      const raw = speciesProperties(unconverted, [row.T]).rows[0].sJ;
      expect(Math.abs(converted - row.S)).toBeLessThanOrEqual(0.04);
      expect(Math.abs(raw - row.S)).toBeGreaterThan(0.04);
      // README: S°(1 bar) − S°(1 atm) = R ln 1.01325 = 0.10944 J/(mol·K)
      expect(converted - raw).toBeCloseTo(R * Math.log(1.01325), 12);
      expect(converted - raw).toBeCloseTo(0.10944, 5);
    }
  });

  it("H2O(g) Shomate set is published from 500 K: 298.15 K is an extrapolation and says so", () => {
    const { rows: out, warnings } = speciesProperties(speciesEntry("shomate-janaf", "H2O", "g"), [298.15], { referenceK: 298.15 });
    // NIST-JANAF Tables, 4th ed. (Chase 1998), H2O(g), table H-064, 298.15 K. The note on the record says the
    // extrapolation reproduces JANAF "within 0.001 J/(mol·K)", a one-figure bound (< 0.0015): the published set's own
    // closed form gives 188.83527 against the row's 188.834, 0.0013 apart.
    const janaf = rows.find((r) => r.species === "H2O" && r.phase === "g" && r.T === 298.15)!;
    expect(janaf.janafTable).toBe("H-064");
    expect(Math.abs(out[0].sJ - janaf.S)).toBeLessThan(0.0015);
    expect(warnings.map((w) => w.code)).toContain("extrapolation");
    expect(warnings.map((w) => w.code)).toContain("reference-extrapolation");
  });

  it("NASA-7 ice and liquid water give ΔfusH ≈ 6.00 kJ/mol and ΔfusS ≈ 21.95 J/(mol·K) at 273.15 K", () => {
    // README (common practice values): ΔfusH(273.15 K) ≈ 6.00 kJ/mol, ΔfusS ≈ 21.95 J/(mol·K)
    const water: SpeciesInput = {
      segments: [...speciesEntry("nasa7-2015", "H2O", "cr").segments, ...speciesEntry("nasa7-2015", "H2O", "l").segments],
    };
    const cr = speciesProperties(water, [273.15], { phase: "cr" }).rows[0];
    const l = speciesProperties(water, [273.15], { phase: "l" }).rows[0];
    expect(l.hkJ - cr.hkJ).toBeCloseTo(6.0, 2);
    expect(l.sJ - cr.sJ).toBeCloseTo(21.95, 2);
  });
});

describe("reactions from sets of one family vs NIST-JANAF (Chase 1998) log Kf and ΔfG", () => {
  const janaf = (species: string, phase: string, T: number) => rows.find((r) => r.species === species && r.phase === phase && r.T === T)!;
  type Rx = { name: string; reaction: string; keys: Record<string, [string, string]>; temps: number[]; janaf: (T: number) => { logK: number; dG: number }; nasa: boolean };
  const formation = (species: string, phase: string) => (T: number) => ({ logK: janaf(species, phase, T).logKf!, dG: janaf(species, phase, T).dfG! });
  const reactions: Rx[] = [
    // JANAF H-064 (H2O(g)) log Kf and ΔfG at 298.15 and 1000 K
    {
      name: "H2O(g) formation",
      reaction: "H2(g) + 0.5 O2(g) -> H2O(g)",
      keys: { "H2(g)": ["H2", "g"], "O2(g)": ["O2", "g"], "H2O(g)": ["H2O", "g"] },
      temps: [298.15, 1000],
      janaf: formation("H2O", "g"),
      nasa: true,
    },
    // JANAF H-063 (H2O(l)) at 298.15 and 400 K
    {
      name: "H2O(l) formation",
      reaction: "H2(g) + 1/2 O2(g) = H2O(l)",
      keys: { "H2(g)": ["H2", "g"], "O2(g)": ["O2", "g"], "H2O(l)": ["H2O", "l"] },
      temps: [298.15, 400],
      janaf: formation("H2O", "l"),
      nasa: true,
    },
    // JANAF H-083 (NH3) at 298.15 and 1000 K
    {
      name: "NH3 formation",
      reaction: "0.5 N2(g) + 1.5 H2(g) -> NH3(g)",
      keys: { "N2(g)": ["N2", "g"], "H2(g)": ["H2", "g"], "NH3(g)": ["NH3", "g"] },
      temps: [298.15, 1000],
      janaf: formation("NH3", "g"),
      nasa: false,
    },
    // JANAF C-095 − C-093 − H-064: log K = log Kf(CO2) − log Kf(CO) − log Kf(H2O)
    {
      name: "water-gas shift",
      reaction: "CO(g) + H2O(g) -> CO2(g) + H2(g)",
      keys: { "CO(g)": ["CO", "g"], "H2O(g)": ["H2O", "g"], "CO2(g)": ["CO2", "g"], "H2(g)": ["H2", "g"] },
      temps: [298.15, 1000],
      janaf: (T) => ({
        logK: janaf("CO2", "g", T).logKf! - janaf("CO", "g", T).logKf! - janaf("H2O", "g", T).logKf!,
        dG: janaf("CO2", "g", T).dfG! - janaf("CO", "g", T).dfG! - janaf("H2O", "g", T).dfG!,
      }),
      nasa: true,
    },
    // JANAF C-093 − C-067 − H-064
    {
      name: "steam reforming",
      reaction: "CH4(g) + H2O(g) -> CO(g) + 3 H2(g)",
      keys: { "CH4(g)": ["CH4", "g"], "H2O(g)": ["H2O", "g"], "CO(g)": ["CO", "g"], "H2(g)": ["H2", "g"] },
      temps: [298.15, 1000],
      janaf: (T) => ({
        logK: janaf("CO", "g", T).logKf! - janaf("CH4", "g", T).logKf! - janaf("H2O", "g", T).logKf!,
        dG: janaf("CO", "g", T).dfG! - janaf("CH4", "g", T).dfG! - janaf("H2O", "g", T).dfG!,
      }),
      nasa: false,
    },
  ];
  const families: { family: Family; logK: number; dG: number }[] = [
    { family: "shomate-janaf", logK: 0.003, dG: 0.03 },
    { family: "nasa7-2015", logK: 0.05, dG: 0.3 },
  ];
  const cases = families.flatMap((f) => reactions.filter((r) => f.family === "shomate-janaf" || r.nasa).map((r) => ({ ...f, ...r })));
  it.each(cases.map((c) => [`${c.name} from ${FAMILY_SOURCE[c.family]}`, c] as const))("%s", (_n, c) => {
    const species = Object.fromEntries(Object.entries(c.keys).map(([k, [sp, ph]]) => [k, speciesEntry(c.family, sp, ph)]));
    const result = evaluate({ reaction: c.reaction, species, temperatures: { listK: c.temps } });
    for (const p of result.points) {
      const ref = c.janaf(p.tK);
      expect(Math.abs(p.log10K - ref.logK), `log10 K at ${p.tK} K`).toBeLessThanOrEqual(c.logK);
      expect(Math.abs(p.dGkJ - ref.dG), `ΔrG at ${p.tK} K`).toBeLessThanOrEqual(c.dG);
    }
  });
});

// ------------------------------------------------------------ numeric integration vs closed form

/** Closed forms of the published equations (README's `equations` field): the test oracle. */
function closedForm(seg: SegmentInput): { h: (T: number) => number; s: (T: number) => number } {
  if (seg.form === "shomate") {
    const { A, B, C, D, E, F, G } = seg.coeffs;
    return {
      h: (T) => {
        const t = T / 1000;
        return A * t + (B * t ** 2) / 2 + (C * t ** 3) / 3 + (D * t ** 4) / 4 - E / t + F;
      },
      s: (T) => {
        const t = T / 1000;
        return A * Math.log(t) + B * t + (C * t ** 2) / 2 + (D * t ** 3) / 3 - E / (2 * t ** 2) + G;
      },
    };
  }
  if (seg.form === "nasa7") {
    const [a1, a2, a3, a4, a5, a6, a7] = seg.coeffs;
    return {
      h: (T) => (R * T * (a1 + (a2 * T) / 2 + (a3 * T ** 2) / 3 + (a4 * T ** 3) / 4 + (a5 * T ** 4) / 5 + a6 / T)) / 1000,
      s: (T) => R * (a1 * Math.log(T) + a2 * T + (a3 * T ** 2) / 2 + (a4 * T ** 3) / 3 + (a5 * T ** 4) / 4 + a7),
    };
  }
  if (seg.form === "nasa9") {
    const [a1, a2, a3, a4, a5, a6, a7, b1, b2] = seg.coeffs;
    return {
      h: (T) => (R * T * (-a1 / T ** 2 + (a2 * Math.log(T)) / T + a3 + (a4 * T) / 2 + (a5 * T ** 2) / 3 + (a6 * T ** 3) / 4 + (a7 * T ** 4) / 5 + b1 / T)) / 1000,
      s: (T) => R * (-a1 / (2 * T ** 2) - a2 / T + a3 * Math.log(T) + a4 * T + (a5 * T ** 2) / 2 + (a6 * T ** 3) / 3 + (a7 * T ** 4) / 4 + b2),
    };
  }
  throw new Error(`no closed form for ${seg.form}`);
}

/** Relative 1e-10 with an absolute floor of 1e-9 (kJ/mol for H, J/(mol·K) for S): README. */
function expectClose(actual: number, expected: number, what: string) {
  expect(Math.abs(actual - expected), `${what}: ${actual} vs ${expected}`).toBeLessThanOrEqual(Math.max(1e-10 * Math.abs(expected), 1e-9));
}

/** Grid across each range, both sides of every boundary, and beyond both ends of the chain. */
function probeTemperatures(segs: SegmentInput[]): { tK: number; seg: SegmentInput }[] {
  const out: { tK: number; seg: SegmentInput }[] = [];
  segs.forEach((seg, i) => {
    const lo = Number(seg.tminK);
    const hi = Number(seg.tmaxK);
    for (let k = 0; k <= 24; k++) out.push({ tK: lo + ((hi - lo) * k) / 24, seg });
    out.push({ tK: lo + 1e-6, seg }, { tK: hi - 1e-6, seg });
    if (i === 0) out.push({ tK: lo * 0.8, seg });
    if (i === segs.length - 1) out.push({ tK: hi * 1.1, seg });
  });
  // An edge belongs to the lower segment: drop the upper segment's copy of each shared edge.
  return out.filter((p, j) => !out.some((q, k) => k < j && q.tK === p.tK));
}

/** A NASA-9 set equivalent to a NASA-7 set (a1 = a2 = 0, a3..a7 = a1..a5, b1 = a6, b2 = a7). */
function asNasa9(seg: SegmentInput): SegmentInput {
  if (seg.form !== "nasa7") throw new Error("nasa7 only");
  const [a1, a2, a3, a4, a5, a6, a7] = seg.coeffs;
  return { ...seg, form: "nasa9", coeffs: [0, 0, a1, a2, a3, a4, a5, a6, a7] };
}

describe("numerical integration reproduces each set's closed form (1e-10 relative, 1e-9 floor)", () => {
  const groups = recordGroups();
  const withNasa9 = [
    ...groups.map((g) => ({ name: `${g.family} ${g.species}(${g.phase}) #${g.variant}`, entry: g.entry })),
    ...groups
      .filter((g) => g.family === "nasa7-2015" && ["H2O", "CO2"].includes(g.species) && g.phase === "g")
      .map((g) => ({ name: `NASA-9 rewrite of nasa7-2015 ${g.species}(g)`, entry: { ...g.entry, segments: g.entry.segments.map(asNasa9) } })),
  ];
  it("checks all 39 published records", () => {
    expect(records().length).toBe(39);
    expect(groups.reduce((n, g) => n + (g.family === "shomate-janaf" ? g.entry.segments.length : 1), 0)).toBe(39);
  });
  it.each(withNasa9.map((g) => [g.name, g] as const))("%s: cumulative grid pass and single points", (_n, g) => {
    const segs = g.entry.segments;
    const probes = probeTemperatures(segs);
    const sCorr = g.entry.standardPressurePa === 101325 ? R * Math.log(101325 / 100000) : 0;
    for (const referenceK of [298.15, 1000]) {
      const { rows: out } = speciesProperties(
        g.entry,
        probes.map((p) => p.tK),
        { referenceK },
      );
      probes.forEach((p, i) => {
        const cf = closedForm(p.seg);
        expectClose(out[i].hkJ, cf.h(p.tK), `H at ${p.tK} K (Tref ${referenceK})`);
        expectClose(out[i].sJ, cf.s(p.tK) + sCorr, `S at ${p.tK} K (Tref ${referenceK})`);
      });
    }
    for (const p of probes.filter((_, i) => i % 7 === 0)) {
      const one = speciesProperties(g.entry, [p.tK]).rows[0];
      const cf = closedForm(p.seg);
      expectClose(one.hkJ, cf.h(p.tK), `single-point H at ${p.tK} K`);
      expectClose(one.sJ, cf.s(p.tK) + sCorr, `single-point S at ${p.tK} K`);
    }
  });

  // Constant-less forms written to reproduce a published set, anchored by a reference.
  const co = speciesEntry("shomate-janaf", "CO", "g").segments[0];
  if (co.form !== "shomate") throw new Error("expected the CO Shomate set");
  const { A, B, C, D, E } = co.coeffs;
  const cf = closedForm(co);
  const ref = { tK: 298.15, phase: "g", hkJ: cf.h(298.15), sJ: cf.s(298.15) };
  const range = { phase: "g", tminK: 298, tmaxK: 1300 };
  const rewrites: [string, SegmentInput][] = [
    [
      "power form (k = 0, 1, 2, 3, −2)",
      {
        ...range,
        form: "power",
        coeffs: {
          terms: [
            { k: 0, c: A },
            { k: 1, c: B / 1e3 },
            { k: 2, c: C / 1e6 },
            { k: 3, c: D / 1e9 },
            { k: -2, c: E * 1e6 },
          ],
        },
      },
    ],
    ["expression form", { ...range, form: "expression", coeffs: { cp: `${A} + ${B}e-3*T + ${C}e-6*T^2 + ${D}e-9*T^3 + ${E}e6/T^2` } }],
  ];
  it.each(rewrites)("the CO Shomate set (Chase 1998 fit) rewritten in the %s matches the Shomate closed form", (_n, seg) => {
    const temps = [298.15, 300, 450, 700, 999.5, 1300, 1500];
    const { rows: out } = speciesProperties({ segments: [seg], reference: ref }, temps);
    temps.forEach((t, i) => {
      expectClose(out[i].hkJ, cf.h(t), `H at ${t} K`);
      expectClose(out[i].sJ, cf.s(t), `S at ${t} K`);
    });
  });

  it("maier-kelley and constant forms match their antiderivatives", () => {
    // Derived model (CO Shomate A, B, E terms only), checked against its own closed form, not data.
    const a = A,
      b = B / 1e3,
      c = E * 1e6;
    const mk: SpeciesInput = { segments: [{ ...range, form: "maier-kelley", coeffs: { a, b, c } }], reference: ref };
    const h = (T: number) => ref.hkJ + (a * (T - 298.15) + (b / 2) * (T ** 2 - 298.15 ** 2) - c * (1 / T - 1 / 298.15)) / 1000;
    const s = (T: number) => ref.sJ + a * Math.log(T / 298.15) + b * (T - 298.15) - (c / 2) * (1 / T ** 2 - 1 / 298.15 ** 2);
    const temps = [298.15, 400, 800, 1300];
    speciesProperties(mk, temps).rows.forEach((r, i) => {
      expectClose(r.hkJ, h(temps[i]), "maier-kelley H");
      expectClose(r.sJ, s(temps[i]), "maier-kelley S");
    });
    // Common practice: liquid water Cp 75.3 J/(mol·K) near 273–373 K; H and S from the JANAF H-063 row at 298.15 K.
    const water: SpeciesInput = {
      segments: [{ phase: "l", form: "constant", tminK: 273.15, tmaxK: 373.15, coeffs: { cpJ: 75.3 } }],
      reference: { tK: 298.15, phase: "l", hkJ: -285.83, sJ: 69.95 },
    };
    speciesProperties(water, [273.15, 350]).rows.forEach((r) => {
      expectClose(r.hkJ, -285.83 + (75.3 * (r.tK - 298.15)) / 1000, "constant H");
      expectClose(r.sJ, 69.95 + 75.3 * Math.log(r.tK / 298.15), "constant S");
    });
  });

  it("a table sampled from the CO Shomate set every 50 K (monotone cubic) stays within the Shomate tolerances of JANAF C-093 at 1000 K", () => {
    const cp = (T: number) => {
      const t = T / 1000;
      return A + B * t + C * t ** 2 + D * t ** 3 + E / t ** 2;
    };
    const points: [number, number][] = [];
    for (let T = 250; T <= 1300; T += 50) points.push([T, cp(T)]);
    const table: SpeciesInput = { segments: [{ ...range, tminK: 250, form: "table", coeffs: { points } }], reference: ref };
    const row = rows.find((r) => r.species === "CO" && r.T === 1000)!;
    const p = speciesProperties(table, [1000]).rows[0];
    // NIST-JANAF Tables, 4th ed. (Chase 1998), CO(g), table C-093, 1000 K
    expect(Math.abs(p.cpJ - row.Cp)).toBeLessThanOrEqual(TOL.shomate.cp);
    expect(Math.abs(p.sJ - row.S)).toBeLessThanOrEqual(TOL.shomate.s);
    expect(Math.abs(p.hkJ - (-110.527 + row.HmH298))).toBeLessThanOrEqual(TOL.shomate.h);
  });
});
