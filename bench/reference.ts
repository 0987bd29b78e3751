/** Published NASA-7 gas sets from ../shared/reference/ (relative to the repo root), for the benchmarks. */
import fs from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";
import type { SpeciesInput } from "@/lib/thermo";

export const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");
const refFile = path.resolve(root, "../shared/reference/cp-coefficients.json");
if (!fs.existsSync(refFile)) {
  console.error(`missing reference file ${refFile}`);
  process.exit(1);
}
type Rec = { species: string; phase: string; form: string; tmin: number; tmid?: number; tmax: number; coeffs: { low: number[]; high: number[] }; source: string };
const recs = JSON.parse(fs.readFileSync(refFile, "utf8")) as Rec[];

/** The third-millennium (2015) NASA-7 gas set of a species, both ranges. */
export function nasa7Gas(sp: string): SpeciesInput {
  const r = recs.find((x) => x.species === sp && x.phase === "g" && x.form === "nasa7" && x.source.startsWith("Goos"))!;
  return {
    segments: [
      { phase: "g", form: "nasa7", tminK: r.tmin, tmaxK: r.tmid!, coeffs: r.coeffs.low },
      { phase: "g", form: "nasa7", tminK: r.tmid!, tmaxK: r.tmax, coeffs: r.coeffs.high },
    ],
  };
}
