import "server-only";
import crypto from "node:crypto";
import { Op, type Transaction } from "sequelize";
import { requirePermission, requireSameTeam, type Actor } from "@/lib/auth/guards";
import { parseDatasetCsv, type RowError } from "@/lib/datasets/csv";
import { db, models } from "@/lib/db";
import { AppError, notFound } from "@/lib/errors";
import { fitCp, type FitResult, type SpeciesInput } from "@/lib/thermo";
import { describeData } from "@/lib/thermo/curve";
import { datasetUploadSchema, fitParamsSchema, saveFitSchema, type DatasetUploadInput, type FitParams, type SaveFitInput } from "@/lib/validation/library";
import type { Dataset } from "@/models";
import type { DatasetPoint } from "@/models/dataset";
import type { VersionStatus } from "@/models/model-version";
import { recordAudit } from "./audit";
import type { VersionDto } from "./library";
import { addContributor, createTeamModel, findOrCreateSpecies, insertDraft, loadModel, presentVersion } from "./library/rows";

export type DatasetSummaryDto = {
  id: number;
  name: string;
  originalFilename: string | null;
  sizeBytes: number;
  sha256: string;
  tUnit: string;
  cpUnit: string;
  /** The phase measured, when the uploader said. */
  phase: string | null;
  pointCount: number;
  rangeK: [number, number] | null;
  species: { id: number; formula: string; displayName: string } | null;
  uploadedByName: string | null;
  createdAt: string;
};
export type DatasetDto = DatasetSummaryDto & { points: DatasetPoint[] };

export type FitDto = Omit<FitResult, "residualsJ"> & {
  /** Points used (within the chosen range), with their residual (measured − fitted), J/(mol·K). */
  residuals: { tK: number; cpJ: number; fittedJ: number; residualJ: number }[];
  datasetId: number;
  /** The species entry a saved draft would hold, when the fit has its anchor. */
  data: SpeciesInput | null;
};

async function toDto(d: Dataset, transaction?: Transaction): Promise<DatasetDto> {
  const { Species, User } = models();
  const species = d.speciesId ? await Species.findByPk(d.speciesId, { transaction }) : null;
  const uploader = d.uploadedById ? await User.findByPk(d.uploadedById, { transaction }) : null;
  const temps = d.points.map((p) => p.tK);
  return {
    id: d.id,
    name: d.name,
    originalFilename: d.originalFilename,
    sizeBytes: d.sizeBytes,
    sha256: d.sha256,
    tUnit: d.tUnit,
    cpUnit: d.cpUnit,
    phase: d.phase ?? null,
    pointCount: d.points.length,
    rangeK: temps.length ? [Math.min(...temps), Math.max(...temps)] : null,
    species: species ? { id: species.id, formula: species.formula, displayName: species.displayName } : null,
    uploadedByName: uploader?.name ?? null,
    createdAt: d.createdAt.toISOString(),
    points: d.points,
  };
}

const summary = ({ points: _points, ...rest }: DatasetDto): DatasetSummaryDto => rest;

export async function listDatasets(actor: Actor | null): Promise<DatasetSummaryDto[]> {
  const me = requirePermission(actor, "library.view");
  const rows = await models().Dataset.findAll({ where: { teamId: me.teamId }, order: [["id", "DESC"]] });
  return Promise.all(rows.map(async (r) => summary(await toDto(r))));
}

async function loadDataset(me: Actor, id: number, transaction?: Transaction): Promise<Dataset> {
  const d = await models().Dataset.findByPk(id, { transaction });
  if (!d) throw notFound("Dataset");
  requireSameTeam(me, d.teamId, "Dataset");
  return d;
}

export async function getDataset(actor: Actor | null, id: number): Promise<DatasetDto> {
  const me = requirePermission(actor, "library.view");
  return toDto(await loadDataset(me, id));
}

/** A refused upload: every bad row with its line and column; nothing is saved. */
export function datasetRefusal(errors: RowError[]): AppError {
  const first = errors[0];
  const more = errors.length > 1 ? ` (and ${errors.length - 1} more problem${errors.length > 2 ? "s" : ""})` : "";
  return new AppError(422, "invalid-dataset", `${first.message}${more}`, { rows: errors });
}

/**
 * Upload measured Cp points as CSV text: at most 1 MB of UTF-8 and 5000 rows, T and Cp
 * columns (units from the header or as chosen), optional σ. Points are stored in SI.
 */
export async function uploadDataset(actor: Actor | null, raw: DatasetUploadInput): Promise<DatasetDto> {
  const me = requirePermission(actor, "datasets.upload");
  const input = datasetUploadSchema.parse(raw);
  const bytes = Buffer.byteLength(input.text, "utf8");
  const parsed = parseDatasetCsv(input.text, { tUnit: input.tUnit, cpUnit: input.cpUnit }, bytes);
  if (parsed.errors.length) throw datasetRefusal(parsed.errors);
  return db().transaction(async (transaction) => {
    let speciesId: number | null = null;
    if (input.speciesId) {
      const s = await models().Species.findByPk(input.speciesId, { transaction });
      if (!s || (s.teamId !== null && s.teamId !== me.teamId)) throw notFound("Species");
      speciesId = s.id;
    } else if (input.species) {
      speciesId = (await findOrCreateSpecies(me, input.species, transaction)).id;
    }
    const dataset = await models().Dataset.create(
      {
        teamId: me.teamId,
        speciesId,
        name: input.name,
        originalFilename: input.filename ?? null,
        sizeBytes: bytes,
        sha256: crypto.createHash("sha256").update(input.text, "utf8").digest("hex"),
        tUnit: parsed.tUnit,
        cpUnit: parsed.cpUnit,
        phase: input.phase ?? null,
        points: parsed.points,
        uploadedById: me.userId,
      },
      { transaction },
    );
    await recordAudit(transaction, {
      action: "dataset.uploaded",
      entityType: "dataset",
      entityId: dataset.id,
      teamId: me.teamId,
      actorId: me.userId,
      after: { name: dataset.name, points: parsed.points.length, sha256: dataset.sha256, tUnit: parsed.tUnit, cpUnit: parsed.cpUnit, phase: input.phase ?? null },
    });
    return toDto(dataset, transaction);
  });
}

const NEEDS_PHASE = "phase: say which phase the measurements are for (cr, l or g); the dataset does not say.";

/** The phase a fit is for: as asked, else the dataset's own; never a silent default. */
function fitPhase(dataset: Dataset, asked: string | undefined): string {
  const phase = asked ?? dataset.phase ?? null;
  if (!phase) throw new AppError(422, "invalid-request", NEEDS_PHASE, { fields: { phase: NEEDS_PHASE.replace(/^phase: /, "") } });
  return phase;
}

function runFit(dataset: Dataset, params: FitParams): FitDto {
  const p = { ...fitParamsSchema.parse(params) };
  p.phase = fitPhase(dataset, p.phase);
  const lo = p.tminK ?? -Infinity;
  const hi = p.tmaxK ?? Infinity;
  const points = dataset.points.filter((pt) => pt.tK >= lo && pt.tK <= hi);
  const fit = fitCp({ form: p.form, points, exponents: p.exponents, phase: p.phase, reference: p.reference });
  const { residualsJ, ...rest } = fit;
  const residuals = points.map((pt, i) => ({ tK: pt.tK, cpJ: pt.cpJ, fittedJ: pt.cpJ - residualsJ[i], residualJ: residualsJ[i] }));
  let data: SpeciesInput | null = null;
  if (fit.segment && (fit.form === "shomate" || fit.form === "nasa7")) {
    data = fit.integrationConstants ? { segments: [fit.segment] } : null;
  } else if (fit.segment && fit.reference) {
    data = { segments: [fit.segment], reference: fit.reference };
  }
  return { ...rest, residuals, datasetId: dataset.id, data };
}

/** Fit a form to the dataset (engine: weighted linear least squares); nothing is stored. */
export async function fitDataset(actor: Actor | null, id: number, params: FitParams): Promise<FitDto> {
  const me = requirePermission(actor, "models.fit");
  return runFit(await loadDataset(me, id), params);
}

const NEEDS_ANCHOR = "reference: enter H (kJ/mol) and S (J/(mol·K)) at the reference temperature, so the fitted model can give H and S as well as Cp.";

/** Fit again on the server and save the result as a draft version linked to the dataset. */
export async function saveFitAsDraft(actor: Actor | null, id: number, raw: SaveFitInput): Promise<VersionDto> {
  const me = requirePermission(actor, "models.fit");
  const input = saveFitSchema.parse(raw);
  return db().transaction(async (transaction) => {
    const dataset = await loadDataset(me, id, transaction);
    const fit = runFit(dataset, input.fit);
    if (!fit.data) throw new AppError(422, "invalid-request", NEEDS_ANCHOR, { fields: { reference: NEEDS_ANCHOR } });
    let model;
    if (input.modelId) {
      model = await loadModel(me, input.modelId, transaction);
      if (model.teamId === null) throw new AppError(403, "read-only", "The reference library is read-only: save the fit as a new team model.");
    } else {
      if (!dataset.speciesId) throw new AppError(422, "invalid-request", "Choose the species this dataset measures before saving a model from it.");
      const species = await models().Species.findByPk(dataset.speciesId, { transaction });
      model = await createTeamModel(
        me,
        { speciesId: dataset.speciesId, name: input.modelName || `${species!.formula} · fitted to ${dataset.name}`, family: "measured", variant: null },
        transaction,
      );
    }
    const version = await insertDraft(
      me,
      model,
      {
        data: fit.data,
        citation: input.citation,
        uncertainty: { cpRelative: Number((fit.rmsJ / (fit.residuals.reduce((s, r) => s + r.cpJ, 0) / fit.residuals.length)).toPrecision(3)) },
        changeNote:
          input.changeNote ?? `Fitted (${fit.form}, ${fit.points} points, ${fit.tminK}–${fit.tmaxK} K, RMS ${fit.rmsJ.toPrecision(3)} J/(mol·K)) to dataset "${dataset.name}".`,
        datasetId: dataset.id,
      },
      transaction,
      "model-version.fitted",
      { datasetId: dataset.id, form: fit.form, rmsJ: fit.rmsJ, maxAbsJ: fit.maxAbsJ, points: fit.points },
    );
    // Four-eyes: whoever uploaded the measurements shaped the content, so they may not decide on the fit.
    if (dataset.uploadedById != null && dataset.uploadedById !== me.userId) await addContributor(transaction, version.id, dataset.uploadedById, "uploader");
    version.model = model;
    return presentVersion(version, transaction);
  });
}

/**
 * The phases each species' visible versions already hold (reference and the team's own,
 * any status but rejected), so a phase picker can offer them and default to the only one.
 */
export async function phasesBySpecies(actor: Actor | null): Promise<Record<number, string[]>> {
  const me = requirePermission(actor, "library.view");
  const { CpModel, ModelVersion } = models();
  const cpModels = await CpModel.findAll({ where: { [Op.or]: [{ teamId: null }, { teamId: me.teamId }] }, attributes: ["id", "speciesId"] });
  const versions = await ModelVersion.findAll({ where: { modelId: { [Op.in]: cpModels.map((m) => m.id) }, status: { [Op.ne]: "rejected" } }, attributes: ["modelId", "data"] });
  const speciesOf = new Map(cpModels.map((m) => [m.id, m.speciesId]));
  const out: Record<number, string[]> = {};
  for (const v of versions) {
    const sid = speciesOf.get(v.modelId);
    if (sid == null) continue;
    const list = (out[sid] ??= []);
    for (const p of describeData(v.data).phases) if (!list.includes(p)) list.push(p);
  }
  return out;
}

/** The model versions fitted to a dataset (any status), newest first. */
export async function datasetVersions(actor: Actor | null, id: number): Promise<{ id: number; modelName: string; versionNumber: number; status: VersionStatus }[]> {
  const me = requirePermission(actor, "library.view");
  const d = await loadDataset(me, id);
  const { CpModel, ModelVersion } = models();
  const rows = await ModelVersion.findAll({ where: { datasetId: d.id, teamId: me.teamId }, include: [{ model: CpModel, as: "model" }], order: [["id", "DESC"]] });
  return rows.map((v) => ({ id: v.id, modelName: v.model?.name ?? "—", versionNumber: v.versionNumber, status: v.status }));
}
