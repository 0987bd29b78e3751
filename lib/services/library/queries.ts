import "server-only";
/** Reads of the library: each checks the actor's permission and visibility once, then presents. */
import { Op, type WhereOptions } from "sequelize";
import { requirePermission, type Actor } from "@/lib/auth/guards";
import { containsText, models } from "@/lib/db";
import { AppError, notFound } from "@/lib/errors";
import type { SpeciesInput } from "@/lib/thermo";
import { computeCurve, describeData, type Curve } from "@/lib/thermo/curve";
import { EXPORT_FORMAT, EXPORT_FORMAT_VERSION, type ExportFile, type ListModelsQuery, type PreviewInput } from "@/lib/validation/library";
import type { ModelVersion } from "@/models";
import {
  modelSummary,
  speciesDto,
  versionSummary,
  type ModelDetailDto,
  type ModelRowDto,
  type Page,
  type SpeciesDetailDto,
  type SpeciesDto,
  type VersionAuditDto,
  type VersionDto,
} from "./present";
import { loadModel, loadSpecies, loadVersion, presentVersion, requireVisible, userNames, visible } from "./rows";

// ------------------------------------------------------------------ species

export async function listSpecies(actor: Actor | null, query: { q?: string; page?: number; pageSize?: number } = {}): Promise<Page<SpeciesDto>> {
  const me = requirePermission(actor, "library.view");
  const { Species } = models();
  const q = (query.q ?? "").trim();
  const page = query.page ?? 1;
  const pageSize = query.pageSize ?? 50;
  const where: WhereOptions = q ? { [Op.and]: [visible(me), { [Op.or]: [{ formula: containsText(q) }, { displayName: containsText(q) }] }] } : visible(me);
  const { rows, count } = await Species.findAndCountAll({
    where,
    order: [
      ["formula", "ASC"],
      ["id", "ASC"],
    ],
    limit: pageSize,
    offset: (page - 1) * pageSize,
  });
  return { items: rows.map(speciesDto), page, pageSize, total: count, pages: Math.max(1, Math.ceil(count / pageSize)) };
}

export async function getSpecies(actor: Actor | null, id: number): Promise<SpeciesDetailDto> {
  const me = requirePermission(actor, "library.view");
  const { CpModel, ModelVersion } = models();
  const species = await loadSpecies(me, id);
  const cpModels = await CpModel.findAll({
    where: { [Op.and]: [{ speciesId: id }, visible(me)] },
    order: [
      ["teamId", "ASC"],
      ["id", "ASC"],
    ],
  });
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
  const where: WhereOptions = q ? { [Op.and]: [scopeWhere, { [Op.or]: [{ name: containsText(q) }, { speciesId: speciesHits.map((s) => s.id) }] }] } : scopeWhere;
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

export async function getModel(actor: Actor | null, id: number): Promise<ModelDetailDto> {
  const me = requirePermission(actor, "library.view");
  const model = await loadModel(me, id);
  const versions = await models().ModelVersion.findAll({ where: { modelId: id }, order: [["versionNumber", "DESC"]] });
  const names = await userNames(versions.map((v) => v.authorId));
  return { ...modelSummary(model), species: speciesDto(model.species!), versions: versions.map((v) => versionSummary(v, names)) };
}

// ------------------------------------------------------------------ versions

export async function getVersion(actor: Actor | null, id: number): Promise<VersionDto> {
  const me = requirePermission(actor, "library.view");
  return presentVersion(await loadVersion(me, id));
}

export async function versionAudit(actor: Actor | null, id: number): Promise<VersionAuditDto[]> {
  const me = requirePermission(actor, "library.view");
  await loadVersion(me, id);
  const rows = await models().AuditEvent.findAll({ where: { entityType: "model-version", entityId: String(id) }, order: [["id", "ASC"]] });
  const names = await userNames(rows.map((r) => r.actorId));
  return rows.map((r) => ({
    id: r.id,
    action: r.action,
    actorName: r.actorId != null ? (names.get(r.actorId) ?? null) : null,
    at: r.createdAt.toISOString(),
    before: r.before,
    after: r.after,
  }));
}

// ------------------------------------------------------------------ curves (lib/thermo/curve.ts; its refusals answer 422)

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

// ------------------------------------------------------------------ export

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
      versions: list.map((v) => ({
        versionNumber: v.versionNumber,
        status: v.status,
        data: v.data as ExportFile["models"][number]["versions"][number]["data"],
        citation: v.citation,
        uncertainty: v.uncertainty,
        changeNote: v.changeNote,
      })),
    });
  }
  if (!out.length) throw new AppError(404, "nothing-to-export", "No versions to export: choose models with an approved version, or export all versions.");
  return { format: EXPORT_FORMAT, formatVersion: EXPORT_FORMAT_VERSION, exportedAt: new Date().toISOString(), models: out };
}
