import { parseFormula } from "@/lib/thermo/formula";
import type { SeedContext } from "./index";
import { REFERENCE_SPECIES, referenceModels, referenceRecords, type ReferenceRecord } from "./reference-sets";
import { CRITICAL_CITATION, CRITICAL_CONSTANTS } from "./critical-constants";

/**
 * The global reference library (teamId null): every published set of
 * seeders/data/reference-sets.json and reference-sets-more.json as an approved version 1 of
 * its model, and the species' boiling and triple points. Runs in production too. Safe to
 * repeat, also on a database seeded before the second file and the phase points existed:
 * species and models are looked up first, a model that already has a version is left alone
 * (approved versions never change), and a reference species' phase points are filled in only
 * where they differ from the table (with an audit event).
 *
 * `options` exist for the upgrade test, which seeds the library as it was (first file only,
 * no phase points) and then seeds again.
 */
export async function seed({ models, sequelize }: SeedContext, options: { records?: ReferenceRecord[]; phasePoints?: boolean } = {}): Promise<void> {
  const { Species, CpModel, ModelVersion, AuditEvent } = models;
  const records = options.records ?? referenceRecords();
  const withPoints = options.phasePoints ?? true;
  const wanted = new Set(records.map((r) => r.species));
  await sequelize.transaction(async (transaction) => {
    const speciesIds = new Map<string, number>();
    for (const [formula, info] of Object.entries(REFERENCE_SPECIES)) {
      if (!wanted.has(formula)) continue;
      const parsed = parseFormula(formula);
      const points = withPoints ? info.phasePoints : null;
      const fields = { boilingPointK: points?.boilingPointK ?? null, triplePointK: points?.triplePointK ?? null, phasePointsCitation: points?.citation ?? null };
      const [s, created] = await Species.findOrCreate({
        where: { teamId: null, formula },
        defaults: {
          teamId: null,
          formula,
          displayName: info.displayName,
          elements: parsed.elements,
          molarMassGPerMol: parsed.molarMassGPerMol,
          identifiers: { cas: info.cas },
          ...fields,
        },
        transaction,
      });
      speciesIds.set(formula, s.id);
      const stale =
        withPoints && !created && (s.boilingPointK !== fields.boilingPointK || s.triplePointK !== fields.triplePointK || s.phasePointsCitation !== fields.phasePointsCitation);
      if (stale) {
        const before = { boilingPointK: s.boilingPointK, triplePointK: s.triplePointK, phasePointsCitation: s.phasePointsCitation };
        await s.update(fields, { transaction });
        await AuditEvent.create(
          { teamId: null, actorId: null, action: "species.phase-points-seeded", entityType: "species", entityId: String(s.id), before, after: fields },
          { transaction },
        );
      }
      // Critical constants (added later): filled in where missing, never overwritten.
      const critical = CRITICAL_CONSTANTS[formula];
      if (critical && !s.critical) await s.update({ critical: { ...critical, citation: CRITICAL_CITATION } }, { transaction });
    }
    for (const ref of referenceModels(records)) {
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
        {
          teamId: null,
          actorId: null,
          action: "model-version.seeded",
          entityType: "model-version",
          entityId: String(version.id),
          before: null,
          after: { status: "approved", source: ref.dataFile },
        },
        { transaction },
      );
    }
  });
}
