import "server-only";
import { Op } from "sequelize";
import { requirePermission, type Actor } from "@/lib/auth/guards";
import { models } from "@/lib/db";
import { compareSources, type EvaluateRequest, type EvaluateResult, type SourceComparison, type SpeciesInput } from "@/lib/thermo";
import type { CaseEquilibrium } from "@/lib/validation/equilibrium";
import type { CaseTerm } from "@/lib/validation/cases";
import type { PinnedVersion } from "@/models/case-snapshot";

/** The case's terms plus the extra species of its equilibrium set, for loading pins. */
export function pinTerms(inputs: { terms: CaseTerm[]; equilibrium?: CaseEquilibrium | null }): CaseTerm[] {
  const extra = inputs.equilibrium?.extraTerms ?? [];
  return [...inputs.terms, ...extra.map((t) => ({ ...t, coefficient: 1 }))];
}

/** A pin's species entry, with the version's uncertainty where it has one. */
export function speciesOfPin(p: Pick<PinnedVersion, "data"> & { uncertainty?: PinnedVersion["uncertainty"] }): SpeciesInput {
  const data = p.data as SpeciesInput;
  const u = p.uncertainty;
  if (!u || (u.dfHkJ === undefined && u.sJ === undefined && u.cpRelative === undefined)) return data;
  return { ...data, uncertainty: u };
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
  cols.push({ header: "equilibrium.converged", values: eq.map((p) => p.converged && p.naive.converged) });
  return cols;
}

export type FamilyOptionDto = { family: string; versions: { key: string; versionId: number; modelName: string; versionNumber: number; citation: string }[] };

/**
 * For every data family, the newest approved version (global or the actor's team) of each
 * species key, keeping only families that cover every key. Keys are formula + optional
 * phase marker; a version qualifies when it has the marked phase (or any phase when unmarked).
 */
export async function approvedFamilies(actor: Actor | null, keys: string[]): Promise<{ families: FamilyOptionDto[]; species: Map<string, Map<string, SpeciesInput>> }> {
  const me = requirePermission(actor, "cases.view");
  const { Species, CpModel, ModelVersion } = models();
  const parsed = keys.map((key) => {
    const m = /^(.*?)(?:\((cr(?:-[A-Za-z0-9_.]+)?|l|g)\))?$/.exec(key)!;
    return { key, formula: m[1], phase: m[2] ?? null };
  });
  const species = await Species.findAll({
    where: { formula: { [Op.in]: [...new Set(parsed.map((p) => p.formula))] }, [Op.or]: [{ teamId: null }, { teamId: me.teamId }] },
  });
  const cpModels = species.length
    ? await CpModel.findAll({ where: { speciesId: { [Op.in]: species.map((s) => s.id) }, [Op.or]: [{ teamId: null }, { teamId: me.teamId }] } })
    : [];
  const versions = cpModels.length
    ? await ModelVersion.findAll({
        where: { modelId: { [Op.in]: cpModels.map((m) => m.id) }, status: "approved", [Op.or]: [{ teamId: null }, { teamId: me.teamId }] },
        order: [["versionNumber", "DESC"], ["id", "DESC"]],
      })
    : [];
  const formulaOf = new Map(species.map((s) => [s.id, s.formula]));
  const byFamily = new Map<string, Map<string, { v: (typeof versions)[number]; modelName: string }>>();
  for (const v of versions) {
    const m = cpModels.find((c) => c.id === v.modelId)!;
    const formula = formulaOf.get(m.speciesId);
    const phases = new Set(((v.data as SpeciesInput).segments ?? []).map((s) => s.phase));
    for (const p of parsed) {
      if (p.formula !== formula) continue;
      if (p.phase ? !phases.has(p.phase) : phases.size === 0) continue;
      const fam = byFamily.get(m.family) ?? new Map();
      byFamily.set(m.family, fam);
      // Newest first by the query order; a team's own approved model wins over the global one only if newer.
      if (!fam.has(p.key)) fam.set(p.key, { v, modelName: m.name });
    }
  }
  const families: FamilyOptionDto[] = [];
  const speciesByFamily = new Map<string, Map<string, SpeciesInput>>();
  for (const [family, fam] of [...byFamily.entries()].sort(([a], [b]) => a.localeCompare(b))) {
    if (!keys.every((k) => fam.has(k))) continue;
    families.push({
      family,
      versions: keys.map((k) => {
        const { v, modelName } = fam.get(k)!;
        return { key: k, versionId: v.id, modelName, versionNumber: v.versionNumber, citation: v.citation };
      }),
    });
    speciesByFamily.set(family, new Map(keys.map((k) => [k, speciesOfPin(fam.get(k)!.v)])));
  }
  return { families, species: speciesByFamily };
}

export type SourceComparisonDto = { families: FamilyOptionDto[]; comparison: SourceComparison | null; message: string | null };

/**
 * Run a request with every approved data family that covers all its species, side by side.
 * Fewer than two families: no comparison, and a message saying why. The engine validates
 * the request (each variant's refusal carries the family's name).
 */
export async function compareFamilies(actor: Actor | null, readBody: () => Promise<unknown>): Promise<SourceComparisonDto> {
  requirePermission(actor, "evaluate.run");
  // The body is read only after the permission check, as for the evaluate route.
  const request = (await readBody()) as EvaluateRequest;
  const keys = Object.keys(request.species);
  const { families, species } = await approvedFamilies(actor, keys);
  if (families.length < 2) {
    return {
      families,
      comparison: null,
      message: families.length === 0 ? "No data family has approved versions of every species in this case." : `Only the ${families[0].family} family has approved versions of every species; there is nothing to compare against.`,
    };
  }
  const comparison = compareSources(
    request,
    families.map((f) => ({ label: f.family, species: Object.fromEntries(species.get(f.family)!) })),
  );
  return { families, comparison, message: null };
}
