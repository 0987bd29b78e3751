/**
 * The published coefficient sets in seeders/data/reference-sets.json (a copy of
 * ../shared/reference/cp-coefficients.json, each record with its citation), grouped into
 * the reference library's models: one per species and family, or variant within a family.
 */
import type { SegmentInput, SpeciesInput } from "@/lib/thermo/schema";
import sets from "./data/reference-sets.json";

export type ReferenceRecord = {
  species: string;
  phase: string;
  form: "nasa7" | "shomate";
  tmin: number;
  tmid?: number;
  tmax: number;
  coeffs: Record<string, number[] | number>;
  standardPressurePa: number;
  dfH298kJ?: number;
  equations: string;
  source: string;
  notes?: string;
};

export type ReferenceFamily = "nasa7-2015" | "nasa7-gri30" | "shomate-janaf";

export type ReferenceModel = {
  formula: string;
  family: ReferenceFamily;
  variant: string | null;
  name: string;
  data: SpeciesInput;
  citation: string;
  changeNote: string;
  uncertainty: { cpRelative: number } | null;
  records: ReferenceRecord[];
};

/** Display names and CAS registry numbers (from memory) of the seeded species. */
export const REFERENCE_SPECIES: Record<string, { displayName: string; cas: string }> = {
  H2: { displayName: "Hydrogen", cas: "1333-74-0" },
  O2: { displayName: "Oxygen", cas: "7782-44-7" },
  N2: { displayName: "Nitrogen", cas: "7727-37-9" },
  H2O: { displayName: "Water", cas: "7732-18-5" },
  CO: { displayName: "Carbon monoxide", cas: "630-08-0" },
  CO2: { displayName: "Carbon dioxide", cas: "124-38-9" },
  CH4: { displayName: "Methane", cas: "74-82-8" },
  NH3: { displayName: "Ammonia", cas: "7664-41-7" },
};

export const referenceRecords = (): ReferenceRecord[] => sets as unknown as ReferenceRecord[];

export function familyOf(r: ReferenceRecord): ReferenceFamily {
  if (r.form === "shomate") return "shomate-janaf";
  return r.source.startsWith("Smith, Golden, Frenklach") ? "nasa7-gri30" : "nasa7-2015";
}

const FAMILY_WORDS: Record<ReferenceFamily, { form: string; source: string }> = {
  "nasa7-2015": { form: "NASA-7", source: "third-millennium 2015" },
  "nasa7-gri30": { form: "NASA-7", source: "GRI-Mech 3.0" },
  "shomate-janaf": { form: "Shomate", source: "NIST-JANAF fit" },
};

const PHASE_WORDS: Record<string, string> = { cr: "ice", l: "liquid", g: "gas" };

/** Segments of one record: a two-range NASA-7 record gives two, a single-range one and a Shomate one give one. */
export function segmentsOf(r: ReferenceRecord): SegmentInput[] {
  if (r.form === "shomate") {
    const c = r.coeffs as Record<string, number>;
    return [{ phase: r.phase, form: "shomate", tminK: r.tmin, tmaxK: r.tmax, coeffs: { A: c.A, B: c.B, C: c.C, D: c.D, E: c.E, F: c.F, G: c.G, H: c.H } }];
  }
  const c = r.coeffs as { low: number[]; high?: number[] };
  if (r.tmid !== undefined && c.high) {
    return [
      { phase: r.phase, form: "nasa7", tminK: r.tmin, tmaxK: r.tmid, coeffs: c.low },
      { phase: r.phase, form: "nasa7", tminK: r.tmid, tmaxK: r.tmax, coeffs: c.high },
    ];
  }
  return [{ phase: r.phase, form: "nasa7", tminK: r.tmin, tmaxK: r.tmax, coeffs: c.low }];
}

/** "published max least-squares Cp error 0.33% @ …" → 0.0033. */
function cpError(records: ReferenceRecord[]): number | null {
  const values = records.map((r) => /max least-squares Cp error ([\d.]+)%/.exec(r.notes ?? "")?.[1]).filter((x): x is string => !!x).map(Number);
  return values.length ? Math.max(...values) / 100 : null;
}

function variantOf(r: ReferenceRecord, family: ReferenceFamily): string | null {
  if (family === "nasa7-2015" && r.species === "CH4") return /RRHO/i.test(r.notes ?? "") ? "rrho" : "anharmonic";
  if (family === "shomate-janaf" && r.species === "H2O" && r.phase === "l") return "liquid";
  return null;
}

function modelName(formula: string, family: ReferenceFamily, variant: string | null, phases: string[]): string {
  const w = FAMILY_WORDS[family];
  let label = w.form;
  if (variant === "anharmonic") label += " anharmonic";
  else if (variant === "rrho") label += " RRHO";
  else if (variant === "liquid") label += " liquid";
  else if (phases.length > 1) label += ` ${phases.map((p) => PHASE_WORDS[p] ?? p).join(", ").replace(/, ([^,]*)$/, " and $1")}`;
  return `${formula} · ${label} (${w.source})`;
}

/**
 * Every record, grouped. Third-millennium water is one model whose ice, liquid and gas
 * chains each carry their own constants, so the phase of lowest G changes near 273.15 K
 * and 373.15 K; GRI-Mech and the Shomate gas set are gas-only models.
 */
export function referenceModels(): ReferenceModel[] {
  const groups = new Map<string, { formula: string; family: ReferenceFamily; variant: string | null; records: ReferenceRecord[] }>();
  for (const r of referenceRecords()) {
    const family = familyOf(r);
    const variant = variantOf(r, family);
    const key = `${family}|${r.species}|${variant ?? ""}`;
    const g = groups.get(key) ?? { formula: r.species, family, variant, records: [] };
    g.records.push(r);
    groups.set(key, g);
  }
  const order: Record<string, number> = { cr: 0, l: 1, g: 2 };
  return [...groups.values()].map((g) => {
    const records = [...g.records].sort((a, b) => (order[a.phase] ?? 3) - (order[b.phase] ?? 3) || a.tmin - b.tmin);
    const phases = [...new Set(records.map((r) => r.phase))];
    const pressures = [...new Set(records.map((r) => r.standardPressurePa))];
    if (pressures.length > 1) throw new Error(`reference sets for ${g.formula} (${g.family}) mix standard pressures`);
    const data: SpeciesInput = { segments: records.flatMap(segmentsOf), standardPressurePa: pressures[0] };
    const notes = [...new Set(records.map((r) => r.notes).filter((n): n is string => !!n))];
    const err = cpError(records);
    return {
      formula: g.formula,
      family: g.family,
      variant: g.variant,
      name: modelName(g.formula, g.family, g.variant, phases),
      data,
      citation: [...new Set(records.map((r) => r.source))].join("; "),
      changeNote: ["Published set, loaded unchanged.", ...notes].join(" "),
      uncertainty: err === null ? null : { cpRelative: err },
      records,
    };
  });
}
