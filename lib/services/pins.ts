import "server-only";
import { Op, type Transaction } from "sequelize";
import { requirePermission, type Actor } from "@/lib/auth/guards";
import { pinnedVersionOf } from "@/lib/cases/pin";
import { models } from "@/lib/db";
import { AppError } from "@/lib/errors";
import { describeData } from "@/lib/thermo/curve";
import { parseSpeciesKey } from "@/lib/thermo/formula";
import type { CaseTerm } from "@/lib/validation/cases";
import type { PinnedVersion } from "@/models/case-snapshot";

/** A model version a case may pin, as the builder offers it. */
export type PinOptionDto = {
  versionId: number;
  modelId: number;
  formula: string;
  speciesName: string;
  modelName: string;
  family: string;
  versionNumber: number;
  status: string;
  citation: string;
  scope: "reference" | "team";
  /** Phases the version has chains for. */
  phases: string[];
  tminK: number;
  tmaxK: number;
  /** Set for a version that is not approved: the builder shows it beside the choice. */
  warning: string | null;
};

/** A newer approved version of a model a case pins. */
export type NewerVersionDto = { key: string; pinnedVersionId: number; pinnedNumber: number; newerVersionId: number; newerNumber: number; modelName: string };

const NOT_APPROVED: Record<string, string> = {
  draft: "Draft version: not approved. Results based on it are for exploring only.",
  proposed: "Proposed version: awaiting approval. Results based on it may change.",
  superseded: "Superseded version: a newer approved version exists.",
};

/** A version's phases and overall range (K; NaN without segments), its limits read as quantities ("25 degC"). */
function phasesOf(data: unknown): { phases: string[]; tminK: number; tmaxK: number } {
  const { phases, rangeK } = describeData(data);
  return { phases, tminK: rangeK?.[0] ?? NaN, tmaxK: rangeK?.[1] ?? NaN };
}

/** Which versions a team sees: the global library's approved ones, and its own approved, proposed and draft ones. */
function visibleVersionWhere(teamId: number) {
  return {
    [Op.or]: [
      { teamId: null, status: "approved" },
      { teamId, status: { [Op.in]: ["approved", "proposed", "draft"] } },
    ],
  };
}

/** Versions a case may pin, approved first; optionally for one formula. */
export async function listPinOptions(actor: Actor | null, options: { formula?: string } = {}): Promise<PinOptionDto[]> {
  const me = requirePermission(actor, "cases.view");
  const { Species, CpModel, ModelVersion } = models();
  const species = await Species.findAll({
    where: { [Op.or]: [{ teamId: null }, { teamId: me.teamId }], ...(options.formula ? { formula: options.formula } : {}) },
  });
  if (species.length === 0) return [];
  const bySpecies = new Map(species.map((s) => [s.id, s]));
  const cpModels = await CpModel.findAll({
    where: { speciesId: { [Op.in]: [...bySpecies.keys()] }, [Op.or]: [{ teamId: null }, { teamId: me.teamId }] },
  });
  if (cpModels.length === 0) return [];
  const byModel = new Map(cpModels.map((m) => [m.id, m]));
  const versions = await ModelVersion.findAll({
    where: { modelId: { [Op.in]: [...byModel.keys()] }, ...visibleVersionWhere(me.teamId) },
    order: [["id", "ASC"]],
  });
  const out = versions.map((v): PinOptionDto => {
    const m = byModel.get(v.modelId)!;
    const s = bySpecies.get(m.speciesId)!;
    return {
      versionId: v.id,
      modelId: m.id,
      formula: s.formula,
      speciesName: s.displayName,
      modelName: m.name,
      family: m.family,
      versionNumber: v.versionNumber,
      status: v.status,
      citation: v.citation,
      scope: m.teamId === null ? "reference" : "team",
      ...phasesOf(v.data),
      warning: NOT_APPROVED[v.status] ?? null,
    };
  });
  const rank = (o: PinOptionDto) => (o.status === "approved" ? 0 : o.status === "proposed" ? 1 : 2);
  return out.sort((a, b) => a.formula.localeCompare(b.formula) || rank(a) - rank(b) || a.modelName.localeCompare(b.modelName) || b.versionNumber - a.versionNumber);
}

const pinError = (index: number, message: string) =>
  new AppError(422, "invalid-request", `terms.${index}.versionId: ${message}`, { fields: { [`terms.${index}.versionId`]: message } });

/**
 * The pinned versions of a case's terms, checked: visible to the team, of the term's
 * species, with the term's phase. `allowAny` lets a stored case keep a version that has
 * since been superseded; a new pin must be approved, proposed or draft.
 */
export async function loadPins(teamId: number, terms: readonly CaseTerm[], options: { transaction?: Transaction; allowAny?: boolean } = {}): Promise<PinnedVersion[]> {
  const { Species, CpModel, ModelVersion } = models();
  const { transaction } = options;
  const ids = [...new Set(terms.map((t) => t.versionId))];
  const versions = await ModelVersion.findAll({ where: { id: { [Op.in]: ids } }, transaction });
  const byId = new Map(versions.map((v) => [v.id, v]));
  const cpModels = await CpModel.findAll({ where: { id: { [Op.in]: [...new Set(versions.map((v) => v.modelId))] } }, transaction });
  const byModel = new Map(cpModels.map((m) => [m.id, m]));
  const species = await Species.findAll({ where: { id: { [Op.in]: [...new Set(cpModels.map((m) => m.speciesId))] } }, transaction });
  const bySpecies = new Map(species.map((s) => [s.id, s]));

  return terms.map((t, i): PinnedVersion => {
    const v = byId.get(t.versionId);
    const m = v && byModel.get(v.modelId);
    const s = m && bySpecies.get(m.speciesId);
    const visible = v && m && s && (v.teamId === null || v.teamId === teamId) && (m.teamId === null || m.teamId === teamId) && (s.teamId === null || s.teamId === teamId);
    if (!visible) throw pinError(i, "That model version does not exist or is not visible to this team.");
    const allowed = options.allowAny ? v.status !== "rejected" : ["approved", "proposed", "draft"].includes(v.status);
    if (!allowed) throw pinError(i, `Version ${v.versionNumber} of ${m.name} is ${v.status}; pin an approved version.`);
    if (s.formula !== t.formula) throw pinError(i, `That version belongs to ${s.formula}, not ${t.formula}.`);
    const { phases } = phasesOf(v.data);
    if (t.phase && !phases.includes(t.phase)) throw pinError(i, `${m.name} v${v.versionNumber} has no ${t.phase} phase (it has ${phases.join(", ")}).`);
    return pinnedVersionOf(t, v, m, s);
  });
}

/**
 * Critical constants for feed species that have no pin (inert ones), by formula from the
 * team's species or the reference library (the team's own first). Keys without constants
 * are left out; the engine then refuses a real-gas request naming them.
 */
export async function inertCriticalConstants(
  teamId: number,
  keys: readonly string[],
  transaction?: Transaction,
): Promise<Record<string, { tcK: number; pcBar: number; omega: number }>> {
  if (keys.length === 0) return {};
  const formulaOf = (k: string) => parseSpeciesKey(k).formula;
  const rows = await models().Species.findAll({
    where: { formula: { [Op.in]: [...new Set(keys.map(formulaOf))] }, [Op.or]: [{ teamId: null }, { teamId }] },
    transaction,
  });
  const out: Record<string, { tcK: number; pcBar: number; omega: number }> = {};
  for (const k of keys) {
    const match = rows.filter((r) => r.formula === formulaOf(k) && r.critical).sort((a, b) => (a.teamId === null ? 1 : 0) - (b.teamId === null ? 1 : 0))[0];
    if (match?.critical) out[k] = { tcK: match.critical.tcK, pcBar: match.critical.pcBar, omega: match.critical.omega };
  }
  return out;
}

/** For each pin, the newest approved version of the same model when it is newer than the pinned one. */
export async function newerApprovedVersions(
  pins: readonly Pick<PinnedVersion, "key" | "modelId" | "versionId" | "versionNumber" | "modelName">[],
  transaction?: Transaction,
): Promise<NewerVersionDto[]> {
  if (pins.length === 0) return [];
  const { ModelVersion } = models();
  const approved = await ModelVersion.findAll({
    where: { modelId: { [Op.in]: [...new Set(pins.map((p) => p.modelId))] }, status: "approved" },
    order: [["versionNumber", "DESC"]],
    transaction,
  });
  const out: NewerVersionDto[] = [];
  for (const p of pins) {
    const newest = approved.find((v) => v.modelId === p.modelId);
    if (newest && newest.versionNumber > p.versionNumber) {
      out.push({ key: p.key, pinnedVersionId: p.versionId, pinnedNumber: p.versionNumber, newerVersionId: newest.id, newerNumber: newest.versionNumber, modelName: p.modelName });
    }
  }
  return out;
}
