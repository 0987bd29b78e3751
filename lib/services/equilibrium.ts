import "server-only";
import { Op } from "sequelize";
import { requirePermission, type Actor } from "@/lib/auth/guards";
import { models } from "@/lib/db";
import { runEngineTask } from "@/lib/engine-pool";
import { parseSpeciesKey, type EvaluateRequest, type SourceComparison, type SpeciesInput } from "@/lib/thermo";
import { speciesOfPin } from "@/lib/cases/equilibrium";
import { describeData } from "@/lib/thermo/curve";

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
    const { formula, phase } = parseSpeciesKey(key);
    return { key, formula, phase: phase ?? null };
  });
  const species = await Species.findAll({
    where: { formula: { [Op.in]: [...new Set(parsed.map((p) => p.formula))] }, [Op.or]: [{ teamId: null }, { teamId: me.teamId }] },
  });
  const cpModels = species.length ? await CpModel.findAll({ where: { speciesId: { [Op.in]: species.map((s) => s.id) }, [Op.or]: [{ teamId: null }, { teamId: me.teamId }] } }) : [];
  const versions = cpModels.length
    ? await ModelVersion.findAll({
        where: { modelId: { [Op.in]: cpModels.map((m) => m.id) }, status: "approved", [Op.or]: [{ teamId: null }, { teamId: me.teamId }] },
        order: [
          ["versionNumber", "DESC"],
          ["id", "DESC"],
        ],
      })
    : [];
  const formulaOf = new Map(species.map((s) => [s.id, s.formula]));
  const criticalOf = new Map(species.map((s) => [s.id, s.critical]));
  const byFamily = new Map<string, Map<string, { v: (typeof versions)[number]; modelName: string }>>();
  for (const v of versions) {
    const m = cpModels.find((c) => c.id === v.modelId)!;
    const formula = formulaOf.get(m.speciesId);
    const phases = new Set(describeData(v.data).phases);
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
    // Critical constants ride along so a Peng–Robinson request compares families too (ignored by an ideal gas).
    const withCritical = (k: string): SpeciesInput => {
      const { v } = fam.get(k)!;
      const c = criticalOf.get(cpModels.find((m) => m.id === v.modelId)!.speciesId);
      const entry = speciesOfPin(v);
      return c ? { ...entry, critical: { tcK: c.tcK, pcBar: c.pcBar, omega: c.omega } } : entry;
    };
    speciesByFamily.set(family, new Map(keys.map((k) => [k, withCritical(k)])));
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
      message:
        families.length === 0
          ? "No data family has approved versions of every species in this case."
          : `Only the ${families[0].family} family has approved versions of every species; there is nothing to compare against.`,
    };
  }
  const comparison = await runEngineTask("compareSources", {
    request,
    variants: families.map((f) => ({ label: f.family, species: Object.fromEntries(species.get(f.family)!) })),
  });
  return { families, comparison, message: null };
}

/**
 * The family comparison for a printed report: computed at print time from the approved
 * versions (not part of any snapshot), or null when fewer than two families cover the species.
 */
export async function reportSources(actor: Actor | null, request: EvaluateRequest): Promise<SourceComparisonDto | null> {
  const keys = Object.keys(request.species);
  const body = { ...request, species: Object.fromEntries(keys.map((k) => [k, {}])) } as unknown as EvaluateRequest;
  try {
    const out = await compareFamilies(actor, async () => body);
    return out.comparison ? out : null;
  } catch {
    // A family that cannot evaluate the case (e.g. a missing phase) leaves the report without the comparison.
    return null;
  }
}
