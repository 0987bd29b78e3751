/**
 * The 36 further published sets (../shared/reference/cp-coefficients-more.json, read relative
 * to the repo root) against the published values and checks its README lists, with the
 * README's tolerances: graphite, methanol, C2–C3 hydrocarbons, Ar, He, NO, NO2, N2O, SO2, H2S,
 * HCl, Cl2, O, H, OH, HCN, CH2O.
 */
import { describe, expect, it } from "vitest";
import { evaluate, R, speciesProperties, type SpeciesInput } from "@/lib/thermo";
import { familyOf, readReference, segmentsOf, speciesEntry, type CoefficientRecord, type Family } from "./reference-data";

const more = readReference<CoefficientRecord[]>("cp-coefficients-more.json");

/**
 * The README states its maxima rounded to the digits it prints ("within 0.004", "7e-4"), so a
 * difference meets a stated figure when it rounds to it: below the figure plus half a unit of
 * its last printed digit (0.004 → 0.0045, 1.3e-5 → 1.35e-5).
 */
function stated(figure: string): number {
  const [mant, exp] = figure.toLowerCase().split("e");
  const decimals = mant.includes(".") ? mant.split(".")[1].length : 0;
  return (Number(mant) + 0.5 * 10 ** -decimals) * 10 ** Number(exp ?? 0);
}

/** The species entry of one family's record(s) for a species (Cl2's three Shomate ranges form one chain). */
function entry(family: Family, species: string): SpeciesInput {
  const recs = more.filter((r) => familyOf(r) === family && r.species === species);
  if (recs.length === 0) throw new Error(`no ${family} record for ${species} in cp-coefficients-more.json`);
  return { segments: recs.flatMap(segmentsOf), standardPressurePa: recs[0].standardPressurePa };
}
const at = (e: SpeciesInput, tK: number) => speciesProperties(e, [tK]).rows[0];
/** H − H(298.15 K), kJ/mol. */
const dH = (e: SpeciesInput, tK: number) => at(e, tK).hkJ - at(e, 298.15).hkJ;

/** Closed form of one NASA-7 range or Shomate record: Cp, H (kJ/mol), S at T, by its own equations. */
function closedForm(seg: ReturnType<typeof segmentsOf>[number], T: number) {
  if (seg.form === "nasa7") {
    const [a1, a2, a3, a4, a5, a6, a7] = seg.coeffs as number[];
    return {
      cp: R * (a1 + a2 * T + a3 * T ** 2 + a4 * T ** 3 + a5 * T ** 4),
      h: (R * T * (a1 + (a2 * T) / 2 + (a3 * T ** 2) / 3 + (a4 * T ** 3) / 4 + (a5 * T ** 4) / 5 + a6 / T)) / 1000,
      s: R * (a1 * Math.log(T) + a2 * T + (a3 * T ** 2) / 2 + (a4 * T ** 3) / 3 + (a5 * T ** 4) / 4 + a7),
    };
  }
  const { A, B, C, D, E, F, G, H } = seg.coeffs as Record<string, number>;
  const t = T / 1000;
  return {
    cp: A + B * t + C * t ** 2 + D * t ** 3 + E / t ** 2,
    h: A * t + (B * t ** 2) / 2 + (C * t ** 3) / 3 + (D * t ** 4) / 4 - E / t + F - H + H,
    s: A * Math.log(t) + B * t + (C * t ** 2) / 2 + (D * t ** 3) / 3 - E / (2 * t ** 2) + G,
  };
}

describe("cp-coefficients-more.json as the README describes it", () => {
  it("holds 36 sets: 19 third-millennium, 14 GRI-Mech 3.0, 3 Shomate ranges of Cl2", () => {
    expect(more).toHaveLength(36);
    const n = (f: Family) => more.filter((r) => familyOf(r) === f).length;
    expect([n("nasa7-2015"), n("nasa7-gri30"), n("shomate-janaf")]).toEqual([19, 14, 3]);
    // README: the third-millennium CH3OH set (T06/02) is left out; GRI's is in.
    expect(more.some((r) => r.species === "CH3OH" && familyOf(r) === "nasa7-2015")).toBe(false);
    // README: GRI Ar is on 1 atm; GRI C3H8 starts at 300 K.
    expect(more.find((r) => r.species === "Ar" && familyOf(r) === "nasa7-gri30")!.standardPressurePa).toBe(101325);
    expect(more.find((r) => r.species === "C3H8" && familyOf(r) === "nasa7-gri30")!.tmin).toBe(300);
  });
});

describe("numerical integration reproduces each range's own equations (1e-10 relative, 1e-9 floor)", () => {
  const cases = more.flatMap((r, i) =>
    segmentsOf(r).map((seg) => ({ name: `${familyOf(r)} ${r.species}(${r.phase}) record ${i} ${seg.tminK}–${seg.tmaxK} K`, seg, p: r.standardPressurePa })),
  );
  it.each(cases.map((c) => [c.name, c] as const))("%s", (_n, c) => {
    const e: SpeciesInput = { segments: [c.seg], standardPressurePa: c.p };
    const lo = Number(c.seg.tminK);
    const hi = Number(c.seg.tmaxK);
    // A 1 atm set's S is moved to 1 bar by the engine: + R ln 1.01325 (README, constants).
    const dS = c.p === 101325 ? R * Math.log(1.01325) : 0;
    for (const T of [lo, 298.15, (lo + hi) / 2, 1000, hi].filter((t) => t >= lo && t <= hi)) {
      const got = at(e, T);
      const want = closedForm(c.seg, T);
      expect(Math.abs(got.cpJ - want.cp)).toBeLessThanOrEqual(1e-9 * Math.abs(want.cp) + 1e-12);
      expect(Math.abs(got.hkJ - want.h)).toBeLessThanOrEqual(Math.max(1e-10 * Math.abs(want.h), 1e-9));
      expect(Math.abs(got.sJ - (want.s + dS))).toBeLessThanOrEqual(Math.max(1e-10 * Math.abs(want.s), 1e-9));
    }
  });
});

describe("checks the README runs on every set", () => {
  const twoRange = more.filter((r) => r.form === "nasa7" && r.tmid !== undefined);
  it.each(twoRange.map((r) => [`${familyOf(r)} ${r.species}`, r] as const))("%s: the two ranges meet at 1000 K as published", (_n, r) => {
    // README: |ΔCp| ≤ 4e-6 J/(mol·K), |ΔH| ≤ 5e-6 kJ/mol, |ΔS| ≤ 1.3e-5 J/(mol·K), except GRI C3H8 (7e-4, 1e-4, 1.5e-4).
    const tol =
      r.species === "C3H8" && familyOf(r) === "nasa7-gri30"
        ? { cp: stated("7e-4"), h: stated("1e-4"), s: stated("1.5e-4") }
        : { cp: stated("4e-6"), h: stated("5e-6"), s: stated("1.3e-5") };
    const [low, high] = segmentsOf(r);
    const a = closedForm(low, r.tmid!);
    const b = closedForm(high, r.tmid!);
    expect(Math.abs(a.cp - b.cp)).toBeLessThanOrEqual(tol.cp);
    expect(Math.abs(a.h - b.h)).toBeLessThanOrEqual(tol.h);
    expect(Math.abs(a.s - b.s)).toBeLessThanOrEqual(tol.s);
  });

  const tm = more.filter((r) => familyOf(r) === "nasa7-2015");
  it.each(tm.map((r) => [r.species, r] as const))("third-millennium %s: H(298.15 K) within 0.002 kJ/mol of the record's dfH298", (_n, r) => {
    expect(Math.abs(at(entry("nasa7-2015", r.species), 298.15).hkJ - r.dfH298kJ!)).toBeLessThanOrEqual(stated("0.002"));
  });
});

type Published = { name: string; family: Family; species: string; tK: number; what: "cp" | "s" | "dh"; value: number; tol: number };
// ../shared/reference/README.md, "Published values (298.15 K unless stated)"; tolerance 0.02 J/(mol·K)
// except GRI CH3OH (0.06) and NO2 S (0.15; Gurvich data underneath, 0.136 above JANAF).
const PUBLISHED: Published[] = [
  // NIST-JANAF Tables, 4th ed. (Chase 1998): NO Cp 29.845 and S 210.758
  ...(["nasa7-2015", "nasa7-gri30"] as const).flatMap((f) => [
    { name: "JANAF NO Cp", family: f, species: "NO", tK: 298.15, what: "cp" as const, value: 29.845, tol: stated("0.02") },
    { name: "JANAF NO S", family: f, species: "NO", tK: 298.15, what: "s" as const, value: 210.758, tol: stated("0.02") },
    // NIST-JANAF: NO2 S 240.034 (both NASA-7 families sit 0.136 above it)
    { name: "JANAF NO2 S", family: f, species: "NO2", tK: 298.15, what: "s" as const, value: 240.034, tol: stated("0.15") },
    // NIST-JANAF: C2H4 S 219.33
    { name: "JANAF C2H4 S", family: f, species: "C2H4", tK: 298.15, what: "s" as const, value: 219.33, tol: stated("0.02") },
    // NIST-JANAF: Ar Cp 20.786 and H(1000) − H(298.15) 14.589 kJ/mol
    { name: "JANAF Ar Cp", family: f, species: "Ar", tK: 298.15, what: "cp" as const, value: 20.786, tol: stated("0.02") },
    { name: "JANAF Ar H(1000)−H(298.15)", family: f, species: "Ar", tK: 1000, what: "dh" as const, value: 14.589, tol: stated("0.02") },
  ]),
  // NIST-JANAF: SO2 S 248.212
  { name: "JANAF SO2 S", family: "nasa7-2015", species: "SO2", tK: 298.15, what: "s", value: 248.212, tol: stated("0.02") },
  // CODATA key values: S of Ar 154.846 (GRI within 0.004 only after 1 atm → 1 bar), Cl2 223.081, HCl 186.902, graphite 5.74
  { name: "CODATA Ar S", family: "nasa7-2015", species: "Ar", tK: 298.15, what: "s", value: 154.846, tol: stated("0.02") },
  { name: "CODATA Ar S", family: "nasa7-gri30", species: "Ar", tK: 298.15, what: "s", value: 154.846, tol: stated("0.004") },
  { name: "CODATA Cl2 S", family: "nasa7-2015", species: "Cl2", tK: 298.15, what: "s", value: 223.081, tol: stated("0.02") },
  { name: "CODATA Cl2 S", family: "shomate-janaf", species: "Cl2", tK: 298.15, what: "s", value: 223.081, tol: stated("0.02") },
  { name: "CODATA HCl S", family: "nasa7-2015", species: "HCl", tK: 298.15, what: "s", value: 186.902, tol: stated("0.02") },
  { name: "CODATA graphite S", family: "nasa7-2015", species: "C", tK: 298.15, what: "s", value: 5.74, tol: stated("0.02") },
  // Gurvich et al.: Cp of SO2 39.84 and HCl 29.14; CH3OH S 239.87 and Cp 44.10 (GRI within 0.06)
  { name: "Gurvich SO2 Cp", family: "nasa7-2015", species: "SO2", tK: 298.15, what: "cp", value: 39.84, tol: stated("0.02") },
  { name: "Gurvich HCl Cp", family: "nasa7-2015", species: "HCl", tK: 298.15, what: "cp", value: 29.14, tol: stated("0.02") },
  { name: "Gurvich CH3OH S", family: "nasa7-gri30", species: "CH3OH", tK: 298.15, what: "s", value: 239.87, tol: stated("0.06") },
  { name: "Gurvich CH3OH Cp", family: "nasa7-gri30", species: "CH3OH", tK: 298.15, what: "cp", value: 44.1, tol: stated("0.06") },
];

describe("against published values (JANAF, CODATA key values, Gurvich), README tolerances", () => {
  it.each(PUBLISHED.map((p) => [`${p.name} ${p.value} via ${p.family}${p.tK !== 298.15 ? ` at ${p.tK} K` : ""}`, p] as const))("%s", (_n, p) => {
    const e = entry(p.family, p.species);
    const got = p.what === "cp" ? at(e, p.tK).cpJ : p.what === "s" ? at(e, p.tK).sJ : dH(e, p.tK);
    expect(Math.abs(got - p.value)).toBeLessThanOrEqual(p.tol);
  });

  it("GRI-Mech Ar (1 atm basis) is within 0.004 of CODATA S only after the 1 atm → 1 bar conversion", () => {
    const gri = entry("nasa7-gri30", "Ar");
    const raw = at({ ...gri, standardPressurePa: 100000 }, 298.15).sJ;
    // CODATA key value: S°(Ar, 298.15 K) 154.846 J/(mol·K); README: 0.114 low without the conversion
    expect(Math.abs(raw - 154.846)).toBeGreaterThan(0.1);
    expect(Math.abs(at(gri, 298.15).sJ - 154.846)).toBeLessThanOrEqual(stated("0.004"));
  });

  it("NO2: both NASA-7 families sit about 0.136 above JANAF S, as the README says", () => {
    for (const f of ["nasa7-2015", "nasa7-gri30"] as const) expect(at(entry(f, "NO2"), 298.15).sJ - 240.034).toBeCloseTo(0.136, 2);
  });
});

describe("across families (README: GRI vs third-millennium within 0.004 J/(mol·K) in Cp and S, 0.0003 kJ/mol in H − H298, except C3H8)", () => {
  const both = [...new Set(more.filter((r) => familyOf(r) === "nasa7-gri30").map((r) => r.species))].filter((s) =>
    more.some((r) => r.species === s && familyOf(r) === "nasa7-2015"),
  );
  it("covers the 13 species both families publish", () => expect(both).toHaveLength(13));
  it.each(both.filter((s) => s !== "C3H8").flatMap((s) => [298.15, 1000].map((t) => [`${s} at ${t} K`, s, t] as const)))("%s", (_n, s, t) => {
    const a = entry("nasa7-2015", s);
    const b = entry("nasa7-gri30", s);
    expect(Math.abs(at(a, t).cpJ - at(b, t).cpJ)).toBeLessThanOrEqual(stated("0.004"));
    expect(Math.abs(at(a, t).sJ - at(b, t).sJ)).toBeLessThanOrEqual(stated("0.004"));
    expect(Math.abs(dH(a, t) - dH(b, t))).toBeLessThanOrEqual(stated("0.0003"));
  });
  it("C3H8 differs as published: S −0.13 at 298.15 K and Cp −0.23 J/(mol·K) at 1000 K (GRI − third-millennium)", () => {
    const a = entry("nasa7-2015", "C3H8");
    const b = entry("nasa7-gri30", "C3H8");
    expect(at(b, 298.15).sJ - at(a, 298.15).sJ).toBeCloseTo(-0.13, 1);
    expect(at(b, 1000).cpJ - at(a, 1000).cpJ).toBeCloseTo(-0.23, 1);
  });
  it("Cl2: the Shomate 298–1000 K range at 1000 K agrees with the third-millennium set within 0.011 in Cp and 0.008 in S", () => {
    const shomateLow: SpeciesInput = { segments: [segmentsOf(more.find((r) => r.species === "Cl2" && r.form === "shomate" && r.tmin === 298)!)[0]] };
    const tm = entry("nasa7-2015", "Cl2");
    expect(Math.abs(at(shomateLow, 1000).cpJ - at(tm, 1000).cpJ)).toBeLessThanOrEqual(stated("0.011"));
    expect(Math.abs(at(shomateLow, 1000).sJ - at(tm, 1000).sJ)).toBeLessThanOrEqual(stated("0.008"));
  });
  it("Cl2 Shomate ranges disagree at 1000 K as published, and the engine says so (segment-jump)", () => {
    // README: 0.13 J/(mol·K) in Cp, 0.010 kJ/mol in H, 0.009 J/(mol·K) in S at 1000 K.
    const r = evaluate({
      reaction: "H2(g) + Cl2(g) -> 2 HCl(g)",
      species: { "H2(g)": speciesEntry("nasa7-2015", "H2", "g"), "Cl2(g)": entry("shomate-janaf", "Cl2"), "HCl(g)": entry("nasa7-2015", "HCl") },
      temperatures: { fromK: 900, toK: 1100, stepK: 100 },
    });
    const jump = r.warnings.find((w) => w.code === "segment-jump" && w.species === "Cl2(g)")!;
    expect(jump.tK).toBe(1000);
    expect(Math.abs(jump.dCpJ as number)).toBeCloseTo(0.13, 2);
    expect(Math.abs(jump.dHkJ as number)).toBeCloseTo(0.01, 3);
    expect(Math.abs(jump.dSJ as number)).toBeCloseTo(0.009, 3);
  });
});
