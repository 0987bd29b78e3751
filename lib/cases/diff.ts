/**
 * What changed between two snapshots of a case, pure: the inputs path by path, the pins that
 * moved, the reference values, crossovers, sign case, warnings, points and the equilibrium.
 * Client-safe.
 */
import type { EvaluateResult } from "@/lib/thermo";
import type { CaseInput } from "@/lib/validation/cases";
import type { PinnedVersion } from "@/models/case-snapshot";
import { pinDtos, type PinDto } from "./pin";

export type ValueChange = { path: string; from: unknown; to: unknown };

/** What changed between two snapshots (the service adds the two revisions' summaries). */
export type SnapshotContentDiff = {
  inputs: ValueChange[];
  pins: { key: string; from: PinDto | null; to: PinDto | null }[];
  reference: { field: string; from: number; to: number }[];
  crossover: { naiveK: [number | null, number | null]; correctedK: [number[], number[]] };
  signCase: [string, string];
  warnings: { added: string[]; removed: string[] };
  points: { common: number; maxAbsDGkJ: number; maxAbsLog10K: number; rows: { tK: number; fromDGkJ: number; toDGkJ: number; fromLog10K: number; toLog10K: number }[] };
  equilibrium: EquilibriumDiff;
};

/**
 * How the equilibrium results moved between two revisions: `lost` when the newer one has
 * none (its feed was dropped), `added`, `changed` (a conversion or mole fraction moved), or
 * `unchanged`; `none` when neither has one.
 */
export type EquilibriumDiff = {
  status: "none" | "lost" | "added" | "changed" | "unchanged";
  key: [string | null, string | null];
  pressureBar: [number | null, number | null];
  common: number;
  maxAbsConversion: number;
  maxAbsMoleFraction: number;
  rows: { tK: number; fromConversion: number; toConversion: number }[];
};

function diffEquilibrium(a: EvaluateResult, b: EvaluateResult): EquilibriumDiff {
  const ea = a.equilibrium ?? null;
  const eb = b.equilibrium ?? null;
  const key: [string | null, string | null] = [a.equilibriumInfo?.key ?? null, b.equilibriumInfo?.key ?? null];
  const pressureBar: [number | null, number | null] = [a.equilibriumInfo?.pressureBar ?? null, b.equilibriumInfo?.pressureBar ?? null];
  const base = { key, pressureBar, common: 0, maxAbsConversion: 0, maxAbsMoleFraction: 0, rows: [] };
  if (!ea && !eb) return { status: "none", ...base };
  if (ea && !eb) return { status: "lost", ...base };
  if (!ea && eb) return { status: "added", ...base };
  const byT = new Map(ea!.map((p) => [p.tK, p]));
  const common = eb!.filter((p) => byT.has(p.tK));
  let maxAbsConversion = 0;
  let maxAbsMoleFraction = 0;
  for (const p of common) {
    const q = byT.get(p.tK)!;
    maxAbsConversion = Math.max(maxAbsConversion, Math.abs(p.keyConversion - q.keyConversion));
    for (const s of new Set([...Object.keys(p.moleFractions), ...Object.keys(q.moleFractions)])) {
      maxAbsMoleFraction = Math.max(maxAbsMoleFraction, Math.abs((p.moleFractions[s] ?? 0) - (q.moleFractions[s] ?? 0)));
    }
  }
  const stride = Math.max(1, Math.ceil(common.length / 25));
  const rows = common
    .filter((_, i) => i % stride === 0 || i === common.length - 1)
    .map((p) => ({ tK: p.tK, fromConversion: byT.get(p.tK)!.keyConversion, toConversion: p.keyConversion }));
  const same = maxAbsConversion === 0 && maxAbsMoleFraction === 0 && key[0] === key[1] && pressureBar[0] === pressureBar[1];
  return { status: same ? "unchanged" : "changed", key, pressureBar, common: common.length, maxAbsConversion, maxAbsMoleFraction, rows };
}

function flatten(value: unknown, prefix = "", out: Map<string, unknown> = new Map()): Map<string, unknown> {
  if (value !== null && typeof value === "object") {
    const entries = Array.isArray(value) ? value.map((v, i) => [String(i), v] as const) : Object.entries(value);
    if (entries.length === 0) out.set(prefix, value);
    for (const [k, v] of entries) flatten(v, prefix ? `${prefix}.${k}` : k, out);
  } else out.set(prefix, value);
  return out;
}

/** The two snapshots' content as a snapshot row or DTO carries it. */
export type DiffSide = { inputs: CaseInput; pins: readonly PinnedVersion[]; result: EvaluateResult };

/** Every change from `a` to `b` (the older first). */
export function diffSnapshotContents(a: DiffSide, b: DiffSide): SnapshotContentDiff {
  const fa = flatten(a.inputs);
  const fb = flatten(b.inputs);
  const inputs: ValueChange[] = [];
  for (const path of [...new Set([...fa.keys(), ...fb.keys()])].sort()) {
    // Absent and null read the same ("—"): a dropped feed shows as its fields going, not as a null row.
    if (JSON.stringify(fa.get(path) ?? null) !== JSON.stringify(fb.get(path) ?? null)) inputs.push({ path, from: fa.get(path) ?? null, to: fb.get(path) ?? null });
  }
  const keys = [...new Set([...a.pins.map((p) => p.key), ...b.pins.map((p) => p.key)])];
  const pins = keys
    .map((key) => {
      const pa = a.pins.find((p) => p.key === key) ?? null;
      const pb = b.pins.find((p) => p.key === key) ?? null;
      return { key, from: pa && pinDtos([pa])[0], to: pb && pinDtos([pb])[0] };
    })
    .filter((p) => p.from?.versionId !== p.to?.versionId);
  const ra = a.result.reference as unknown as Record<string, number>;
  const rb = b.result.reference as unknown as Record<string, number>;
  const reference = ["tK", "dHkJ", "dSJ", "dGkJ"].filter((f) => ra[f] !== rb[f]).map((field) => ({ field, from: ra[field], to: rb[field] }));
  const wa = new Set(a.result.warnings.map((w) => `${w.code}${w.species ? ` · ${w.species}` : ""}: ${w.message}`));
  const wb = new Set(b.result.warnings.map((w) => `${w.code}${w.species ? ` · ${w.species}` : ""}: ${w.message}`));
  const byT = new Map(a.result.points.map((p) => [p.tK, p]));
  const common = b.result.points.filter((p) => byT.has(p.tK));
  let maxAbsDGkJ = 0;
  let maxAbsLog10K = 0;
  for (const p of common) {
    const q = byT.get(p.tK)!;
    maxAbsDGkJ = Math.max(maxAbsDGkJ, Math.abs(p.dGkJ - q.dGkJ));
    maxAbsLog10K = Math.max(maxAbsLog10K, Math.abs(p.log10K - q.log10K));
  }
  const stride = Math.max(1, Math.ceil(common.length / 25));
  const rows = common
    .filter((_, i) => i % stride === 0 || i === common.length - 1)
    .map((p) => ({ tK: p.tK, fromDGkJ: byT.get(p.tK)!.dGkJ, toDGkJ: p.dGkJ, fromLog10K: byT.get(p.tK)!.log10K, toLog10K: p.log10K }));
  return {
    inputs,
    pins,
    reference,
    crossover: {
      naiveK: [a.result.crossover.naiveK, b.result.crossover.naiveK] as [number | null, number | null],
      correctedK: [a.result.crossover.correctedK, b.result.crossover.correctedK] as [number[], number[]],
    },
    signCase: [a.result.signCase.text, b.result.signCase.text] as [string, string],
    warnings: { added: [...wb].filter((w) => !wa.has(w)), removed: [...wa].filter((w) => !wb.has(w)) },
    points: { common: common.length, maxAbsDGkJ, maxAbsLog10K, rows },
    equilibrium: diffEquilibrium(a.result, b.result),
  };
}
