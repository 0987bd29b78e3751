import { parseFormula } from "@/lib/thermo/formula";
import type { SeedContext } from "./index";
import { REFERENCE_SPECIES, referenceModels } from "./reference-sets";
import { CRITICAL_CITATION, CRITICAL_CONSTANTS } from "./critical-constants";

/**
 * The global reference library (teamId null): every published set of
 * seeders/data/reference-sets.json as an approved version 1 of its model. Runs in
 * production too. Safe to repeat: species and models are looked up first, and a model
 * that already has a version is left alone (approved versions never change).
 */
export async function seed({ models, sequelize }: SeedContext): Promise<void> {
  const { Species, CpModel, ModelVersion, AuditEvent } = models;
  await sequelize.transaction(async (transaction) => {
    const speciesIds = new Map<string, number>();
    for (const [formula, info] of Object.entries(REFERENCE_SPECIES)) {
      const parsed = parseFormula(formula);
      const [s] = await Species.findOrCreate({
        where: { teamId: null, formula },
        defaults: { teamId: null, formula, displayName: info.displayName, elements: parsed.elements, molarMassGPerMol: parsed.molarMassGPerMol, identifiers: { cas: info.cas } },
        transaction,
      });
      speciesIds.set(formula, s.id);
      // Critical constants (added later): filled in where missing, never overwritten.
      const critical = CRITICAL_CONSTANTS[formula];
      if (critical && !s.critical) await s.update({ critical: { ...critical, citation: CRITICAL_CITATION } }, { transaction });
    }
    for (const ref of referenceModels()) {
      const speciesId = speciesIds.get(ref.formula);
      if (!speciesId) throw new Error(`reference-sets.json: ${ref.formula} is not among the seeded species`);
      const [model] = await CpModel.findOrCreate({
        where: { teamId: null, speciesId, family: ref.family, variant: ref.variant },
        defaults: { teamId: null, speciesId, family: ref.family, variant: ref.variant, name: ref.name, copiedFromId: null, createdById: null },
        transaction,
      });
      if ((await ModelVersion.count({ where: { modelId: model.id }, transaction })) > 0) continue;
      const now = new Date();
      const version = await ModelVersion.create(
        {
          modelId: model.id,
          teamId: null,
          versionNumber: 1,
          status: "approved",
          data: ref.data,
          citation: ref.citation,
          uncertainty: ref.uncertainty,
          changeNote: ref.changeNote,
          decisionReason: "Published reference set.",
          datasetId: null,
          authorId: null,
          decidedById: null,
          proposedAt: null,
          decidedAt: now,
        },
        { transaction },
      );
      await AuditEvent.create(
        { teamId: null, actorId: null, action: "model-version.seeded", entityType: "model-version", entityId: String(version.id), before: null, after: { status: "approved", source: "seeders/data/reference-sets.json" } },
        { transaction },
      );
    }
  });
}
