/**
 * NASA Glenn 9-coefficient set for liquid water, H2O(L), range 273.150–373.150 K (record
 * "2 g 8/01", Cox 1989, Haar 1984, Keenan 1984, Stimson 1969), from McBride, Zehe & Gordon,
 * "NASA Glenn Coefficients for Calculating Thermodynamic Properties of Individual Species",
 * NASA TP-2002-211556 (2002), as distributed in the thermo.inp data file. Standard state 1 bar;
 * dfH298 = −285.830 kJ/mol. The coefficients are of order 1e9, so Cp (≈ 75 J/(mol·K)) is a
 * difference of terms of order 1e4·R: the case that defeated a 1e-13 relative integration target.
 */
import type { SpeciesInput } from "@/lib/thermo";

export const NASA9_WATER_LIQUID_SOURCE =
  "McBride, Zehe & Gordon, NASA TP-2002-211556 (2002), NASA Glenn coefficients, H2O(L) 273.150–373.150 K";

export const NASA9_WATER_LIQUID_COEFFS = [
  1.326371304e9, -2.448295388e7, 1.879428776e5, -7.67899505e2, 1.761556813, -2.151167128e-3, 1.092570813e-6,
  1.101760476e8, -9.77970097e5,
];

export const nasa9WaterLiquid = (): SpeciesInput => ({
  segments: [{ phase: "l", form: "nasa9", tminK: 273.15, tmaxK: 373.15, coeffs: [...NASA9_WATER_LIQUID_COEFFS] }],
});
