/**
 * NASA Glenn 9-coefficient set for liquid water, H2O(L), range 273.150–373.150 K (record
 * "2 g 8/01", Cox 1989, Haar 1984, Keenan 1984, Stimson 1969), from McBride, Zehe & Gordon,
 * "NASA Glenn Coefficients for Calculating Thermodynamic Properties of Individual Species",
 * NASA TP-2002-211556 (2002), as distributed in the thermo.inp data file. Standard state 1 bar;
 * dfH298 = −285.830 kJ/mol. The coefficients are of order 1e9, so Cp (≈ 75 J/(mol·K)) is a
 * difference of terms of order 1e4·R: the case that defeated a 1e-13 relative integration target.
 */
import type { SpeciesInput } from "@/lib/thermo";

export const NASA9_WATER_LIQUID_COEFFS = [1.326371304e9, -2.448295388e7, 1.879428776e5, -7.67899505e2, 1.761556813, -2.151167128e-3, 1.092570813e-6, 1.101760476e8, -9.77970097e5];

export const nasa9WaterLiquid = (): SpeciesInput => ({
  segments: [{ phase: "l", form: "nasa9", tminK: 273.15, tmaxK: 373.15, coeffs: [...NASA9_WATER_LIQUID_COEFFS] }],
});

/**
 * NASA Glenn 9-coefficient set for N2 (reference element; Gurvich 1978, record "tpis78"),
 * ranges 200–1000–6000–20000 K, from the same publication (McBride, Zehe & Gordon 2002).
 * Its 6000–20000 K range has a1 of order 1e9: the other case that ran away.
 */
export const NASA9_N2_RANGES: { tminK: number; tmaxK: number; coeffs: number[] }[] = [
  {
    tminK: 200,
    tmaxK: 1000,
    coeffs: [2.210371497e4, -3.81846182e2, 6.08273836, -8.53091441e-3, 1.384646189e-5, -9.62579362e-9, 2.519705809e-12, 7.10846086e2, -1.076003744e1],
  },
  {
    tminK: 1000,
    tmaxK: 6000,
    coeffs: [5.87712406e5, -2.239249073e3, 6.06694922, -6.1396855e-4, 1.491806679e-7, -1.923105485e-11, 1.061954386e-15, 1.283210415e4, -1.586640027e1],
  },
  {
    tminK: 6000,
    tmaxK: 20000,
    coeffs: [8.31013916e8, -6.42073354e5, 2.020264635e2, -3.065092046e-2, 2.486903333e-6, -9.70595411e-11, 1.437538881e-15, 4.93870704e6, -1.67209974e3],
  },
];

export const nasa9N2 = (): SpeciesInput => ({
  segments: NASA9_N2_RANGES.map((r) => ({ phase: "g", form: "nasa9" as const, tminK: r.tminK, tmaxK: r.tmaxK, coeffs: [...r.coeffs] })),
});
