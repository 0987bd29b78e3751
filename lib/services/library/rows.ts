import "server-only";
/**
 * The library's row-level helpers for its own commands and queries and for sibling services
 * (library-drafts, datasets): loaders that check visibility, and inserts that the caller's
 * transaction holds. They return Sequelize rows, so they are not part of `@/lib/services/library`.
 */
import { Op, type Transaction, type WhereOptions } from "sequelize";
import { requireSameTeam, type Actor } from "@/lib/auth/guards";
import { models } from "@/lib/db";
import { notFound } from "@/lib/errors";
import { parseFormula, type SpeciesInput } from "@/lib/thermo";
import type { CreateSpeciesInput } from "@/lib/validation/library";
import type { CpModel, ModelVersion, Species } from "@/models";
import type { VersionUncertainty } from "@/models/model-version";
import { CONTRIBUTOR_ROLES, type ContributorRole } from "@/models/model-version-contributor";
import { recordAudit } from "../audit";
import { versionDto, type Contributor, type VersionDto } from "./present";

export const READ_ONLY = "The reference library is read-only: copy this version into a team model to change it.";

/** The global reference library and the actor's own team. */
export const visible = (actor: Actor): WhereOptions => ({ [Op.or]: [{ teamId: null }, { teamId: actor.teamId }] });

export function requireVisible(actor: Actor, teamId: number | null, what: string): void {
  if (teamId !== null) requireSameTeam(actor, teamId, what);
}

export async function userNames(ids: (number | null | undefined)[], transaction?: Transaction): Promise<Map<number, string>> {
  const wanted = [...new Set(ids.filter((x): x is number => typeof x === "number"))];
  if (!wanted.length) return new Map();
  const users = await models().User.findAll({ where: { id: wanted }, transaction });
  return new Map(users.map((u) => [u.id, u.name]));
}

// ------------------------------------------------------------------ contributors (four-eyes)

/** Record one person's part in a version, once; the caller holds the transaction. */
export async function addContributor(transaction: Transaction, versionId: number, userId: number, role: ContributorRole): Promise<void> {
  await models().ModelVersionContributor.findOrCreate({ where: { versionId, userId, role }, defaults: { versionId, userId, role }, transaction });
}

/**
 * Who took part in a version, author first, then in the order they joined. The
 * version's authorId always counts, also for rows written before contributors were recorded.
 */
export async function contributorsOf(v: ModelVersion, transaction?: Transaction): Promise<Contributor[]> {
  const rows = await models().ModelVersionContributor.findAll({ where: { versionId: v.id }, order: [["id", "ASC"]], transaction });
  const byUser = new Map<number, Set<ContributorRole>>();
  if (v.authorId != null) byUser.set(v.authorId, new Set(["author"]));
  for (const r of rows) byUser.set(r.userId, (byUser.get(r.userId) ?? new Set<ContributorRole>()).add(r.role));
  return [...byUser].map(([userId, roles]) => ({ userId, roles: CONTRIBUTOR_ROLES.filter((x) => roles.has(x)) }));
}

/**
 * The DTO of a version row the caller has loaded (and so authorised): reads its model and
 * species when not included, its contributors and the people's names; checks nothing again.
 */
export async function presentVersion(v: ModelVersion, transaction?: Transaction): Promise<VersionDto> {
  const { CpModel, Species } = models();
  const model = v.model ?? (await CpModel.findByPk(v.modelId, { transaction }))!;
  const species = model.species ?? (await Species.findByPk(model.speciesId, { transaction }))!;
  const contributors = await contributorsOf(v, transaction);
  const names = await userNames([v.authorId, v.decidedById, ...contributors.map((c) => c.userId)], transaction);
  return versionDto(v, model, species, contributors, names);
}

// ------------------------------------------------------------------ loaders

/** A species of the reference library or the actor's team; 404 when missing or another team's. */
export async function loadSpecies(me: Actor, id: number, transaction?: Transaction): Promise<Species> {
  const species = await models().Species.findByPk(id, { transaction });
  if (!species) throw notFound("Species");
  requireVisible(me, species.teamId, "Species");
  return species;
}

/** A model with its species; 404 when missing or another team's. */
export async function loadModel(me: Actor, id: number, transaction?: Transaction): Promise<CpModel> {
  const { CpModel, Species } = models();
  const model = await CpModel.findByPk(id, { include: [{ model: Species, as: "species" }], transaction });
  if (!model) throw notFound("Model");
  requireVisible(me, model.teamId, "Model");
  return model;
}

/** A version with its model and species; 404 when missing or another team's. */
export async function loadVersion(me: Actor, id: number, transaction?: Transaction): Promise<ModelVersion> {
  const { ModelVersion, CpModel, Species } = models();
  const version = await ModelVersion.findByPk(id, { include: [{ model: CpModel, as: "model", include: [{ model: Species, as: "species" }] }], transaction });
  if (!version) throw notFound("Model version");
  requireVisible(me, version.teamId, "Model version");
  return version;
}

// ------------------------------------------------------------------ inserts (the caller holds the transaction and has checked the actor)

/** The team's species of that formula, else the reference one, else a new team species. */
export async function findOrCreateSpecies(me: Actor, input: CreateSpeciesInput, transaction: Transaction): Promise<Species> {
  const { Species } = models();
  const parsed = parseFormula(input.formula);
  const existing =
    (await Species.findOne({ where: { teamId: me.teamId, formula: input.formula }, transaction })) ??
    (await Species.findOne({ where: { teamId: null, formula: input.formula }, transaction }));
  if (existing) return existing;
  const species = await Species.create(
    { teamId: me.teamId, formula: input.formula, displayName: input.displayName, elements: parsed.elements, molarMassGPerMol: parsed.molarMassGPerMol, identifiers: null },
    { transaction },
  );
  await recordAudit(transaction, {
    action: "species.created",
    entityType: "species",
    entityId: species.id,
    teamId: me.teamId,
    actorId: me.userId,
    after: { formula: species.formula, displayName: species.displayName },
  });
  return species;
}

export async function createTeamModel(
  me: Actor,
  input: { speciesId?: number; species?: CreateSpeciesInput; name: string; family: string; variant?: string | null; copiedFromId?: number | null },
  transaction: Transaction,
): Promise<CpModel> {
  const { CpModel, Species } = models();
  let species: Species | null;
  if (input.speciesId !== undefined) {
    species = await Species.findByPk(input.speciesId, { transaction });
    if (!species) throw notFound("Species");
    requireVisible(me, species.teamId, "Species");
  } else {
    species = await findOrCreateSpecies(me, input.species!, transaction);
  }
  const model = await CpModel.create(
    {
      speciesId: species.id,
      teamId: me.teamId,
      name: input.name,
      family: input.family,
      variant: input.variant ?? null,
      copiedFromId: input.copiedFromId ?? null,
      createdById: me.userId,
    },
    { transaction },
  );
  model.species = species;
  await recordAudit(transaction, {
    action: "cp-model.created",
    entityType: "cp-model",
    entityId: model.id,
    teamId: me.teamId,
    actorId: me.userId,
    after: { name: model.name, family: model.family, speciesId: species.id, copiedFromId: model.copiedFromId },
  });
  return model;
}

async function nextVersionNumber(modelId: number, transaction: Transaction): Promise<number> {
  const max = (await models().ModelVersion.max("versionNumber", { where: { modelId }, transaction })) as number | null;
  return (max ?? 0) + 1;
}

export type DraftFields = { data: SpeciesInput; citation: string; uncertainty?: VersionUncertainty | null; changeNote?: string | null; datasetId?: number | null };

/** Insert a draft and its audit event; the caller holds the transaction and has checked the actor. */
export async function insertDraft(
  me: Actor,
  model: CpModel,
  fields: DraftFields,
  transaction: Transaction,
  action = "model-version.created",
  extra?: Record<string, unknown>,
): Promise<ModelVersion> {
  const version = await models().ModelVersion.create(
    {
      modelId: model.id,
      teamId: me.teamId,
      versionNumber: await nextVersionNumber(model.id, transaction),
      status: "draft",
      data: fields.data,
      citation: fields.citation,
      uncertainty: fields.uncertainty ?? null,
      changeNote: fields.changeNote ?? null,
      decisionReason: null,
      datasetId: fields.datasetId ?? null,
      authorId: me.userId,
      decidedById: null,
      proposedAt: null,
      decidedAt: null,
    },
    { transaction },
  );
  await recordAudit(transaction, {
    action,
    entityType: "model-version",
    entityId: version.id,
    teamId: me.teamId,
    actorId: me.userId,
    after: { modelId: model.id, versionNumber: version.versionNumber, status: "draft", ...extra },
  });
  // Whoever creates, copies, fits or imports a draft is its author.
  await addContributor(transaction, version.id, me.userId, "author");
  return version;
}

/** Ids of the versions this user took part in; they are never theirs to decide (the review queue). */
export async function contributedVersionIds(userId: number): Promise<number[]> {
  const rows = await models().ModelVersionContributor.findAll({ where: { userId }, attributes: ["versionId"] });
  return [...new Set(rows.map((r) => r.versionId))];
}
