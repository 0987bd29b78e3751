import "server-only";
import { Op, type Transaction } from "sequelize";
import { requirePermission, requireSameTeam, type Actor } from "@/lib/auth/guards";
import { diffSnapshotContents } from "@/lib/cases/diff";
import type { DisplayUnit } from "@/lib/cases/display-unit";
import { pinTerms } from "@/lib/cases/equilibrium";
import { buildRequest } from "@/lib/cases/request";
import { resultCsv } from "@/lib/cases/result-csv";
import { models } from "@/lib/db";
import { runEngine } from "@/lib/engine-pool";
import { conflict, notFound } from "@/lib/errors";
import type { EvaluateRequest } from "@/lib/thermo";
import type { CaseInputs, CaseStatus } from "@/lib/validation/cases";
import type { Case } from "@/models/case";
import type { CaseSnapshot, PinnedVersion } from "@/models/case-snapshot";
import { inertCriticalConstants, loadPins, newerApprovedVersions } from "../pins";
import { frozenSnapshot } from "../results-cache";
import {
  EDITABLE,
  presentCase,
  presentComment,
  presentLiveResults,
  presentSnapshot,
  presentSnapshotResults,
  presentSnapshotSummary,
  presentSummary,
  type CaseDto,
  type CaseParts,
  type CaseSummaryDto,
  type CommentDto,
  type Names,
  type ResultsDto,
  type SnapshotDiffDto,
  type SnapshotDto,
  type SnapshotSummaryDto,
} from "./present";

/**
 * The case reads. The public ones authorise the actor once, load the case once and present it;
 * the helpers above them (rows and DTO parts, unauthorised) are for this folder's commands and
 * are not exported from ./index.
 */

// ---------------------------------------------------------------- helpers (rows, for ./commands)

/** Load a case of the actor's team (404 otherwise); the caller has checked the actor's permission. */
export async function caseFor(me: Actor, id: number, transaction?: Transaction): Promise<Case> {
  const row = await models().Case.findByPk(id, { transaction });
  if (!row) throw notFound("Case");
  requireSameTeam(me, row.teamId, "Case");
  return row;
}

async function namesOf(ids: (number | null | undefined)[], transaction?: Transaction): Promise<Map<number, string>> {
  const wanted = [...new Set(ids.filter((x): x is number => typeof x === "number"))];
  if (wanted.length === 0) return new Map();
  const users = await models().User.findAll({ where: { id: { [Op.in]: wanted } }, transaction });
  return new Map(users.map((u) => [u.id, u.name]));
}

const nameIn = (names: Names, id: number) => names.get(id) ?? "—";

async function summaries(rows: Case[]): Promise<CaseSummaryDto[]> {
  const names = await namesOf(rows.map((r) => r.authorId));
  const latest = new Map<number, number>();
  if (rows.length) {
    const snaps = await models().CaseSnapshot.findAll({ where: { caseId: { [Op.in]: rows.map((r) => r.id) } }, attributes: ["caseId", "revision"] });
    for (const s of snaps) latest.set(s.caseId, Math.max(latest.get(s.caseId) ?? 0, s.revision));
  }
  return rows.map((r) => presentSummary(r, nameIn(names, r.authorId), latest.get(r.id) ?? null));
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
  return snaps.map((s) =>
    presentSnapshotSummary(
      s,
      reviews.find((r) => r.snapshotId === s.id),
      names,
    ),
  );
}

async function commentsOf(caseId: number): Promise<CommentDto[]> {
  const { Comment, CaseSnapshot } = models();
  const rows = await Comment.findAll({ where: { caseId }, order: [["id", "ASC"]] });
  const snaps = await CaseSnapshot.findAll({ where: { caseId }, attributes: ["id", "revision"] });
  const names = await namesOf(rows.map((r) => r.authorId));
  return rows.map((c) => presentComment(c, nameIn(names, c.authorId), c.snapshotId ? (snaps.find((s) => s.id === c.snapshotId)?.revision ?? null) : null));
}

/** The pins a stored case shows: every term's and the equilibrium's extra species'; none when one no longer loads. */
const casePins = (row: Case, transaction?: Transaction): Promise<PinnedVersion[]> =>
  loadPins(row.teamId, pinTerms(row.inputs), { allowAny: true, transaction }).catch(() => [] as PinnedVersion[]);

/**
 * The case page's DTO for a row the caller has loaded and authorised: loads what sits beside
 * the row (names, pins, snapshots, newer versions, comments), except the parts the caller
 * already holds.
 */
export async function caseView(me: Actor, row: Case, known: Partial<CaseParts> = {}): Promise<CaseDto> {
  const pins = known.pins ?? (await casePins(row));
  const authorName = known.authorName ?? nameIn(await namesOf([row.authorId]), row.authorId);
  const snapshots = known.snapshots ?? (await snapshotSummaries(row.id));
  const latestRevision = known.latestRevision !== undefined ? known.latestRevision : (snapshots.at(-1)?.revision ?? null);
  const newerVersions = known.newerVersions ?? (await newerApprovedVersions(pins));
  const comments = known.comments ?? (await commentsOf(row.id));
  return presentCase(me, row, { authorName, latestRevision, pins, snapshots, newerVersions, comments });
}

/** The request with the critical constants of unpinned (inert) feed species looked up, for a real-gas equilibrium. */
export async function requestFor(teamId: number, inputs: CaseInputs, pins: readonly PinnedVersion[], transaction?: Transaction): Promise<EvaluateRequest> {
  const eq = inputs.equilibrium;
  if (eq?.gas !== "peng-robinson") return buildRequest(inputs, pins);
  const pinned = new Set(pins.map((p) => p.key));
  return buildRequest(
    inputs,
    pins,
    await inertCriticalConstants(
      teamId,
      Object.keys(eq.feed).filter((k) => !pinned.has(k)),
      transaction,
    ),
  );
}

async function snapshotOf(caseId: number, revision: number): Promise<CaseSnapshot> {
  const s = await models().CaseSnapshot.findOne({ where: { caseId, revision } });
  if (!s) throw notFound("Snapshot");
  return s;
}

// ---------------------------------------------------------------- reads

export async function listCases(actor: Actor | null, filter: { status?: CaseStatus; mine?: boolean; excludeMine?: boolean; limit?: number } = {}): Promise<CaseSummaryDto[]> {
  const me = requirePermission(actor, "cases.view");
  const where: Record<string, unknown> = { teamId: me.teamId };
  if (filter.status) where.status = filter.status;
  if (filter.mine) where.authorId = me.userId;
  if (filter.excludeMine) where.authorId = { [Op.ne]: me.userId };
  const rows = await models().Case.findAll({
    where,
    order: [
      ["updatedAt", "DESC"],
      ["id", "DESC"],
    ],
    limit: filter.limit ?? 500,
  });
  return summaries(rows);
}

export async function getCase(actor: Actor | null, id: number): Promise<CaseDto> {
  const me = requirePermission(actor, "cases.view");
  return caseView(me, await caseFor(me, id));
}

export async function listComments(actor: Actor | null, caseId: number): Promise<CommentDto[]> {
  const me = requirePermission(actor, "cases.view");
  await caseFor(me, caseId);
  return commentsOf(caseId);
}

export async function listSnapshots(actor: Actor | null, caseId: number): Promise<SnapshotSummaryDto[]> {
  const me = requirePermission(actor, "cases.view");
  await caseFor(me, caseId);
  return snapshotSummaries(caseId);
}

export async function getSnapshot(actor: Actor | null, caseId: number, revision: number): Promise<SnapshotDto> {
  const me = requirePermission(actor, "cases.view");
  await caseFor(me, caseId);
  const s = await snapshotOf(caseId, revision);
  const review = await models().Review.findOne({ where: { caseId, snapshotId: s.id }, order: [["id", "ASC"]] });
  const names = await namesOf([s.createdById, review?.reviewerId]);
  return presentSnapshot(s, presentSnapshotSummary(s, review ?? undefined, names));
}

/**
 * Results of a case. A submitted or approved case answers with its latest stored
 * snapshot and is never recomputed; a draft or returned case is evaluated now from
 * its pinned versions. `revision` picks one stored snapshot.
 */
export async function getResults(actor: Actor | null, caseId: number, revision?: number): Promise<ResultsDto> {
  const me = requirePermission(actor, "cases.view");
  const row = await caseFor(me, caseId);
  // Read and parsed once per process (lib/services/results-cache.ts); a draft is evaluated below.
  const snap = revision !== undefined || !EDITABLE.includes(row.status) ? await frozenSnapshot(row.teamId, caseId, revision) : null;
  if (snap) return presentSnapshotResults(row, snap);
  requirePermission(me, "evaluate.run");
  const pins = await loadPins(row.teamId, pinTerms(row.inputs), { allowAny: true });
  const request = await requestFor(row.teamId, row.inputs, pins);
  const result = await runEngine(request);
  return presentLiveResults(row, pins, request, result);
}

export async function exportCsv(actor: Actor | null, caseId: number, revision?: number, unit: DisplayUnit = "K"): Promise<{ filename: string; csv: string }> {
  const results = await getResults(actor, caseId, revision);
  const slug =
    results.title
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, "-")
      .replace(/^-|-$/g, "")
      .slice(0, 60) || "case";
  const suffix = (results.revision ? `-r${results.revision}` : "-draft") + (unit === "K" ? "" : `-${unit}`);
  return { filename: `heatpath-case-${caseId}-${slug}${suffix}.csv`, csv: resultCsv(results.result, unit) };
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
