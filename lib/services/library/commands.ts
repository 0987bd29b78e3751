import "server-only";
/**
 * Writes to the library. Each checks the actor once, works on rows it loaded inside its own
 * transaction, and ends by presenting those rows (never by calling a public getter again).
 */
import type { Transaction } from "sequelize";
import { can } from "@/lib/auth/permissions";
import { requireNotAuthor, requirePermission, type Actor } from "@/lib/auth/guards";
import { db, models } from "@/lib/db";
import { AppError, conflict, notFound } from "@/lib/errors";
import { parseFormula, speciesProperties, type SpeciesInput } from "@/lib/thermo";
import { describeData } from "@/lib/thermo/curve";
import {
  createModelSchema,
  editVersionSchema,
  exportFileSchema,
  versionInputSchema,
  type CreateModelInput,
  type CreateSpeciesInput,
  type EditVersionInput,
  type VersionInput,
} from "@/lib/validation/library";
import type { ModelVersion } from "@/models";
import { recordAudit } from "../audit";
import { queueImpactJob } from "../impact";
import { notifyDecided, notifyProposed } from "../library-mail";
import { modelSummary, speciesDto, type ImportResult, type ModelSummaryDto, type SpeciesDto, type VersionDto } from "./present";
import { addContributor, contributorsOf, createTeamModel, findOrCreateSpecies, insertDraft, loadModel, loadVersion, presentVersion, READ_ONLY, type DraftFields } from "./rows";

// ------------------------------------------------------------------ species and models

export async function createSpecies(actor: Actor | null, input: CreateSpeciesInput): Promise<SpeciesDto> {
  const me = requirePermission(actor, "models.draft");
  return db().transaction(async (transaction) => speciesDto(await findOrCreateSpecies(me, input, transaction)));
}

export async function createModel(actor: Actor | null, raw: CreateModelInput): Promise<{ model: ModelSummaryDto; version: VersionDto }> {
  const me = requirePermission(actor, "models.draft");
  const input = createModelSchema.parse(raw);
  return db().transaction(async (transaction) => {
    const model = await createTeamModel(me, input, transaction);
    const version = await insertDraft(me, model, input.version as DraftFields, transaction);
    version.model = model;
    return { model: modelSummary(model), version: await presentVersion(version, transaction) };
  });
}

/** A new draft of a team model: typed afresh, or started from one of its versions. */
export async function createVersion(actor: Actor | null, modelId: number, input: { fromVersionId: number } | VersionInput): Promise<VersionDto> {
  const me = requirePermission(actor, "models.draft");
  return db().transaction(async (transaction) => {
    const model = await loadModel(me, modelId, transaction);
    if (model.teamId === null) throw new AppError(403, "read-only", READ_ONLY);
    let fields: DraftFields;
    let extra: Record<string, unknown> | undefined;
    let from: ModelVersion | null = null;
    if ("fromVersionId" in input) {
      from = await models().ModelVersion.findByPk(input.fromVersionId, { transaction });
      if (!from || from.modelId !== model.id) throw notFound("Model version");
      fields = { data: from.data, citation: from.citation, uncertainty: from.uncertainty, changeNote: null, datasetId: from.datasetId };
      extra = { fromVersionId: from.id };
    } else {
      fields = versionInputSchema.parse(input) as DraftFields;
    }
    const version = await insertDraft(me, model, fields, transaction, "model-version.created", extra);
    // Content nobody has checked yet brings its contributors along: copying a draft does not launder it.
    if (from && from.status !== "approved" && from.status !== "superseded") {
      for (const c of await contributorsOf(from, transaction)) if (c.userId !== me.userId) await addContributor(transaction, version.id, c.userId, "source");
    }
    version.model = model;
    return presentVersion(version, transaction);
  });
}

// ------------------------------------------------------------------ drafts

function refuseUnlessDraft(version: ModelVersion, doing: string): void {
  if (version.teamId === null) throw new AppError(403, "read-only", READ_ONLY);
  if (version.status === "approved" || version.status === "superseded") {
    throw new AppError(409, "immutable", `Version ${version.versionNumber} is ${version.status} and can never change; start a new draft from it instead.`);
  }
  if (version.status !== "draft") throw conflict(`Version ${version.versionNumber} is ${version.status}; only a draft can be ${doing}.`);
}

/** The author may work on their own draft; someone else's draft needs models.edit. */
function requireDraftEditor(me: Actor, version: ModelVersion): void {
  if (version.authorId !== me.userId && !can(me.role, "models.edit")) {
    throw new AppError(403, "forbidden", "Only the author or a steward can change this draft.");
  }
}

/**
 * Edit a draft. The caller sends the lockVersion it read; if someone saved in between,
 * the answer is 409 with the current version in `details.current`, never a silent overwrite.
 */
export async function editVersion(actor: Actor | null, id: number, raw: EditVersionInput): Promise<VersionDto> {
  const me = requirePermission(actor, "models.draft");
  const input = editVersionSchema.parse(raw);
  const { ModelVersion } = models();
  return db().transaction(async (transaction) => {
    const version = await loadVersion(me, id, transaction);
    refuseUnlessDraft(version, "edited");
    requireDraftEditor(me, version);
    const stale = () => `Someone saved version ${version.versionNumber} after you opened it; review their changes and edit again.`;
    if (version.lockVersion !== input.lockVersion) throw conflict(stale(), { current: await presentVersion(version, transaction) });
    const changes: Partial<Pick<ModelVersion, "data" | "citation" | "uncertainty" | "changeNote">> = {};
    if (input.data !== undefined) changes.data = input.data as SpeciesInput;
    if (input.citation !== undefined) changes.citation = input.citation;
    if (input.uncertainty !== undefined) changes.uncertainty = input.uncertainty ?? null;
    if (input.changeNote !== undefined) changes.changeNote = input.changeNote ?? null;
    const before = Object.fromEntries(Object.keys(changes).map((k) => [k, version.get(k as keyof typeof changes)]));
    // Compare-and-set on lockVersion, so a concurrent writer in another process is caught too.
    const [count] = await ModelVersion.update({ ...changes, lockVersion: input.lockVersion + 1 }, { where: { id, lockVersion: input.lockVersion, status: "draft" }, transaction });
    if (count !== 1) throw conflict(stale(), { current: await presentVersion(await loadVersion(me, id, transaction), transaction) });
    await recordAudit(transaction, { action: "model-version.edited", entityType: "model-version", entityId: id, teamId: me.teamId, actorId: me.userId, before, after: changes });
    await addContributor(transaction, id, me.userId, "editor");
    // The row as saved (with its model and species included, as loaded above).
    return presentVersion(await version.reload({ transaction }), transaction);
  });
}

/** An engine pass over the version's own ranges: a draft that cannot be evaluated is not proposed. */
function checkComputable(data: SpeciesInput): void {
  const { chains } = describeData(data);
  const temps = chains.flatMap((c) => [c.tminK, (c.tminK + c.tmaxK) / 2, c.tmaxK]);
  speciesProperties(data, temps.length ? temps : [298.15]);
}

export async function proposeVersion(actor: Actor | null, id: number): Promise<VersionDto> {
  const me = requirePermission(actor, "models.draft");
  return db().transaction(async (transaction) => {
    const version = await loadVersion(me, id, transaction);
    refuseUnlessDraft(version, "proposed");
    requireDraftEditor(me, version);
    checkComputable(version.data);
    version.status = "proposed";
    version.proposedAt = new Date();
    version.lockVersion += 1;
    await version.save({ transaction });
    await recordAudit(transaction, {
      action: "model-version.proposed",
      entityType: "model-version",
      entityId: id,
      teamId: me.teamId,
      actorId: me.userId,
      before: { status: "draft" },
      after: { status: "proposed" },
    });
    await addContributor(transaction, id, me.userId, "proposer");
    const dto = await presentVersion(version, transaction);
    await notifyProposed(transaction, me, dto);
    // What this version would do to the team's pinned cases, for the version page (background).
    await queueImpactJob(transaction, { teamId: me.teamId, versionId: id, trigger: "proposed", notify: false, requestedById: me.userId });
    return dto;
  });
}

// ------------------------------------------------------------------ decisions (four-eyes)

async function loadForDecision(me: Actor, id: number, transaction: Transaction): Promise<ModelVersion> {
  const version = await loadVersion(me, id, transaction);
  if (version.teamId === null) throw new AppError(403, "read-only", READ_ONLY);
  requireNotAuthor(me, version.authorId, "You wrote this version: another steward must approve or reject it.");
  // Four-eyes: nobody who changed the content or proposed it decides on it.
  if ((await contributorsOf(version, transaction)).some((c) => c.userId === me.userId)) {
    throw new AppError(403, "own-work", "You changed or proposed this version: another steward must approve or reject it.");
  }
  if (version.status !== "proposed") throw conflict(`Version ${version.versionNumber} is ${version.status}; only a proposed version can be decided.`);
  return version;
}

/** Approve a proposed version; the model's previously approved version becomes superseded. */
export async function approveVersion(actor: Actor | null, id: number, note?: string): Promise<VersionDto> {
  const me = requirePermission(actor, "models.decide");
  const { ModelVersion } = models();
  return db().transaction(async (transaction) => {
    const version = await loadForDecision(me, id, transaction);
    const previous = await ModelVersion.findAll({ where: { modelId: version.modelId, status: "approved" }, transaction });
    for (const old of previous) {
      // The only change an approved row may take (the database trigger allows exactly this).
      await ModelVersion.update({ status: "superseded" }, { where: { id: old.id, status: "approved" }, transaction });
      await recordAudit(transaction, {
        action: "model-version.superseded",
        entityType: "model-version",
        entityId: old.id,
        teamId: me.teamId,
        actorId: me.userId,
        before: { status: "approved" },
        after: { status: "superseded", byVersionId: version.id },
      });
    }
    version.status = "approved";
    version.decidedById = me.userId;
    version.decidedAt = new Date();
    version.decisionReason = note?.trim() || null;
    version.lockVersion += 1;
    await version.save({ transaction });
    await recordAudit(transaction, {
      action: "model-version.approved",
      entityType: "model-version",
      entityId: id,
      teamId: me.teamId,
      actorId: me.userId,
      before: { status: "proposed" },
      after: { status: "approved", supersededIds: previous.map((p) => p.id), note: version.decisionReason },
    });
    const dto = await presentVersion(version, transaction);
    await notifyDecided(transaction, me, dto);
    // Re-run the impact on the approved version; when done, the authors of affected cases get one mail each.
    await queueImpactJob(transaction, { teamId: me.teamId, versionId: id, trigger: "approved", notify: true, requestedById: me.userId });
    return dto;
  });
}

export async function rejectVersion(actor: Actor | null, id: number, reason: string): Promise<VersionDto> {
  const me = requirePermission(actor, "models.decide");
  return db().transaction(async (transaction) => {
    const version = await loadForDecision(me, id, transaction);
    version.status = "rejected";
    version.decidedById = me.userId;
    version.decidedAt = new Date();
    version.decisionReason = reason;
    version.lockVersion += 1;
    await version.save({ transaction });
    await recordAudit(transaction, {
      action: "model-version.rejected",
      entityType: "model-version",
      entityId: id,
      teamId: me.teamId,
      actorId: me.userId,
      before: { status: "proposed" },
      after: { status: "rejected", reason },
    });
    const dto = await presentVersion(version, transaction);
    await notifyDecided(transaction, me, dto);
    return dto;
  });
}

// ------------------------------------------------------------------ copies and imports

/** A steward copies a reference version into a team model (created on first copy) as a draft. */
export async function copyReferenceVersion(actor: Actor | null, id: number): Promise<VersionDto> {
  const me = requirePermission(actor, "models.edit");
  const { CpModel } = models();
  return db().transaction(async (transaction) => {
    const source = await loadVersion(me, id, transaction);
    if (source.teamId !== null) throw conflict("This version already belongs to your team: start a new draft from it instead.");
    const ref = source.model!;
    let model = await CpModel.findOne({ where: { teamId: me.teamId, copiedFromId: ref.id }, include: [{ model: models().Species, as: "species" }], transaction });
    model ??= await createTeamModel(me, { speciesId: ref.speciesId, name: `${ref.name} (team copy)`, family: ref.family, variant: ref.variant, copiedFromId: ref.id }, transaction);
    const version = await insertDraft(
      me,
      model,
      { data: source.data, citation: source.citation, uncertainty: source.uncertainty, changeNote: `Copied from reference version ${source.versionNumber} of ${ref.name}.` },
      transaction,
      "model-version.copied",
      { fromVersionId: source.id },
    );
    version.model = model;
    return presentVersion(version, transaction);
  });
}

/**
 * Import a library file as drafts of team models (one transaction: a refused file saves nothing).
 * A model is matched by species, name, family and variant within the team, else created.
 */
export async function importLibrary(actor: Actor | null, raw: unknown): Promise<ImportResult> {
  const me = requirePermission(actor, "models.edit");
  const parsed = exportFileSchema.safeParse(raw);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    const where = issue.path.length ? `${issue.path.join(".")}: ` : "";
    throw new AppError(422, "invalid-import", `${where}${issue.message}`, { fields: { [issue.path.join(".") || "_"]: issue.message } });
  }
  const file = parsed.data;
  const { CpModel } = models();
  return db().transaction(async (transaction) => {
    const result: ImportResult = { models: [], versions: 0 };
    for (const [i, entry] of file.models.entries()) {
      try {
        parseFormula(entry.species.formula);
      } catch (e) {
        throw new AppError(422, "invalid-import", `models.${i}.species.formula: ${(e as Error).message}`);
      }
      const species = await findOrCreateSpecies(me, entry.species, transaction);
      let model = await CpModel.findOne({
        where: { teamId: me.teamId, speciesId: species.id, name: entry.name, family: entry.family, variant: entry.variant ?? null },
        transaction,
      });
      const created = !model;
      model ??= await createTeamModel(me, { speciesId: species.id, name: entry.name, family: entry.family, variant: entry.variant ?? null }, transaction);
      const ids: number[] = [];
      for (const v of entry.versions) {
        const version = await insertDraft(
          me,
          model,
          {
            data: v.data as SpeciesInput,
            citation: v.citation,
            uncertainty: v.uncertainty ?? null,
            changeNote: v.changeNote ?? `Imported (was version ${v.versionNumber}, ${v.status}).`,
          },
          transaction,
          "model-version.imported",
          { importedVersionNumber: v.versionNumber, importedStatus: v.status },
        );
        ids.push(version.id);
      }
      result.models.push({ id: model.id, name: model.name, created, versionIds: ids });
      result.versions += ids.length;
    }
    return result;
  });
}
