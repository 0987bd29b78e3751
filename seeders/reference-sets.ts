/**
 * The published coefficient sets in seeders/data/reference-sets.json and reference-sets-more.json
 * (copies of ../shared/reference/cp-coefficients.json and cp-coefficients-more.json, each record
 * with its citation), grouped into
 * the reference library's models: one per species and family, or variant within a family.
 */
import type { SegmentInput, SpeciesInput } from "@/lib/thermo/schema";
import sets from "./data/reference-sets.json";
import moreSets from "./data/reference-sets-more.json";

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
  /** Which copied file the sets come from (for the audit trail). */
  dataFile: string;
};

/** Normal boiling point (K, 1 atm) and triple point (K) of a reference species, with their source. */
export type PhasePoints = { boilingPointK: number | null; triplePointK: number | null; citation: string };

const CRC = "CRC Handbook of Chemistry and Physics, normal boiling point and triple point (from memory)";
const pp = (boilingPointK: number | null, triplePointK: number | null, note = ""): PhasePoints => ({
  boilingPointK,
  triplePointK,
  citation: note ? `${CRC}; ${note}` : CRC,
});

/**
 * Display names, CAS registry numbers and phase points of the seeded species. CAS numbers of
 * the species added from cp-coefficients-more.json are the ones its third-millennium records
 * state; the first eight and CH3OH's are from memory. Phase points are recalled values (from
 * memory), null where the species has none (graphite, radicals and atoms; CO2 and C2H2 sublime
 * at 1 atm; helium has no solid–liquid–gas triple point).
 */
export const REFERENCE_SPECIES: Record<string, { displayName: string; cas: string; phasePoints: PhasePoints | null }> = {
  H2: { displayName: "Hydrogen", cas: "1333-74-0", phasePoints: pp(20.28, 13.8) },
  O2: { displayName: "Oxygen", cas: "7782-44-7", phasePoints: pp(90.19, 54.36) },
  N2: { displayName: "Nitrogen", cas: "7727-37-9", phasePoints: pp(77.36, 63.15) },
  H2O: { displayName: "Water", cas: "7732-18-5", phasePoints: pp(373.12, 273.16) },
  CO: { displayName: "Carbon monoxide", cas: "630-08-0", phasePoints: pp(81.65, 68.13) },
  CO2: { displayName: "Carbon dioxide", cas: "124-38-9", phasePoints: pp(null, 216.58, "no normal boiling point: it sublimes at 194.7 K at 1 atm") },
  CH4: { displayName: "Methane", cas: "74-82-8", phasePoints: pp(111.66, 90.69) },
  NH3: { displayName: "Ammonia", cas: "7664-41-7", phasePoints: pp(239.82, 195.4) },
  C: { displayName: "Carbon (graphite)", cas: "7782-42-5", phasePoints: null },
  CH3OH: { displayName: "Methanol", cas: "67-56-1", phasePoints: pp(337.8, 175.6) },
  C2H6: { displayName: "Ethane", cas: "74-84-0", phasePoints: pp(184.6, 90.4) },
  C2H4: { displayName: "Ethylene", cas: "74-85-1", phasePoints: pp(169.4, 104.0) },
  C2H2: { displayName: "Acetylene", cas: "74-86-2", phasePoints: pp(null, 192.4, "no normal boiling point: it sublimes at about 189 K at 1 atm") },
  C3H8: { displayName: "Propane", cas: "74-98-6", phasePoints: pp(231.1, 85.5) },
  Ar: { displayName: "Argon", cas: "7440-37-1", phasePoints: pp(87.3, 83.81) },
  He: { displayName: "Helium", cas: "7440-59-7", phasePoints: pp(4.22, null, "no triple point of solid, liquid and gas") },
  NO: { displayName: "Nitric oxide", cas: "10102-43-9", phasePoints: pp(121.4, 109.5) },
  NO2: { displayName: "Nitrogen dioxide", cas: "10102-44-0", phasePoints: pp(294.3, 261.9, "the condensed phase is mostly the dimer N2O4") },
  N2O: { displayName: "Nitrous oxide", cas: "10024-97-2", phasePoints: pp(184.7, 182.3) },
  SO2: { displayName: "Sulfur dioxide", cas: "7446-09-5", phasePoints: pp(263.1, 197.7) },
  H2S: { displayName: "Hydrogen sulfide", cas: "7783-06-4", phasePoints: pp(212.8, 187.7) },
  HCl: { displayName: "Hydrogen chloride", cas: "7647-01-0", phasePoints: pp(188.1, 159.0) },
  Cl2: { displayName: "Chlorine", cas: "7782-50-5", phasePoints: pp(239.1, 171.6) },
  O: { displayName: "Oxygen atom", cas: "17778-80-2", phasePoints: null },
  H: { displayName: "Hydrogen atom", cas: "12385-13-6", phasePoints: null },
  OH: { displayName: "Hydroxyl radical", cas: "3352-57-6", phasePoints: null },
  HCN: { displayName: "Hydrogen cyanide", cas: "74-90-8", phasePoints: pp(298.8, 259.9) },
  CH2O: { displayName: "Formaldehyde", cas: "50-00-0", phasePoints: pp(254.0, 181.0) },
};

/** The 39 sets of cp-coefficients.json, then the 36 of cp-coefficients-more.json. */
export const referenceRecords = (): ReferenceRecord[] => [...(sets as unknown as ReferenceRecord[]), ...(moreSets as unknown as ReferenceRecord[])];

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
/** A single-phase crystalline model says which solid it is. */
const SOLID_WORDS: Record<string, string> = { C: "graphite" };

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
  const values = records
    .map((r) => /max least-squares Cp error ([\d.]+)%/.exec(r.notes ?? "")?.[1])
    .filter((x): x is string => !!x)
    .map(Number);
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
  else if (phases.length > 1)
    label += ` ${phases
      .map((p) => PHASE_WORDS[p] ?? p)
      .join(", ")
      .replace(/, ([^,]*)$/, " and $1")}`;
  else if (phases[0] === "cr" && SOLID_WORDS[formula]) label += ` ${SOLID_WORDS[formula]}`;
  return `${formula} · ${label} (${w.source})`;
}

/**
 * Every record, grouped. Third-millennium water is one model whose ice, liquid and gas
 * chains each carry their own constants, so the phase of lowest G changes near 273.15 K
 * and 373.15 K; GRI-Mech and the Shomate gas set are gas-only models.
 */
export function referenceModels(records: readonly ReferenceRecord[] = referenceRecords()): ReferenceModel[] {
  const groups = new Map<string, { formula: string; family: ReferenceFamily; variant: string | null; records: ReferenceRecord[] }>();
  for (const r of records) {
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
      dataFile: (moreSets as unknown as ReferenceRecord[]).includes(records[0]) ? "seeders/data/reference-sets-more.json" : "seeders/data/reference-sets.json",
    };
  });
}
