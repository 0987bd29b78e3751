/** Library fixtures the service tests share: a synthetic solid, team drafts of it, a measured-data CSV. */
import * as lib from "@/lib/services/library";
import { actorOf, type Who } from "./actors";

/** Constant-Cp solid with an anchor at 298.15 K; synthetic, invented for this test. */
export const solidData = (cpJ = 120) => ({
  segments: [{ phase: "cr", form: "constant" as const, tminK: 250, tmaxK: 900, coeffs: { cpJ } }],
  reference: { tK: 298.15, phase: "cr", hkJ: -1000, sJ: 80 },
});

/** A ZrO2 draft model by `who` (their team's) on the synthetic solid. */
export async function createDraft(who: Exclude<Who, "anonymous">, name: string, cpJ = 120) {
  return lib.createModel(await actorOf(who), {
    species: { formula: "ZrO2", displayName: "Zirconia" },
    name,
    version: { data: solidData(cpJ), citation: "Synthetic, invented for this test" },
  });
}

/** A name no other draft in this test file has. */
export const uniqueName = (prefix: string) => `${prefix} ${Math.random().toString(36).slice(2, 7)}`;

/** Synthetic, invented for this test: Cp = 40 + 0.02 T − 2e5/T² J/(mol·K), exactly (no noise). */
export const syntheticCp = (tK: number) => 40 + 0.02 * tK - 2e5 / tK ** 2;

/** The synthetic Cp on a 50 K grid from 300 to 900 K (13 rows), as an uploaded CSV. */
export const syntheticCpCsv = ["T (K),Cp (J/mol/K)", ...Array.from({ length: 13 }, (_, i) => 300 + 50 * i).map((t) => `${t},${syntheticCp(t)}`)].join("\n");

/** The species the synthetic measurements are filed under. */
export const MAGNESIA = { formula: "MgO", displayName: "Magnesia (test)" };

/**
 * The anchor the fits of the synthetic data get: MgO(cr) at 298.15 K, ΔfH° −601.60 kJ/mol and
 * S° 26.95 J/(mol·K), CODATA Key Values for Thermodynamics (Cox, Wagman & Medvedev 1989) (from memory).
 */
export const MGO_ANCHOR = { tK: 298.15, hkJ: -601.6, sJ: 26.95 };
