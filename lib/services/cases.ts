import "server-only";
import { toCsv } from "@/lib/csv";
import { Op, type Transaction } from "sequelize";
import { requirePermission, requireSameTeam, type Actor } from "@/lib/auth/guards";
import { can } from "@/lib/auth/permissions";
import { reactionText, termKey } from "@/lib/cases/balance";
import { cautionGasOf, cautionText } from "@/lib/cases/caution";
import { fromKelvin, TEMPERATURE_COLUMN, type DisplayUnit } from "@/lib/cases/display-unit";
import { canonicalSha256 } from "@/lib/cases/hash";
import { formatQuantity } from "@/lib/cases/temperature";
import { db, models } from "@/lib/db";
import { AppError, conflict, notFound } from "@/lib/errors";
import { env } from "@/lib/env";
import { runEngine } from "@/lib/engine-pool";
import { ENGINE_VERSION, type EvaluateRequest, type EvaluateResult } from "@/lib/thermo";
import { caseInputSchema, type CaseInput, type CaseInputs, type CaseStatus, type CaseUpdate, type CommentInput } from "@/lib/validation/cases";
import { validationError } from "@/lib/http";
import type { Case } from "@/models/case";
import type { CaseSnapshot, PinnedVersion } from "@/models/case-snapshot";
import { recordAudit } from "./audit";
import { enqueueMail, enqueueMailToRoles } from "./mail";
import { equilibriumCsvColumns, equilibriumRequestOf, pinTerms, speciesOfPin } from "@/lib/cases/equilibrium";
import { inertCriticalConstants, loadPins, newerApprovedVersions, type NewerVersionDto } from "./pins";

// ---------------------------------------------------------------- DTOs

export type PinDto = Omit<PinnedVersion, "data">;

export type CaseSummaryDto = {
  id: number;
  title: string;
  status: CaseStatus;
  reaction: string;
  span: string;
  authorId: number;
  authorName: string;
  latestRevision: number | null;
  updatedAt: string;
};

export type SnapshotSummaryDto = {
  revision: number;
  hash: string;
  engineVersion: string;
  createdAt: string;
  createdByName: string;
  decision: { decision: "approved" | "returned"; reason: string | null; reviewerName: string; at: string } | null;
};

export type CommentDto = { id: number; body: string; authorName: string; authorId: number; revision: number | null; at: string };

export type CaseDto = CaseSummaryDto & {
  notes: string;
  inputs: CaseInputs;
  lockVersion: number;
  pins: PinDto[];
  snapshots: SnapshotSummaryDto[];
  newerVersions: NewerVersionDto[];
  comments: CommentDto[];
  can: { edit: boolean; submit: boolean; review: boolean; comment: boolean; rerun: boolean };
};

export type ResultsDto = {
  /** `snapshot`: the stored, frozen result; `live`: computed now from the pinned versions (drafts only). */
  source: "snapshot" | "live";
  caseId: number;
  title: string;
  status: CaseStatus;
  revision: number | null;
  hash: string | null;
  frozenAt: string | null;
  reaction: string;
  inputs: CaseInput;
  pins: PinDto[];
  request: EvaluateRequest;
  result: EvaluateResult;
};

export type SnapshotDto = SnapshotSummaryDto & { caseId: number; inputs: CaseInput; pins: PinDto[]; request: EvaluateRequest; result: EvaluateResult };

// ---------------------------------------------------------------- helpers

const EDITABLE: CaseStatus[] = ["draft", "returned"];

async function namesOf(ids: (number | null | undefined)[], transaction?: Transaction): Promise<Map<number, string>> {
  const wanted = [...new Set(ids.filter((x): x is number => typeof x === "number"))];
  if (wanted.length === 0) return new Map();
  const users = await models().User.findAll({ where: { id: { [Op.in]: wanted } }, transaction });
  return new Map(users.map((u) => [u.id, u.name]));
}

function spanText(inputs: CaseInputs): string {
  const t = inputs.temperatures;
  if ("listK" in t) return t.listK.length <= 4 ? t.listK.map(formatQuantity).join(", ") : `${t.listK.length} temperatures`;
  return `${formatQuantity(t.fromK)} – ${formatQuantity(t.toK)}, step ${formatQuantity(t.stepK)}`;
}

export function caseReaction(inputs: Pick<CaseInputs, "terms">, arrow = "→"): string {
  return reactionText(inputs.terms.map((t) => ({ key: termKey(t), coefficient: t.coefficient })), arrow);
}

const withoutData = (pins: PinnedVersion[]): PinDto[] => pins.map(({ data: _data, ...rest }) => rest);

/** Load a case of the actor's team (404 otherwise). */
async function caseFor(me: Actor, id: number, transaction?: Transaction): Promise<Case> {
  const row = await models().Case.findByPk(id, { transaction });
  if (!row) throw notFound("Case");
  requireSameTeam(me, row.teamId, "Case");
  return row;
}

function requireAuthor(me: Actor, row: Case, what: string): void {
  if (row.authorId !== me.userId) throw new AppError(403, "not-author", `Only the case's author may ${what}.`);
}

function checkLock(row: Case, lockVersion: number): void {
  if (row.lockVersion !== lockVersion) {
    throw conflict("Someone changed this case after you loaded it; reload to see their changes.", { lockVersion: row.lockVersion });
  }
}

/** The engine request for a case: species keys are the formula plus phase marker, or the bare formula for the stable phase. */
export function buildRequest(inputs: CaseInputs, pins: readonly PinnedVersion[], inertCritical: Record<string, { tcK: number; pcBar: number; omega: number }> = {}): EvaluateRequest {
  const species: EvaluateRequest["species"] = {};
  // Critical constants ride along only when the equilibrium asks for a real gas, so other requests stay as they were.
  const realGas = inputs.equilibrium?.gas === "peng-robinson";
  for (const p of pins) species[p.key] = realGas && p.critical ? { ...speciesOfPin(p), critical: p.critical } : speciesOfPin(p);
  const request: EvaluateRequest = {
    reaction: caseReaction(inputs, "->"),
    species,
    temperatures: inputs.temperatures,
    referenceK: inputs.referenceK,
    toleranceKJ: inputs.toleranceKJ,
    // Which species moves ΔrG: drawn on the case page and printed in the report.
    include: ["contributions"],
  };
  if (inputs.toleranceKFactor !== null) request.toleranceKFactor = inputs.toleranceKFactor;
  const equilibrium = equilibriumRequestOf(inputs.equilibrium);
  if (equilibrium) {
    const inert = Object.fromEntries(Object.entries(inertCritical).filter(([k]) => !(k in species)));
    if (realGas && Object.keys(inert).length) equilibrium.critical = inert;
    request.equilibrium = equilibrium;
  }
  const inletK = inputs.equilibrium?.adiabaticInletK;
  if (equilibrium && inletK !== undefined && inletK !== null) request.adiabatic = { inletK };
  return request;
}

/** The request with the critical constants of unpinned (inert) feed species looked up, for a real-gas equilibrium. */
export async function requestFor(teamId: number, inputs: CaseInputs, pins: readonly PinnedVersion[], transaction?: Transaction): Promise<EvaluateRequest> {
  const eq = inputs.equilibrium;
  if (eq?.gas !== "peng-robinson") return buildRequest(inputs, pins);
  const pinned = new Set(pins.map((p) => p.key));
  return buildRequest(inputs, pins, await inertCriticalConstants(teamId, Object.keys(eq.feed).filter((k) => !pinned.has(k)), transaction));
}

const caseInputsOf = (input: CaseInput): CaseInputs => ({
  terms: input.terms,
  temperatures: input.temperatures,
  referenceK: input.referenceK,
  toleranceKJ: input.toleranceKJ,
  toleranceKFactor: input.toleranceKFactor,
  equilibrium: input.equilibrium ?? null,
});

/** The frozen content whose canonical JSON is hashed. */
export type SnapshotContent = { inputs: CaseInput; pins: PinnedVersion[]; engineVersion: string; request: EvaluateRequest; result: EvaluateResult };

/** SHA-256 (hex) of the RFC 8785 canonical JSON of the snapshot content, as it is stored (a JSON round trip). */
export function snapshotHash(content: SnapshotContent): string {
  return canonicalSha256({ inputs: content.inputs, pins: content.pins, engineVersion: content.engineVersion, request: content.request, result: content.result });
}

/** Recompute a stored snapshot's hash; true when it still matches. */
export function verifySnapshot(s: Pick<CaseSnapshot, "inputs" | "pins" | "engineVersion" | "request" | "result" | "hash">): boolean {
  return snapshotHash({ inputs: s.inputs, pins: s.pins, engineVersion: s.engineVersion, request: s.request, result: s.result }) === s.hash;
}

async function summaries(rows: Case[], transaction?: Transaction): Promise<CaseSummaryDto[]> {
  const names = await namesOf(rows.map((r) => r.authorId), transaction);
  const latest = new Map<number, number>();
  if (rows.length) {
    const snaps = await models().CaseSnapshot.findAll({
      where: { caseId: { [Op.in]: rows.map((r) => r.id) } },
      attributes: ["caseId", "revision"],
      transaction,
    });
    for (const s of snaps) latest.set(s.caseId, Math.max(latest.get(s.caseId) ?? 0, s.revision));
  }
  return rows.map((r) => ({
    id: r.id,
    title: r.title,
    status: r.status,
    reaction: caseReaction(r.inputs),
    span: spanText(r.inputs),
    authorId: r.authorId,
    authorName: names.get(r.authorId) ?? "—",
    latestRevision: latest.get(r.id) ?? null,
    updatedAt: r.updatedAt.toISOString(),
  }));
}

// ---------------------------------------------------------------- reads

export async function listCases(actor: Actor | null, filter: { status?: CaseStatus; mine?: boolean; excludeMine?: boolean; limit?: number } = {}): Promise<CaseSummaryDto[]> {
  const me = requirePermission(actor, "cases.view");
  const where: Record<string, unknown> = { teamId: me.teamId };
  if (filter.status) where.status = filter.status;
  if (filter.mine) where.authorId = me.userId;
  if (filter.excludeMine) where.authorId = { [Op.ne]: me.userId };
  const rows = await models().Case.findAll({ where, order: [["updatedAt", "DESC"], ["id", "DESC"]], limit: filter.limit ?? 500 });
  return summaries(rows);
}

async function snapshotSummaries(caseId: number): Promise<SnapshotSummaryDto[]> {
  const { CaseSnapshot, Review } = models();
  const snaps = await CaseSnapshot.findAll({
    where: { caseId },
    attributes: ["id", "revision", "hash", "engineVersion", "createdAt", "createdById"],
    order: [["revision", "ASC"]],
  });
  const reviews = await Review.findAll({ where: { caseId } });
  const names = await namesOf([...snaps.map((s) => s.createdById), ...reviews.map((r) => r.reviewerId)]);
  return snaps.map((s) => {
    const r = reviews.find((x) => x.snapshotId === s.id);
    return {
      revision: s.revision,
      hash: s.hash,
      engineVersion: s.engineVersion,
      createdAt: s.createdAt.toISOString(),
      createdByName: names.get(s.createdById) ?? "—",
      decision: r ? { decision: r.decision, reason: r.reason, reviewerName: names.get(r.reviewerId) ?? "—", at: r.createdAt.toISOString() } : null,
    };
  });
}

export async function listComments(actor: Actor | null, caseId: number): Promise<CommentDto[]> {
  const me = requirePermission(actor, "cases.view");
  await caseFor(me, caseId);
  const { Comment, CaseSnapshot } = models();
  const rows = await Comment.findAll({ where: { caseId }, order: [["id", "ASC"]] });
  const snaps = await CaseSnapshot.findAll({ where: { caseId }, attributes: ["id", "revision"] });
  const names = await namesOf(rows.map((r) => r.authorId));
  return rows.map((c) => ({
    id: c.id,
    body: c.body,
    authorId: c.authorId,
    authorName: names.get(c.authorId) ?? "—",
    revision: c.snapshotId ? (snaps.find((s) => s.id === c.snapshotId)?.revision ?? null) : null,
    at: c.createdAt.toISOString(),
  }));
}

export async function getCase(actor: Actor | null, id: number): Promise<CaseDto> {
  const me = requirePermission(actor, "cases.view");
  const row = await caseFor(me, id);
  const [summary] = await summaries([row]);
  const pins = await loadPins(row.teamId, pinTerms(row.inputs), { allowAny: true }).catch(() => [] as PinnedVersion[]);
  const isAuthor = row.authorId === me.userId;
  const snapshots = await snapshotSummaries(row.id);
  const newerVersions = await newerApprovedVersions(pins);
  return {
    ...summary,
    notes: row.notes ?? "",
    inputs: row.inputs,
    lockVersion: row.lockVersion,
    pins: withoutData(pins),
    snapshots,
    newerVersions,
    comments: await listComments(me, row.id),
    can: {
      edit: isAuthor && can(me.role, "cases.create") && EDITABLE.includes(row.status),
      submit: isAuthor && can(me.role, "cases.submit") && EDITABLE.includes(row.status),
      review: !isAuthor && can(me.role, "cases.review") && row.status === "submitted",
      comment: can(me.role, "comments.create"),
      rerun: isAuthor && can(me.role, "cases.submit") && row.status !== "submitted" && newerVersions.length > 0,
    },
  };
}

function snapshotDto(s: CaseSnapshot, summary: SnapshotSummaryDto): SnapshotDto {
  return { ...summary, caseId: s.caseId, inputs: s.inputs, pins: withoutData(s.pins), request: s.request, result: s.result };
}

async function snapshotOf(caseId: number, revision: number): Promise<CaseSnapshot> {
  const s = await models().CaseSnapshot.findOne({ where: { caseId, revision } });
  if (!s) throw notFound("Snapshot");
  return s;
}

export async function getSnapshot(actor: Actor | null, caseId: number, revision: number): Promise<SnapshotDto> {
  const me = requirePermission(actor, "cases.view");
  await caseFor(me, caseId);
  const s = await snapshotOf(caseId, revision);
  const summary = (await snapshotSummaries(caseId)).find((x) => x.revision === revision)!;
  return snapshotDto(s, summary);
}

export async function listSnapshots(actor: Actor | null, caseId: number): Promise<SnapshotSummaryDto[]> {
  const me = requirePermission(actor, "cases.view");
  await caseFor(me, caseId);
  return snapshotSummaries(caseId);
}

/**
 * Results of a case. A submitted or approved case answers with its latest stored
 * snapshot and is never recomputed; a draft or returned case is evaluated now from
 * its pinned versions. `revision` picks one stored snapshot.
 */
export async function getResults(actor: Actor | null, caseId: number, revision?: number): Promise<ResultsDto> {
  const me = requirePermission(actor, "cases.view");
  const row = await caseFor(me, caseId);
  let snap: CaseSnapshot | null = null;
  if (revision !== undefined) snap = await snapshotOf(caseId, revision);
  else if (!EDITABLE.includes(row.status)) {
    snap = await models().CaseSnapshot.findOne({ where: { caseId }, order: [["revision", "DESC"]] });
  }
  if (snap) {
    return {
      source: "snapshot",
      caseId,
      title: snap.inputs.title,
      status: row.status,
      revision: snap.revision,
      hash: snap.hash,
      frozenAt: snap.createdAt.toISOString(),
      reaction: caseReaction(snap.inputs),
      inputs: snap.inputs,
      pins: withoutData(snap.pins),
      request: snap.request,
      result: snap.result,
    };
  }
  requirePermission(me, "evaluate.run");
  const pins = await loadPins(row.teamId, pinTerms(row.inputs), { allowAny: true });
  const request = await requestFor(row.teamId, row.inputs, pins);
  const result = await runEngine(request);
  return {
    source: "live",
    caseId,
    title: row.title,
    status: row.status,
    revision: null,
    hash: null,
    frozenAt: null,
    reaction: caseReaction(row.inputs),
    inputs: { title: row.title, notes: row.notes ?? "", ...row.inputs },
    pins: withoutData(pins),
    request,
    result,
  };
}

/** The points as CSV: the API's field names as headers and its numbers written in full (shortest round-trip form). */
export const CSV_COLUMNS = ["tK", "dCpJ", "dHkJ", "dSJ", "dGkJ", "naiveDGkJ", "diffKJ", "lnK", "naiveLnK", "log10K", "naiveLog10K", "K", "exceedsTolerance"] as const;

/**
 * `unit` converts the temperature column only, renamed with its unit (`tDegC`, `tDegF`); every
 * other column keeps the API's name and number. K (`tK`) is the default.
 */
export function resultCsv(result: EvaluateResult, unit: DisplayUnit = "K"): string {
  // Uncertainty and equilibrium columns follow the points' own, only when the result has them.
  const extra = equilibriumCsvColumns(result);
  const rows = result.points.map((p, i) => [
    ...CSV_COLUMNS.map((c) => (c === "tK" ? Number(fromKelvin(p.tK, unit).toPrecision(15)) : (p as unknown as Record<string, string | number | boolean | null>)[c])),
    ...extra.map((col) => col.values[i] as string | number | boolean | null | undefined),
  ]);
  return toCsv([...CSV_COLUMNS.map((c) => (c === "tK" ? TEMPERATURE_COLUMN[unit] : c)), ...extra.map((c) => c.header)], rows);
}

export async function exportCsv(actor: Actor | null, caseId: number, revision?: number, unit: DisplayUnit = "K"): Promise<{ filename: string; csv: string }> {
  const results = await getResults(actor, caseId, revision);
  const slug = results.title.toLowerCase().replace(/[^a-z0-9]+/g, "-").replace(/^-|-$/g, "").slice(0, 60) || "case";
  const suffix = (results.revision ? `-r${results.revision}` : "-draft") + (unit === "K" ? "" : `-${unit}`);
  return { filename: `heatpath-case-${caseId}-${slug}${suffix}.csv`, csv: resultCsv(results.result, unit) };
}

// ---------------------------------------------------------------- diff

export type ValueChange = { path: string; from: unknown; to: unknown };
export type SnapshotDiffDto = {
  from: SnapshotSummaryDto;
  to: SnapshotSummaryDto;
  inputs: ValueChange[];
  pins: { key: string; from: PinDto | null; to: PinDto | null }[];
  reference: { field: string; from: number; to: number }[];
  crossover: { naiveK: [number | null, number | null]; correctedK: [number[], number[]] };
  signCase: [string, string];
  warnings: { added: string[]; removed: string[] };
  points: { common: number; maxAbsDGkJ: number; maxAbsLog10K: number; rows: { tK: number; fromDGkJ: number; toDGkJ: number; fromLog10K: number; toLog10K: number }[] };
  equilibrium: EquilibriumDiff;
};

/**
 * How the equilibrium results moved between two revisions: `lost` when the newer one has
 * none (its feed was dropped), `added`, `changed` (a conversion or mole fraction moved), or
 * `unchanged`; `none` when neither has one.
 */
export type EquilibriumDiff = {
  status: "none" | "lost" | "added" | "changed" | "unchanged";
  key: [string | null, string | null];
  pressureBar: [number | null, number | null];
  common: number;
  maxAbsConversion: number;
  maxAbsMoleFraction: number;
  rows: { tK: number; fromConversion: number; toConversion: number }[];
};

function diffEquilibrium(a: EvaluateResult, b: EvaluateResult): EquilibriumDiff {
  const ea = a.equilibrium ?? null;
  const eb = b.equilibrium ?? null;
  const key: [string | null, string | null] = [a.equilibriumInfo?.key ?? null, b.equilibriumInfo?.key ?? null];
  const pressureBar: [number | null, number | null] = [a.equilibriumInfo?.pressureBar ?? null, b.equilibriumInfo?.pressureBar ?? null];
  const base = { key, pressureBar, common: 0, maxAbsConversion: 0, maxAbsMoleFraction: 0, rows: [] };
  if (!ea && !eb) return { status: "none", ...base };
  if (ea && !eb) return { status: "lost", ...base };
  if (!ea && eb) return { status: "added", ...base };
  const byT = new Map(ea!.map((p) => [p.tK, p]));
  const common = eb!.filter((p) => byT.has(p.tK));
  let maxAbsConversion = 0;
  let maxAbsMoleFraction = 0;
  for (const p of common) {
    const q = byT.get(p.tK)!;
    maxAbsConversion = Math.max(maxAbsConversion, Math.abs(p.keyConversion - q.keyConversion));
    for (const s of new Set([...Object.keys(p.moleFractions), ...Object.keys(q.moleFractions)])) {
      maxAbsMoleFraction = Math.max(maxAbsMoleFraction, Math.abs((p.moleFractions[s] ?? 0) - (q.moleFractions[s] ?? 0)));
    }
  }
  const stride = Math.max(1, Math.ceil(common.length / 25));
  const rows = common
    .filter((_, i) => i % stride === 0 || i === common.length - 1)
    .map((p) => ({ tK: p.tK, fromConversion: byT.get(p.tK)!.keyConversion, toConversion: p.keyConversion }));
  const same = maxAbsConversion === 0 && maxAbsMoleFraction === 0 && key[0] === key[1] && pressureBar[0] === pressureBar[1];
  return { status: same ? "unchanged" : "changed", key, pressureBar, common: common.length, maxAbsConversion, maxAbsMoleFraction, rows };
}

function flatten(value: unknown, prefix = "", out: Map<string, unknown> = new Map()): Map<string, unknown> {
  if (value !== null && typeof value === "object") {
    const entries = Array.isArray(value) ? value.map((v, i) => [String(i), v] as const) : Object.entries(value);
    if (entries.length === 0) out.set(prefix, value);
    for (const [k, v] of entries) flatten(v, prefix ? `${prefix}.${k}` : k, out);
  } else out.set(prefix, value);
  return out;
}

export function diffSnapshotContents(a: Pick<CaseSnapshot, "inputs" | "pins" | "result">, b: Pick<CaseSnapshot, "inputs" | "pins" | "result">) {
  const fa = flatten(a.inputs);
  const fb = flatten(b.inputs);
  const inputs: ValueChange[] = [];
  for (const path of [...new Set([...fa.keys(), ...fb.keys()])].sort()) {
    // Absent and null read the same ("—"): a dropped feed shows as its fields going, not as a null row.
    if (JSON.stringify(fa.get(path) ?? null) !== JSON.stringify(fb.get(path) ?? null)) inputs.push({ path, from: fa.get(path) ?? null, to: fb.get(path) ?? null });
  }
  const keys = [...new Set([...a.pins.map((p) => p.key), ...b.pins.map((p) => p.key)])];
  const pins = keys
    .map((key) => {
      const pa = a.pins.find((p) => p.key === key) ?? null;
      const pb = b.pins.find((p) => p.key === key) ?? null;
      return { key, from: pa && withoutData([pa])[0], to: pb && withoutData([pb])[0] };
    })
    .filter((p) => p.from?.versionId !== p.to?.versionId);
  const ra = a.result.reference as unknown as Record<string, number>;
  const rb = b.result.reference as unknown as Record<string, number>;
  const reference = ["tK", "dHkJ", "dSJ", "dGkJ"].filter((f) => ra[f] !== rb[f]).map((field) => ({ field, from: ra[field], to: rb[field] }));
  const wa = new Set(a.result.warnings.map((w) => `${w.code}${w.species ? ` · ${w.species}` : ""}: ${w.message}`));
  const wb = new Set(b.result.warnings.map((w) => `${w.code}${w.species ? ` · ${w.species}` : ""}: ${w.message}`));
  const byT = new Map(a.result.points.map((p) => [p.tK, p]));
  const common = b.result.points.filter((p) => byT.has(p.tK));
  let maxAbsDGkJ = 0;
  let maxAbsLog10K = 0;
  for (const p of common) {
    const q = byT.get(p.tK)!;
    maxAbsDGkJ = Math.max(maxAbsDGkJ, Math.abs(p.dGkJ - q.dGkJ));
    maxAbsLog10K = Math.max(maxAbsLog10K, Math.abs(p.log10K - q.log10K));
  }
  const stride = Math.max(1, Math.ceil(common.length / 25));
  const rows = common
    .filter((_, i) => i % stride === 0 || i === common.length - 1)
    .map((p) => ({ tK: p.tK, fromDGkJ: byT.get(p.tK)!.dGkJ, toDGkJ: p.dGkJ, fromLog10K: byT.get(p.tK)!.log10K, toLog10K: p.log10K }));
  return {
    inputs,
    pins,
    reference,
    crossover: {
      naiveK: [a.result.crossover.naiveK, b.result.crossover.naiveK] as [number | null, number | null],
      correctedK: [a.result.crossover.correctedK, b.result.crossover.correctedK] as [number[], number[]],
    },
    signCase: [a.result.signCase.text, b.result.signCase.text] as [string, string],
    warnings: { added: [...wb].filter((w) => !wa.has(w)), removed: [...wa].filter((w) => !wb.has(w)) },
    points: { common: common.length, maxAbsDGkJ, maxAbsLog10K, rows },
    equilibrium: diffEquilibrium(a.result, b.result),
  };
}

/** Compare two revisions; without them, the last two. */
export async function diffSnapshots(actor: Actor | null, caseId: number, fromRevision?: number, toRevision?: number): Promise<SnapshotDiffDto> {
  const me = requirePermission(actor, "cases.view");
  await caseFor(me, caseId);
  const latest = (await models().CaseSnapshot.max<number, CaseSnapshot>("revision", { where: { caseId } })) ?? 0;
  const to = toRevision ?? latest;
  const from = fromRevision ?? to - 1;
  if (from < 1 || to < 1) throw conflict("A comparison needs two snapshots; this case has fewer.");
  const [a, b] = await Promise.all([snapshotOf(caseId, from), snapshotOf(caseId, to)]);
  const list = await snapshotSummaries(caseId);
  return { from: list.find((s) => s.revision === from)!, to: list.find((s) => s.revision === to)!, ...diffSnapshotContents(a, b) };
}

// ---------------------------------------------------------------- writes

export async function createCase(actor: Actor | null, input: CaseInput): Promise<CaseDto> {
  const me = requirePermission(actor, "cases.create");
  const id = await db().transaction(async (transaction) => {
    await loadPins(me.teamId, input.terms, { transaction });
    const row = await models().Case.create(
      { teamId: me.teamId, authorId: me.userId, title: input.title, notes: input.notes || null, status: "draft", inputs: caseInputsOf(input) },
      { transaction },
    );
    await recordAudit(transaction, {
      action: "case.created",
      entityType: "case",
      entityId: row.id,
      teamId: me.teamId,
      actorId: me.userId,
      after: { title: row.title, inputs: row.inputs },
    });
    return row.id;
  });
  return getCase(me, id);
}

/**
 * A PATCH changes what its body names and keeps the rest as stored (the equilibrium feed
 * the builder does not show, for one); the merged case is checked as a whole.
 */
function mergeUpdate(row: Case, input: CaseUpdate): CaseInput {
  const { lockVersion: _lock, ...named } = input;
  const given = Object.fromEntries(Object.entries(named).filter(([, v]) => v !== undefined));
  const parsed = caseInputSchema.safeParse({ title: row.title, notes: row.notes ?? "", ...row.inputs, ...given });
  if (!parsed.success) throw validationError(parsed.error);
  return parsed.data;
}

export async function updateCase(actor: Actor | null, id: number, input: CaseUpdate): Promise<CaseDto> {
  const me = requirePermission(actor, "cases.create");
  await db().transaction(async (transaction) => {
    const row = await caseFor(me, id, transaction);
    requireAuthor(me, row, "edit it");
    if (!EDITABLE.includes(row.status)) throw conflict(`This case is ${row.status}; its snapshot is frozen and it cannot be edited.`);
    checkLock(row, input.lockVersion);
    const before = { title: row.title, notes: row.notes, inputs: row.inputs };
    const merged = mergeUpdate(row, input);
    const old = new Map(row.inputs.terms.map((t) => [`${termKey(t)}#${t.versionId}`, true]));
    // A pin kept from before may have been superseded meanwhile; a new pin must be current.
    const fresh = merged.terms.filter((t) => !old.has(`${termKey(t)}#${t.versionId}`));
    await loadPins(me.teamId, merged.terms, { transaction, allowAny: true });
    if (fresh.length) await loadPins(me.teamId, fresh, { transaction });
    await row.update({ title: merged.title, notes: merged.notes || null, inputs: caseInputsOf(merged), lockVersion: row.lockVersion + 1 }, { transaction });
    await recordAudit(transaction, {
      action: "case.updated",
      entityType: "case",
      entityId: row.id,
      teamId: me.teamId,
      actorId: me.userId,
      before,
      after: { title: row.title, notes: row.notes, inputs: row.inputs },
    });
  });
  return getCase(me, id);
}

/** Freeze a snapshot of the case as it is now; the caller holds the transaction. */
async function freezeSnapshot(transaction: Transaction, me: Actor, row: Case, pins: PinnedVersion[], request: EvaluateRequest, result: EvaluateResult): Promise<CaseSnapshot> {
  const { CaseSnapshot } = models();
  const last = await CaseSnapshot.max<number, CaseSnapshot>("revision", { where: { caseId: row.id }, transaction });
  const inputs: CaseInput = { title: row.title, notes: row.notes ?? "", ...row.inputs };
  const content: SnapshotContent = JSON.parse(JSON.stringify({ inputs, pins, engineVersion: result.engine.version ?? ENGINE_VERSION, request, result }));
  return CaseSnapshot.create(
    { caseId: row.id, teamId: row.teamId, revision: (last ?? 0) + 1, ...content, hash: snapshotHash(content), createdById: me.userId },
    { transaction },
  );
}

function caseUrl(id: number): string {
  return `${env.APP_URL.replace(/\/$/, "")}/cases/${id}`;
}

async function requestReview(transaction: Transaction, me: Actor, row: Case, snap: CaseSnapshot): Promise<void> {
  await enqueueMailToRoles(
    transaction,
    row.teamId,
    ["reviewer", "admin"],
    {
      kind: "review-requested",
      subject: `Review requested: ${row.title} (revision ${snap.revision})`,
      text: [
        `${me.name} submitted "${row.title}" for review.`,
        ``,
        `Reaction: ${caseReaction(row.inputs)}`,
        `Revision: ${snap.revision}`,
        `Snapshot hash: ${snap.hash}`,
        ``,
        `Open the case: ${caseUrl(row.id)}`,
        ``,
        cautionText(cautionGasOf(snap.result)),
      ].join("\n"),
    },
    { exceptUserId: row.authorId },
  );
}

/** Evaluate outside the write transaction (it may take a moment on a big grid), then check nothing moved. */
async function prepareRun(teamId: number, inputs: CaseInputs) {
  const pins = await loadPins(teamId, pinTerms(inputs), { allowAny: true });
  const request = await requestFor(teamId, inputs, pins);
  const result = await runEngine(request);
  return { pins, request, result };
}

async function assertPinsUnchanged(teamId: number, inputs: CaseInputs, pins: PinnedVersion[], transaction: Transaction) {
  const now = await loadPins(teamId, pinTerms(inputs), { transaction, allowAny: true });
  if (JSON.stringify(now.map((p) => p.data)) !== JSON.stringify(pins.map((p) => p.data))) {
    throw conflict("A pinned model version changed while the case was being evaluated; submit again.");
  }
}

export async function submitCase(actor: Actor | null, id: number, lockVersion: number): Promise<CaseDto> {
  const me = requirePermission(actor, "cases.submit");
  const first = await caseFor(me, id);
  requireAuthor(me, first, "submit it");
  if (!EDITABLE.includes(first.status)) throw conflict(`This case is already ${first.status}.`);
  checkLock(first, lockVersion);
  const run = await prepareRun(first.teamId, first.inputs);
  await db().transaction(async (transaction) => {
    const row = await caseFor(me, id, transaction);
    if (!EDITABLE.includes(row.status)) throw conflict(`This case is already ${row.status}.`);
    checkLock(row, lockVersion);
    await assertPinsUnchanged(row.teamId, row.inputs, run.pins, transaction);
    const before = row.status;
    const snap = await freezeSnapshot(transaction, me, row, run.pins, run.request, run.result);
    await row.update({ status: "submitted", lockVersion: row.lockVersion + 1 }, { transaction });
    await recordAudit(transaction, {
      action: before === "returned" ? "case.resubmitted" : "case.submitted",
      entityType: "case",
      entityId: row.id,
      teamId: row.teamId,
      actorId: me.userId,
      before: { status: before },
      after: { status: "submitted", revision: snap.revision, hash: snap.hash },
    });
    await requestReview(transaction, me, row, snap);
  });
  return getCase(me, id);
}

/**
 * Move every pin with a newer approved version onto it. An approved case is re-run into
 * a new revision at once and goes back for review; a draft or returned case is re-pinned
 * and stays editable.
 */
export async function rerunWithNewerVersions(actor: Actor | null, id: number, lockVersion: number): Promise<CaseDto> {
  const me = requirePermission(actor, "cases.submit");
  const first = await caseFor(me, id);
  requireAuthor(me, first, "re-run it");
  if (first.status === "submitted") throw conflict("This case is awaiting review; wait for the decision before re-running it.");
  checkLock(first, lockVersion);
  const current = await loadPins(first.teamId, pinTerms(first.inputs), { allowAny: true });
  const newer = await newerApprovedVersions(current);
  if (newer.length === 0) throw conflict("Every pinned model version is already the newest approved one.");
  const swap = new Map(newer.map((n) => [n.pinnedVersionId, n.newerVersionId]));
  const inputs: CaseInputs = { ...first.inputs, terms: first.inputs.terms.map((t) => ({ ...t, versionId: swap.get(t.versionId) ?? t.versionId })) };
  if (first.inputs.equilibrium) {
    inputs.equilibrium = {
      ...first.inputs.equilibrium,
      extraTerms: first.inputs.equilibrium.extraTerms.map((t) => ({ ...t, versionId: swap.get(t.versionId) ?? t.versionId })),
    };
  }
  const resubmit = first.status === "approved";
  const run = resubmit ? await prepareRun(first.teamId, inputs) : null;
  await db().transaction(async (transaction) => {
    const row = await caseFor(me, id, transaction);
    checkLock(row, lockVersion);
    const before = { status: row.status, inputs: row.inputs };
    await row.update({ inputs, lockVersion: row.lockVersion + 1, ...(resubmit ? { status: "submitted" as const } : {}) }, { transaction });
    let snap: CaseSnapshot | null = null;
    if (run) {
      await assertPinsUnchanged(row.teamId, inputs, run.pins, transaction);
      snap = await freezeSnapshot(transaction, me, row, run.pins, run.request, run.result);
      await requestReview(transaction, me, row, snap);
    }
    await recordAudit(transaction, {
      action: "case.repinned",
      entityType: "case",
      entityId: row.id,
      teamId: row.teamId,
      actorId: me.userId,
      before,
      after: { status: row.status, inputs, newer, ...(snap ? { revision: snap.revision, hash: snap.hash } : {}) },
    });
  });
  return getCase(me, id);
}

/**
 * A comment is mailed to the case's author; when the author replies, to the reviewers who
 * decided the case and everyone else who commented on it. Queued in the comment's transaction.
 */
async function mailComment(transaction: Transaction, me: Actor, row: Case, input: CommentInput): Promise<void> {
  const { Comment, Review, User } = models();
  let ids: number[];
  if (me.userId !== row.authorId) ids = [row.authorId];
  else {
    const reviewers = await Review.findAll({ where: { caseId: row.id }, attributes: ["reviewerId"], transaction });
    const commenters = await Comment.findAll({ where: { caseId: row.id }, attributes: ["authorId"], transaction });
    ids = [...reviewers.map((r) => r.reviewerId), ...commenters.map((c) => c.authorId)];
  }
  const wanted = [...new Set(ids)].filter((id) => id !== me.userId);
  if (wanted.length === 0) return;
  // Only people still in the team hear about it.
  const members = await models().Membership.findAll({ where: { teamId: row.teamId, userId: { [Op.in]: wanted } }, attributes: ["userId"], transaction });
  const users = await User.findAll({ where: { id: { [Op.in]: members.map((m) => m.userId) } }, attributes: ["id", "email"], transaction });
  if (users.length === 0) return;
  await enqueueMail(transaction, {
    to: users.map((u) => u.email),
    teamId: row.teamId,
    kind: "comment-posted",
    subject: `Comment on ${row.title}${input.revision ? ` (revision ${input.revision})` : ""}`,
    text: [`${me.name} commented on "${row.title}":`, ``, input.body, ``, `Open the case: ${caseUrl(row.id)}`].join("\n"),
  });
}

export async function addComment(actor: Actor | null, caseId: number, input: CommentInput): Promise<CommentDto> {
  const me = requirePermission(actor, "comments.create");
  const id = await db().transaction(async (transaction) => {
    const row = await caseFor(me, caseId, transaction);
    let snapshotId: number | null = null;
    if (input.revision !== undefined) {
      const s = await models().CaseSnapshot.findOne({ where: { caseId: row.id, revision: input.revision }, attributes: ["id"], transaction });
      if (!s) throw new AppError(422, "invalid-request", `revision: case ${row.id} has no revision ${input.revision}.`, { fields: { revision: `No revision ${input.revision}.` } });
      snapshotId = s.id;
    }
    const c = await models().Comment.create({ caseId: row.id, snapshotId, authorId: me.userId, body: input.body }, { transaction });
    await recordAudit(transaction, {
      action: "comment.created",
      entityType: "case",
      entityId: row.id,
      teamId: me.teamId,
      actorId: me.userId,
      after: { commentId: c.id, revision: input.revision ?? null },
    });
    await mailComment(transaction, me, row, input);
    return c.id;
  });
  return (await listComments(me, caseId)).find((c) => c.id === id)!;
}
