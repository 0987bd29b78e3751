/**
 * Loads the published reference sets from ../shared/reference/ (relative to the repo root)
 * and turns them into species entries. A missing file fails loudly, naming the file.
 */
import fs from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";
import type { SegmentInput, SpeciesInput } from "@/lib/thermo";

export const repoRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "../..");
export const referenceDir = path.resolve(repoRoot, "../shared/reference");

export function readReference<T>(name: string): T {
  const file = path.join(referenceDir, name);
  if (!fs.existsSync(file)) {
    throw new Error(`missing reference file ${file}: the thermo tests read ../shared/reference/${name} relative to the repo root`);
  }
  return JSON.parse(fs.readFileSync(file, "utf8")) as T;
}

export interface CoefficientRecord {
  species: string;
  phase: string;
  form: "nasa7" | "shomate";
  tmin: number;
  tmid?: number;
  tmax: number;
  coeffs: { low?: number[]; high?: number[] } & Record<string, number | number[]>;
  standardPressurePa: number;
  dfH298kJ?: number;
  source: string;
  notes?: string;
}

export interface JanafRow {
  species: string;
  phase: string;
  janafTable: string;
  T: number;
  Cp: number;
  S: number;
  gef: number;
  HmH298: number;
  dfH?: number;
  dfG?: number;
  logKf?: number;
}

/** Data families, keyed as the app keys them (seeders/reference-sets.ts, lib/validation/library.ts). */
export type Family = "nasa7-2015" | "nasa7-gri30" | "shomate-janaf";

export function familyOf(r: CoefficientRecord): Family {
  if (r.form === "shomate") return "shomate-janaf";
  return r.source.startsWith("Smith, Golden, Frenklach") ? "nasa7-gri30" : "nasa7-2015";
}

/** Each family's data set by its name (the records' `source` field carries the full citation). */
export const FAMILY_SOURCE: Record<Family, string> = {
  "nasa7-2015": "NASA-7, Extended Third Millennium Thermochemical Database (2015 update)",
  "nasa7-gri30": "NASA-7, GRI-Mech 3.0 thermodynamic data (1999)",
  "shomate-janaf": "Shomate fits to NIST-JANAF Tables, 4th ed. (1998)",
};

export const records = (): CoefficientRecord[] => readReference<CoefficientRecord[]>("cp-coefficients.json");
export const janafRows = (): JanafRow[] => readReference<JanafRow[]>("janaf-check-rows.json");

/** Segments of one record (a NASA-7 record has one or two ranges; a Shomate record one). */
export function segmentsOf(r: CoefficientRecord): SegmentInput[] {
  const phase = r.phase;
  if (r.form === "shomate") {
    const c = r.coeffs as Record<string, number>;
    return [{ phase, form: "shomate", tminK: r.tmin, tmaxK: r.tmax, coeffs: { A: c.A, B: c.B, C: c.C, D: c.D, E: c.E, F: c.F, G: c.G, H: c.H } }];
  }
  const out: SegmentInput[] = [];
  if (r.tmid !== undefined) {
    out.push({ phase, form: "nasa7", tminK: r.tmin, tmaxK: r.tmid, coeffs: r.coeffs.low! });
    out.push({ phase, form: "nasa7", tminK: r.tmid, tmaxK: r.tmax, coeffs: r.coeffs.high! });
  } else {
    out.push({ phase, form: "nasa7", tminK: r.tmin, tmaxK: r.tmax, coeffs: r.coeffs.low! });
  }
  return out;
}

/**
 * One species entry per (family, species, phase). The nasa7-2015 CH4 has two variants; `variant`
 * picks the first (anharmonic) by default.
 */
export function speciesEntry(family: Family, species: string, phase: string, variant = 0): SpeciesInput {
  const recs = records().filter((r) => familyOf(r) === family && r.species === species && r.phase === phase);
  if (recs.length === 0) throw new Error(`no ${family} record for ${species}(${phase}) in cp-coefficients.json`);
  const chosen = family === "shomate-janaf" ? recs : [recs[variant]];
  return { segments: chosen.flatMap(segmentsOf), standardPressurePa: chosen[0].standardPressurePa };
}

/** Every (family, species, phase, variant) group in the file. */
export function recordGroups(): { family: Family; species: string; phase: string; variant: number; entry: SpeciesInput; source: string }[] {
  const seen = new Map<string, number>();
  const out: ReturnType<typeof recordGroups> = [];
  for (const r of records()) {
    const family = familyOf(r);
    const id = `${family}|${r.species}|${r.phase}`;
    if (family === "shomate-janaf") {
      if (seen.has(id)) continue;
      seen.set(id, 0);
      out.push({ family, species: r.species, phase: r.phase, variant: 0, entry: speciesEntry(family, r.species, r.phase), source: r.source });
    } else {
      const variant = seen.get(id) ?? 0;
      seen.set(id, variant + 1);
      out.push({ family, species: r.species, phase: r.phase, variant, entry: speciesEntry(family, r.species, r.phase, variant), source: r.source });
    }
  }
  return out;
}
