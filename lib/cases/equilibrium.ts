/**
 * The equilibrium part of a case, pure: which pins it needs, the request part it adds, the
 * species entries with their uncertainties, and the CSV columns. Used by the case services
 * and by the demo seeder (which cannot import server-only modules).
 */
import type { EvaluateResult } from "@/lib/thermo/evaluate";
import type { EvaluateRequest, SpeciesInput } from "@/lib/thermo/schema";
import type { CaseEquilibrium } from "@/lib/validation/equilibrium";
import type { CaseTerm } from "@/lib/validation/cases";
import type { PinnedVersion } from "@/models/case-snapshot";

/** The case's terms plus the extra species of its equilibrium set, for loading pins. */
export function pinTerms(inputs: { terms: CaseTerm[]; equilibrium?: CaseEquilibrium | null }): CaseTerm[] {
  const extra = inputs.equilibrium?.extraTerms ?? [];
  return [...inputs.terms, ...extra.map((t) => ({ ...t, coefficient: 1 }))];
}

/** A pin's species entry, with the version's uncertainty and the species' boiling and triple points where it has them. */
export function speciesOfPin(p: Pick<PinnedVersion, "data"> & { uncertainty?: PinnedVersion["uncertainty"]; phasePoints?: PinnedVersion["phasePoints"] }): SpeciesInput {
  const data = p.data as SpeciesInput;
  const u = p.uncertainty;
  const pp = p.phasePoints;
  const points: Pick<SpeciesInput, "boilingPointK" | "triplePointK"> = {};
  if (pp?.boilingPointK != null) points.boilingPointK = pp.boilingPointK;
  if (pp?.triplePointK != null) points.triplePointK = pp.triplePointK;
  if (!u || (u.dfHkJ === undefined && u.sJ === undefined && u.cpRelative === undefined)) return { ...data, ...points };
  return { ...data, uncertainty: u, ...points };
}

/** A species row's phase points as a pin carries them, or null when it has none. */
export function phasePointsOf(s: { boilingPointK?: number | null; triplePointK?: number | null; phasePointsCitation?: string | null }): PinnedVersion["phasePoints"] {
  if (s.boilingPointK == null && s.triplePointK == null) return null;
  return { boilingPointK: s.boilingPointK ?? null, triplePointK: s.triplePointK ?? null, citation: s.phasePointsCitation ?? null };
}

/** The request's `equilibrium` part for a case, or undefined when the case has none. */
export function equilibriumRequestOf(eq: CaseEquilibrium | null | undefined): EvaluateRequest["equilibrium"] | undefined {
  if (!eq) return undefined;
  return {
    feed: eq.feed,
    feedUnit: eq.feedUnit,
    pressureBar: eq.pressure,
    ...(eq.key ? { key: eq.key } : {}),
    ...(eq.reactions.length ? { reactions: eq.reactions } : {}),
    // Stored cases from before the real-gas work have no `gas`; ideal stays implicit.
    ...(eq.gas === "peng-robinson" ? { gas: eq.gas } : {}),
  };
}

/** Columns the CSV export adds when a result carries an equilibrium (one row per temperature, API field paths as headers; the σ of ΔrG and log10 K ride along). */
export function equilibriumCsvColumns(result: EvaluateResult): { header: string; values: (string | number | boolean | null)[] }[] {
  const cols: { header: string; values: (string | number | boolean | null)[] }[] = [];
  const pts = result.points;
  const eq = result.equilibrium;
  // A case without an equilibrium keeps the plain columns.
  if (!eq || eq.length === 0) return cols;
  if (result.uncertainty) {
    cols.push({ header: "sigmaDGkJ", values: pts.map((p) => p.sigmaDGkJ ?? null) });
    cols.push({ header: "sigmaLog10K", values: pts.map((p) => p.sigmaLog10K ?? null) });
    cols.push({ header: "naiveExceedsUncertainty", values: pts.map((p) => p.naiveExceedsUncertainty ?? null) });
  }
  const R = eq[0].extents.length;
  for (let j = 0; j < R; j++) {
    cols.push({ header: `equilibrium.extents[${j}]`, values: eq.map((p) => p.extents[j]) });
    cols.push({ header: `equilibrium.naive.extents[${j}]`, values: eq.map((p) => p.naive.extents[j]) });
  }
  cols.push({ header: "equilibrium.keyConversion", values: eq.map((p) => p.keyConversion) });
  cols.push({ header: "equilibrium.naive.keyConversion", values: eq.map((p) => p.naive.keyConversion) });
  cols.push({ header: "equilibrium.keyFraction", values: eq.map((p) => p.keyFraction) });
  cols.push({ header: "equilibrium.naive.keyFraction", values: eq.map((p) => p.naive.keyFraction) });
  cols.push({ header: "equilibrium.keyFractionDiff", values: eq.map((p) => p.keyFractionDiff) });
  if (eq[0].sigma) {
    cols.push({ header: "equilibrium.sigma.keyFraction", values: eq.map((p) => p.sigma?.keyFraction ?? null) });
    cols.push({ header: "equilibrium.naiveExceedsUncertainty", values: eq.map((p) => p.naiveExceedsUncertainty ?? null) });
  }
  const keys = Object.keys(eq[0].moles);
  for (const k of keys) {
    cols.push({ header: `equilibrium.moles.${k}`, values: eq.map((p) => p.moles[k]) });
    cols.push({ header: `equilibrium.naive.moles.${k}`, values: eq.map((p) => p.naive.moles[k]) });
  }
  for (const k of Object.keys(eq[0].moleFractions)) {
    cols.push({ header: `equilibrium.moleFractions.${k}`, values: eq.map((p) => p.moleFractions[k] ?? null) });
    cols.push({ header: `equilibrium.naive.moleFractions.${k}`, values: eq.map((p) => p.naive.moleFractions[k] ?? null) });
    if (eq[0].sigma) cols.push({ header: `equilibrium.sigma.moleFractions.${k}`, values: eq.map((p) => p.sigma?.moleFractions[k] ?? null) });
  }
  if (result.equilibriumInfo?.gas === "peng-robinson") {
    for (const k of Object.keys(eq[0].fugacityCoefficients ?? {})) {
      cols.push({ header: `equilibrium.fugacityCoefficients.${k}`, values: eq.map((p) => p.fugacityCoefficients?.[k] ?? null) });
    }
    cols.push({ header: "equilibrium.ideal.keyConversion", values: eq.map((p) => p.ideal?.keyConversion ?? null) });
  }
  cols.push({ header: "equilibrium.converged", values: eq.map((p) => p.converged && p.naive.converged) });
  return cols;
}
