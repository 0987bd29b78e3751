/**
 * Sources side by side: the same request evaluated with several species sets (one per data
 * family, e.g. Shomate against NASA-7), and the spread of ΔrG, log10 K and the outlet
 * composition across them at every grid temperature.
 */
import { refuse } from "./errors";
import { evaluate, type EvaluateResult } from "./evaluate";
import type { EvaluateRequest, SpeciesInput } from "./schema";

export interface SourceVariant {
  /** Shown in tables and legends, e.g. "Shomate (NIST-JANAF)". */
  label: string;
  /** Species entries that replace the request's entries of the same key. */
  species: Record<string, SpeciesInput>;
}

export interface Spread {
  min: number;
  max: number;
  /** max − min. */
  range: number;
}

export interface SourceComparison {
  variants: { label: string; result: EvaluateResult }[];
  spread: {
    tK: number;
    dGkJ: Spread;
    log10K: Spread;
    /** Only with an equilibrium request. */
    keyFraction?: Spread;
    keyConversion?: Spread;
    moleFractions?: Record<string, Spread>;
  }[];
}

function spreadOf(values: number[]): Spread {
  const min = Math.min(...values);
  const max = Math.max(...values);
  return { min, max, range: max - min };
}

/**
 * Evaluate `request` once per variant (each variant's species replace the request's entries
 * of the same keys) and report the spread between them. Refusals of any variant propagate,
 * prefixed with its label.
 */
export function compareSources(request: EvaluateRequest, variants: SourceVariant[]): SourceComparison {
  if (variants.length < 2) refuse("invalid-request", "compareSources: give at least two variants to compare");
  const runs = variants.map((v) => {
    try {
      return { label: v.label, result: evaluate({ ...request, species: { ...request.species, ...v.species } }) };
    } catch (e) {
      if (e instanceof Error && "code" in e) refuse((e as { code: string }).code, `${v.label}: ${e.message}`);
      throw e;
    }
  });
  const first = runs[0].result;
  const spread = first.points.map((p, i) => {
    const row: SourceComparison["spread"][number] = {
      tK: p.tK,
      dGkJ: spreadOf(runs.map((r) => r.result.points[i].dGkJ)),
      log10K: spreadOf(runs.map((r) => r.result.points[i].log10K)),
    };
    if (first.equilibrium) {
      const eqs = runs.map((r) => r.result.equilibrium![i]);
      if (eqs.every((e) => e.keyFraction !== null)) row.keyFraction = spreadOf(eqs.map((e) => e.keyFraction!));
      row.keyConversion = spreadOf(eqs.map((e) => e.keyConversion));
      row.moleFractions = Object.fromEntries(Object.keys(eqs[0].moleFractions).map((k) => [k, spreadOf(eqs.map((e) => e.moleFractions[k] ?? 0))]));
    }
    return row;
  });
  return { variants: runs, spread };
}
