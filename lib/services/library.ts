import "server-only";
import { phasePointsOf } from "@/lib/cases/equilibrium";
import { Op, type Transaction, type WhereOptions } from "sequelize";
import { can } from "@/lib/auth/permissions";
import { requireNotAuthor, requirePermission, requireSameTeam, type Actor } from "@/lib/auth/guards";
import { containsText, db, models } from "@/lib/db";
import { AppError, conflict, notFound } from "@/lib/errors";
import { parseFormula, parseTemperatureK, speciesProperties, type EngineWarning, type SpeciesInput } from "@/lib/thermo";
import {
  EXPORT_FORMAT,
  EXPORT_FORMAT_VERSION,
  type CreateModelInput,
  type CreateSpeciesInput,
  type EditVersionInput,
  type ExportFile,
  type ListModelsQuery,
  type PreviewInput,
  type VersionInput,
  createModelSchema,
  editVersionSchema,
  exportFileSchema,
  versionInputSchema,
} from "@/lib/validation/library";
import type { CpModel, ModelVersion, Species } from "@/models";
import type { VersionStatus, VersionUncertainty } from "@/models/model-version";
import { CONTRIBUTOR_ROLES, type ContributorRole } from "@/models/model-version-contributor";
import { recordAudit } from "./audit";
import { queueImpactJob } from "./impact";
import { notifyDecided, notifyProposed } from "./library-mail";

// ------------------------------------------------------------------ DTOs

export type Scope = "reference" | "team";
export type SpeciesDto = {
  id: number;
  formula: string;
  displayName: string;
  elements: Record<string, number>;
  molarMassGPerMol: number;
  scope: Scope;
  /** Normal boiling point and triple point (K) with their source, where the library has them. */
  phasePoints: { boilingPointK: number | null; triplePointK: number | null; citation: string | null } | null;
};
export type ModelSummaryDto = { id: number; name: string; family: string; variant: string | null; scope: Scope; copiedFromId: number | null };
export type VersionSummaryDto = {
  id: number;
  versionNumber: number;
  status: VersionStatus;
  phases: string[];
  forms: string[];
  rangeK: [number, number] | null;
  authorName: string | null;
  changeNote: string | null;
  updatedAt: string;
};
/** Someone who changed or proposed a version, with each part they took (docs/library.md, four-eyes). */
export type ContributorDto = { userId: number; name: string; roles: ContributorRole[] };
export type VersionDto = VersionSummaryDto & {
  modelId: number;
  scope: Scope;
  data: SpeciesInput;
  citation: string;
  uncertainty: VersionUncertainty | null;
  decisionReason: string | null;
  datasetId: number | null;
  authorId: number | null;
  decidedById: number | null;
  decidedByName: string | null;
  proposedAt: string | null;
  decidedAt: string | null;
  lockVersion: number;
  createdAt: string;
  /** Author, editors, proposer and contributors of an unapproved version it was started from: none may decide on it. */
  contributors: ContributorDto[];
  model: ModelSummaryDto;
  species: SpeciesDto;
};
export type ModelRowDto = ModelSummaryDto & {
  species: SpeciesDto;
  /** The version this row shows: the approved one by default, else the one matching the status filter. */
  shown: VersionSummaryDto | null;
  approvedVersionId: number | null;
  versionCount: number;
  openCount: number;
};
export type Page<T> = { items: T[]; page: number; pageSize: number; total: number; pages: number };
export type ModelDetailDto = ModelSummaryDto & { species: SpeciesDto; versions: VersionSummaryDto[] };
export type SpeciesDetailDto = SpeciesDto & { models: ModelDetailDto[] };
export type VersionAuditDto = { id: number; action: string; actorName: string | null; at: string; before: unknown; after: unknown };

const scopeOf = (teamId: number | null): Scope => (teamId === null ? "reference" : "team");

function speciesDto(s: Species): SpeciesDto {
  return { id: s.id, formula: s.formula, displayName: s.displayName, elements: s.elements, molarMassGPerMol: s.molarMassGPerMol, scope: scopeOf(s.teamId), phasePoints: phasePointsOf(s) ?? null };
}

function modelSummary(m: CpModel): ModelSummaryDto {
  return { id: m.id, name: m.name, family: m.family, variant: m.variant ?? null, scope: scopeOf(m.teamId), copiedFromId: m.copiedFromId };
}

const kelvin = (q: number | string): number => (typeof q === "number" ? q : parseTemperatureK(q, "tK"));

/** Phases, forms and the overall temperature range of a version's data. */
export function describeData(data: SpeciesInput): { phases: string[]; forms: string[]; rangeK: [number, number] | null; chains: { phase: string; tminK: number; tmaxK: number }[] } {
  const chains = new Map<string, { phase: string; tminK: number; tmaxK: number }>();
  const forms = new Set<string>();
  for (const seg of data.segments ?? []) {
    forms.add(seg.form);
    let lo: number;
    let hi: number;
    try {
      lo = kelvin(seg.tminK);
      hi = kelvin(seg.tmaxK);
    } catch {
      continue;
    }
    const c = chains.get(seg.phase);
    if (!c) chains.set(seg.phase, { phase: seg.phase, tminK: lo, tmaxK: hi });
    else {
      c.tminK = Math.min(c.tminK, lo);
      c.tmaxK = Math.max(c.tmaxK, hi);
    }
  }
  const list = [...chains.values()].sort((a, b) => a.tminK - b.tminK);
  const rangeK: [number, number] | null = list.length ? [Math.min(...list.map((c) => c.tminK)), Math.max(...list.map((c) => c.tmaxK))] : null;
  return { phases: [...chains.keys()], forms: [...forms], rangeK, chains: list };
}

async function userNames(ids: (number | null | undefined)[], transaction?: Transaction): Promise<Map<number, string>> {
  const wanted = [...new Set(ids.filter((x): x is number => typeof x === "number"))];
  if (!wanted.length) return new Map();
  const users = await models().User.findAll({ where: { id: wanted }, transaction });
  return new Map(users.map((u) => [u.id, u.name]));
}

function versionSummary(v: ModelVersion, names: Map<number, string>): VersionSummaryDto {
  const d = describeData(v.data);
  return {
    id: v.id,
    versionNumber: v.versionNumber,
    status: v.status,
    phases: d.phases,
    forms: d.forms,
    rangeK: d.rangeK,
    authorName: v.authorId != null ? (names.get(v.authorId) ?? null) : null,
    changeNote: v.changeNote,
    updatedAt: v.updatedAt.toISOString(),
  };
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
async function contributorsOf(v: ModelVersion, transaction?: Transaction): Promise<{ userId: number; roles: ContributorRole[] }[]> {
  const rows = await models().ModelVersionContributor.findAll({ where: { versionId: v.id }, order: [["id", "ASC"]], transaction });
  const byUser = new Map<number, Set<ContributorRole>>();
  if (v.authorId != null) byUser.set(v.authorId, new Set(["author"]));
  for (const r of rows) byUser.set(r.userId, (byUser.get(r.userId) ?? new Set<ContributorRole>()).add(r.role));
  return [...byUser].map(([userId, roles]) => ({ userId, roles: CONTRIBUTOR_ROLES.filter((x) => roles.has(x)) }));
}

export async function versionDto(v: ModelVersion, transaction?: Transaction): Promise<VersionDto> {
  const { CpModel, Species } = models();
  const model = v.model ?? (await CpModel.findByPk(v.modelId, { transaction }))!;
  const species = model.species ?? (await Species.findByPk(model.speciesId, { transaction }))!;
  const contributors = await contributorsOf(v, transaction);
  const names = await userNames([v.authorId, v.decidedById, ...contributors.map((c) => c.userId)], transaction);
  return {
    ...versionSummary(v, names),
    modelId: v.modelId,
    scope: scopeOf(v.teamId),
    data: v.data,
    citation: v.citation,
    uncertainty: v.uncertainty,
    decisionReason: v.decisionReason,
    datasetId: v.datasetId,
    authorId: v.authorId,
    decidedById: v.decidedById,
    decidedByName: v.decidedById != null ? (names.get(v.decidedById) ?? null) : null,
    proposedAt: v.proposedAt?.toISOString() ?? null,
    decidedAt: v.decidedAt?.toISOString() ?? null,
    lockVersion: v.lockVersion,
    createdAt: v.createdAt.toISOString(),
    contributors: contributors.map((c) => ({ userId: c.userId, name: names.get(c.userId) ?? "—", roles: c.roles })),
    model: modelSummary(model),
    species: speciesDto(species),
  };
}

/** Ids of the versions this user took part in; they are never theirs to decide. */
export async function contributedVersionIds(userId: number): Promise<number[]> {
  const rows = await models().ModelVersionContributor.findAll({ where: { userId }, attributes: ["versionId"] });
  return [...new Set(rows.map((r) => r.versionId))];
}

/** The global reference library and the actor's own team. */
const visible = (actor: Actor): WhereOptions => ({ [Op.or]: [{ teamId: null }, { teamId: actor.teamId }] });

function requireVisible(actor: Actor, teamId: number | null, what: string): void {
  if (teamId !== null) requireSameTeam(actor, teamId, what);
}

const READ_ONLY = "The reference library is read-only: copy this version into a team model to change it.";

// ------------------------------------------------------------------ species

export async function listSpecies(actor: Actor | null, query: { q?: string; page?: number; pageSize?: number } = {}): Promise<Page<SpeciesDto>> {
  const me = requirePermission(actor, "library.view");
  const { Species } = models();
  const q = (query.q ?? "").trim();
  const page = query.page ?? 1;
  const pageSize = query.pageSize ?? 50;
  const where: WhereOptions = q
    ? { [Op.and]: [visible(me), { [Op.or]: [{ formula: containsText(q) }, { displayName: containsText(q) }] }] }
    : visible(me);
  const { rows, count } = await Species.findAndCountAll({ where, order: [["formula", "ASC"], ["id", "ASC"]], limit: pageSize, offset: (page - 1) * pageSize });
  return { items: rows.map(speciesDto), page, pageSize, total: count, pages: Math.max(1, Math.ceil(count / pageSize)) };
}

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
  await recordAudit(transaction, { action: "species.created", entityType: "species", entityId: species.id, teamId: me.teamId, actorId: me.userId, after: { formula: species.formula, displayName: species.displayName } });
  return species;
}

export async function createSpecies(actor: Actor | null, input: CreateSpeciesInput): Promise<SpeciesDto> {
  const me = requirePermission(actor, "models.draft");
  return db().transaction(async (transaction) => speciesDto(await findOrCreateSpecies(me, input, transaction)));
}

export async function getSpecies(actor: Actor | null, id: number): Promise<SpeciesDetailDto> {
  const me = requirePermission(actor, "library.view");
  const { Species, CpModel, ModelVersion } = models();
  const species = await Species.findByPk(id);
  if (!species) throw notFound("Species");
  requireVisible(me, species.teamId, "Species");
  const cpModels = await CpModel.findAll({ where: { [Op.and]: [{ speciesId: id }, visible(me)] }, order: [["teamId", "ASC"], ["id", "ASC"]] });
  const versions = await ModelVersion.findAll({ where: { modelId: cpModels.map((m) => m.id) }, order: [["versionNumber", "DESC"]] });
  const names = await userNames(versions.map((v) => v.authorId));
  return {
    ...speciesDto(species),
    models: cpModels.map((m) => ({
      ...modelSummary(m),
      species: speciesDto(species),
      versions: versions.filter((v) => v.modelId === m.id).map((v) => versionSummary(v, names)),
    })),
  };
}

// ------------------------------------------------------------------ models

/**
 * The library list: one row per visible model, searched by formula, species or model name
 * in SQL, then filtered on what the versions hold (phase, form, status) and paged here,
 * on the server; a team library holds hundreds of models, not millions.
 */
export async function listModels(actor: Actor | null, query: ListModelsQuery): Promise<Page<ModelRowDto>> {
  const me = requirePermission(actor, "library.view");
  const { Species, CpModel, ModelVersion } = models();
  const q = query.q.trim();
  const scopeWhere: WhereOptions = query.scope === "reference" ? { teamId: null } : query.scope === "team" ? { teamId: me.teamId } : visible(me);
  const speciesHits = q
    ? await Species.findAll({ where: { [Op.and]: [visible(me), { [Op.or]: [{ formula: containsText(q) }, { displayName: containsText(q) }] }] }, attributes: ["id"] })
    : [];
  const where: WhereOptions = q
    ? { [Op.and]: [scopeWhere, { [Op.or]: [{ name: containsText(q) }, { speciesId: speciesHits.map((s) => s.id) }] }] }
    : scopeWhere;
  const cpModels = await CpModel.findAll({ where, include: [{ model: Species, as: "species" }] });
  const versions = await ModelVersion.findAll({ where: { modelId: cpModels.map((m) => m.id) }, order: [["versionNumber", "DESC"]] });
  const byModel = new Map<number, ModelVersion[]>();
  for (const v of versions) byModel.set(v.modelId, [...(byModel.get(v.modelId) ?? []), v]);
  const names = await userNames(versions.map((v) => v.authorId));

  const rows: ModelRowDto[] = [];
  for (const m of cpModels) {
    const list = byModel.get(m.id) ?? [];
    const approved = list.find((v) => v.status === "approved") ?? null;
    // "current": the approved version, else the newest open draft or proposal (marked as such).
    const candidates =
      query.status === "all"
        ? list
        : query.status === "current"
          ? approved
            ? [approved, ...list.filter((v) => v.status === "draft" || v.status === "proposed")]
            : list.filter((v) => v.status === "draft" || v.status === "proposed")
          : list.filter((v) => v.status === query.status);
    const matching = candidates.filter((v) => {
      const d = describeData(v.data);
      return (!query.phase || d.phases.includes(query.phase)) && (!query.form || d.forms.includes(query.form));
    });
    if (!matching.length && (query.status !== "all" || query.phase || query.form || list.length)) continue;
    const shown = matching[0] ?? null;
    rows.push({
      ...modelSummary(m),
      species: speciesDto(m.species!),
      shown: shown ? versionSummary(shown, names) : null,
      approvedVersionId: approved?.id ?? null,
      versionCount: list.length,
      openCount: list.filter((v) => v.status === "draft" || v.status === "proposed").length,
    });
  }
  rows.sort((a, b) => a.species.formula.localeCompare(b.species.formula) || (a.scope === b.scope ? 0 : a.scope === "team" ? -1 : 1) || a.name.localeCompare(b.name));
  const total = rows.length;
  const pages = Math.max(1, Math.ceil(total / query.pageSize));
  const start = (query.page - 1) * query.pageSize;
  return { items: rows.slice(start, start + query.pageSize), page: query.page, pageSize: query.pageSize, total, pages };
}

export async function loadModel(me: Actor, id: number, transaction?: Transaction): Promise<CpModel> {
  const { CpModel, Species } = models();
  const model = await CpModel.findByPk(id, { include: [{ model: Species, as: "species" }], transaction });
  if (!model) throw notFound("Model");
  requireVisible(me, model.teamId, "Model");
  return model;
}

export async function getModel(actor: Actor | null, id: number): Promise<ModelDetailDto> {
  const me = requirePermission(actor, "library.view");
  const model = await loadModel(me, id);
  const versions = await models().ModelVersion.findAll({ where: { modelId: id }, order: [["versionNumber", "DESC"]] });
  const names = await userNames(versions.map((v) => v.authorId));
  return { ...modelSummary(model), species: speciesDto(model.species!), versions: versions.map((v) => versionSummary(v, names)) };
}

async function nextVersionNumber(modelId: number, transaction: Transaction): Promise<number> {
  const max = (await models().ModelVersion.max("versionNumber", { where: { modelId }, transaction })) as number | null;
  return (max ?? 0) + 1;
}

type DraftFields = { data: SpeciesInput; citation: string; uncertainty?: VersionUncertainty | null; changeNote?: string | null; datasetId?: number | null };

/** Insert a draft and its audit event; the caller holds the transaction and has checked the actor. */
export async function insertDraft(me: Actor, model: CpModel, fields: DraftFields, transaction: Transaction, action = "model-version.created", extra?: Record<string, unknown>): Promise<ModelVersion> {
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

export async function createTeamModel(me: Actor, input: { speciesId?: number; species?: CreateSpeciesInput; name: string; family: string; variant?: string | null; copiedFromId?: number | null }, transaction: Transaction): Promise<CpModel> {
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
    { speciesId: species.id, teamId: me.teamId, name: input.name, family: input.family, variant: input.variant ?? null, copiedFromId: input.copiedFromId ?? null, createdById: me.userId },
    { transaction },
  );
  model.species = species;
  await recordAudit(transaction, { action: "cp-model.created", entityType: "cp-model", entityId: model.id, teamId: me.teamId, actorId: me.userId, after: { name: model.name, family: model.family, speciesId: species.id, copiedFromId: model.copiedFromId } });
  return model;
}

export async function createModel(actor: Actor | null, raw: CreateModelInput): Promise<{ model: ModelSummaryDto; version: VersionDto }> {
  const me = requirePermission(actor, "models.draft");
  const input = createModelSchema.parse(raw);
  return db().transaction(async (transaction) => {
    const model = await createTeamModel(me, input, transaction);
    const version = await insertDraft(me, model, input.version as DraftFields, transaction);
    version.model = model;
    return { model: modelSummary(model), version: await versionDto(version, transaction) };
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
    return versionDto(version, transaction);
  });
}

// ------------------------------------------------------------------ versions

export async function loadVersion(me: Actor, id: number, transaction?: Transaction): Promise<ModelVersion> {
  const { ModelVersion, CpModel, Species } = models();
  const version = await ModelVersion.findByPk(id, { include: [{ model: CpModel, as: "model", include: [{ model: Species, as: "species" }] }], transaction });
  if (!version) throw notFound("Model version");
  requireVisible(me, version.teamId, "Model version");
  return version;
}

export async function getVersion(actor: Actor | null, id: number): Promise<VersionDto> {
  const me = requirePermission(actor, "library.view");
  return versionDto(await loadVersion(me, id));
}

export async function versionAudit(actor: Actor | null, id: number): Promise<VersionAuditDto[]> {
  const me = requirePermission(actor, "library.view");
  await loadVersion(me, id);
  const rows = await models().AuditEvent.findAll({ where: { entityType: "model-version", entityId: String(id) }, order: [["id", "ASC"]] });
  const names = await userNames(rows.map((r) => r.actorId));
  return rows.map((r) => ({ id: r.id, action: r.action, actorName: r.actorId != null ? (names.get(r.actorId) ?? null) : null, at: r.createdAt.toISOString(), before: r.before, after: r.after }));
}

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
    if (version.lockVersion !== input.lockVersion) {
      throw conflict(`Someone saved version ${version.versionNumber} after you opened it; review their changes and edit again.`, { current: await versionDto(version, transaction) });
    }
    const changes: Partial<Pick<ModelVersion, "data" | "citation" | "uncertainty" | "changeNote">> = {};
    if (input.data !== undefined) changes.data = input.data as SpeciesInput;
    if (input.citation !== undefined) changes.citation = input.citation;
    if (input.uncertainty !== undefined) changes.uncertainty = input.uncertainty ?? null;
    if (input.changeNote !== undefined) changes.changeNote = input.changeNote ?? null;
    const before = Object.fromEntries(Object.keys(changes).map((k) => [k, version.get(k as keyof typeof changes)]));
    // Compare-and-set on lockVersion, so a concurrent writer in another process is caught too.
    const [count] = await ModelVersion.update({ ...changes, lockVersion: input.lockVersion + 1 }, { where: { id, lockVersion: input.lockVersion, status: "draft" }, transaction });
    if (count !== 1) {
      const current = await loadVersion(me, id, transaction);
      throw conflict(`Someone saved version ${version.versionNumber} after you opened it; review their changes and edit again.`, { current: await versionDto(current, transaction) });
    }
    await recordAudit(transaction, { action: "model-version.edited", entityType: "model-version", entityId: id, teamId: me.teamId, actorId: me.userId, before, after: changes });
    await addContributor(transaction, id, me.userId, "editor");
    return versionDto(await loadVersion(me, id, transaction), transaction);
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
    await recordAudit(transaction, { action: "model-version.proposed", entityType: "model-version", entityId: id, teamId: me.teamId, actorId: me.userId, before: { status: "draft" }, after: { status: "proposed" } });
    await addContributor(transaction, id, me.userId, "proposer");
    const dto = await versionDto(version, transaction);
    await notifyProposed(transaction, me, dto);
    // What this version would do to the team's pinned cases, for the version page (background).
    await queueImpactJob(transaction, { teamId: me.teamId, versionId: id, trigger: "proposed", notify: false, requestedById: me.userId });
    return dto;
  });
}

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
      await recordAudit(transaction, { action: "model-version.superseded", entityType: "model-version", entityId: old.id, teamId: me.teamId, actorId: me.userId, before: { status: "approved" }, after: { status: "superseded", byVersionId: version.id } });
    }
    version.status = "approved";
    version.decidedById = me.userId;
    version.decidedAt = new Date();
    version.decisionReason = note?.trim() || null;
    version.lockVersion += 1;
    await version.save({ transaction });
    await recordAudit(transaction, { action: "model-version.approved", entityType: "model-version", entityId: id, teamId: me.teamId, actorId: me.userId, before: { status: "proposed" }, after: { status: "approved", supersededIds: previous.map((p) => p.id), note: version.decisionReason } });
    const dto = await versionDto(version, transaction);
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
    await recordAudit(transaction, { action: "model-version.rejected", entityType: "model-version", entityId: id, teamId: me.teamId, actorId: me.userId, before: { status: "proposed" }, after: { status: "rejected", reason } });
    const dto = await versionDto(version, transaction);
    await notifyDecided(transaction, me, dto);
    return dto;
  });
}

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
    return versionDto(version, transaction);
  });
}

// ------------------------------------------------------------------ curves

export type CurvePoint = { tK: number; cpJ: number; hkJ: number; sJ: number; gkJ: number; phase: string; extrapolated: boolean };
/** Where the stable phase changes along the curve (lowest G, or the stated transition), from the engine's phase-change-in-span warnings. */
export type PhaseChange = { tK: number; from: string; to: string };
export type Curve = { points: CurvePoint[]; chains: { phase: string; tminK: number; tmaxK: number }[]; phaseChanges: PhaseChange[]; warnings: EngineWarning[]; fromK: number; toK: number };

/** A plotting range around the model's own range: a little beyond it, so extrapolated stretches show. */
export function defaultRange(data: SpeciesInput): [number, number] {
  const r = describeData(data).rangeK ?? [200, 1000];
  const from = Math.max(10, Math.round(r[0] * 0.8));
  const to = Math.round(Math.min(r[1] * 1.1, Math.max(r[0] * 3, 1500)));
  return [from, Math.max(to, from + 50)];
}

export function computeCurve(data: SpeciesInput, options: { fromK?: number; toK?: number; points?: number; phase?: string; edges?: boolean } = {}): Curve {
  const [f, t] = defaultRange(data);
  const fromK = options.fromK ?? f;
  const toK = options.toK ?? t;
  if (!(toK > fromK)) throw new AppError(422, "invalid-request", "toK: the upper temperature must be above the lower one.");
  const n = options.points ?? 160;
  const { chains } = describeData(data);
  const grid = new Set<number>();
  for (let i = 0; i < n; i++) grid.add(Number((fromK + ((toK - fromK) * i) / (n - 1)).toFixed(6)));
  // Chain edges inside the span, so the validity marks fall on a point.
  if (options.edges !== false) for (const c of chains) for (const e of [c.tminK, c.tmaxK]) if (e > fromK && e < toK) grid.add(e);
  const temps = [...grid].sort((a, b) => a - b);
  const { rows, warnings } = speciesProperties(data, temps, options.phase ? { phase: options.phase } : {});
  const points = rows.map((r) => {
    const chain = chains.find((c) => c.phase === r.phase);
    return { tK: r.tK, cpJ: r.cpJ, hkJ: r.hkJ, sJ: r.sJ, gkJ: r.gkJ, phase: r.phase, extrapolated: !chain || r.tK < chain.tminK - 1e-9 || r.tK > chain.tmaxK + 1e-9 };
  });
  // The engine names each change of the stable phase it makes inside the span (lowest G, or the stated transition).
  const phaseChanges: PhaseChange[] = warnings.flatMap((w) => {
    const x = w as { code: string; tK?: number; from?: string; to?: string };
    return x.code === "phase-change-in-span" && x.tK !== undefined && x.from && x.to ? [{ tK: x.tK, from: x.from, to: x.to }] : [];
  });
  return { points, chains, phaseChanges, warnings, fromK, toK };
}

/** The editor's live curve: any signed-in member may compute; nothing is stored. */
export async function previewCurve(actor: Actor | null, input: PreviewInput): Promise<Curve> {
  requirePermission(actor, "library.view");
  return computeCurve(input.data as SpeciesInput, input);
}

export async function versionCurve(actor: Actor | null, id: number, options: { fromK?: number; toK?: number; points?: number; edges?: boolean } = {}): Promise<Curve> {
  const me = requirePermission(actor, "library.view");
  const version = await loadVersion(me, id);
  return computeCurve(version.data, options);
}

// ------------------------------------------------------------------ export / import

/** Heatpath's own JSON library format (docs/library.md): models with their versions, citations and data. */
export async function exportLibrary(actor: Actor | null, query: { models: number[]; versions: "approved" | "all" }): Promise<ExportFile> {
  const me = requirePermission(actor, "library.view");
  const { CpModel, ModelVersion, Species } = models();
  const where: WhereOptions = query.models.length ? { [Op.and]: [{ id: query.models }, visible(me)] } : visible(me);
  const cpModels = await CpModel.findAll({ where, include: [{ model: Species, as: "species" }], order: [["id", "ASC"]] });
  if (query.models.length) {
    const found = new Set(cpModels.map((m) => m.id));
    const missing = query.models.find((id) => !found.has(id));
    if (missing !== undefined) throw notFound(`Model ${missing}`);
  }
  const versions = await ModelVersion.findAll({
    where: { modelId: cpModels.map((m) => m.id), ...(query.versions === "approved" ? { status: "approved" } : {}) },
    order: [["versionNumber", "ASC"]],
  });
  const out: ExportFile["models"] = [];
  for (const m of cpModels) {
    const list = versions.filter((v) => v.modelId === m.id);
    if (!list.length) continue;
    out.push({
      species: { formula: m.species!.formula, displayName: m.species!.displayName },
      name: m.name,
      family: m.family,
      variant: m.variant ?? null,
      versions: list.map((v) => ({ versionNumber: v.versionNumber, status: v.status, data: v.data as ExportFile["models"][number]["versions"][number]["data"], citation: v.citation, uncertainty: v.uncertainty, changeNote: v.changeNote })),
    });
  }
  if (!out.length) throw new AppError(404, "nothing-to-export", "No versions to export: choose models with an approved version, or export all versions.");
  return { format: EXPORT_FORMAT, formatVersion: EXPORT_FORMAT_VERSION, exportedAt: new Date().toISOString(), models: out };
}

export type ImportResult = { models: { id: number; name: string; created: boolean; versionIds: number[] }[]; versions: number };

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
      let model = await CpModel.findOne({ where: { teamId: me.teamId, speciesId: species.id, name: entry.name, family: entry.family, variant: entry.variant ?? null }, transaction });
      const created = !model;
      model ??= await createTeamModel(me, { speciesId: species.id, name: entry.name, family: entry.family, variant: entry.variant ?? null }, transaction);
      const ids: number[] = [];
      for (const v of entry.versions) {
        const version = await insertDraft(
          me,
          model,
          { data: v.data as SpeciesInput, citation: v.citation, uncertainty: v.uncertainty ?? null, changeNote: v.changeNote ?? `Imported (was version ${v.versionNumber}, ${v.status}).` },
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

