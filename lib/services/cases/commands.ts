import "server-only";
import { Op, type Transaction } from "sequelize";
import { requirePermission, type Actor } from "@/lib/auth/guards";
import { termKey } from "@/lib/cases/balance";
import { cautionGasOf, cautionText } from "@/lib/cases/caution";
import { pinTerms } from "@/lib/cases/equilibrium";
import { caseReaction } from "@/lib/cases/request";
import { snapshotContent, snapshotHash } from "@/lib/cases/snapshot";
import { db, models } from "@/lib/db";
import { runEngine } from "@/lib/engine-pool";
import { env } from "@/lib/env";
import { AppError, conflict, notFound } from "@/lib/errors";
import { validationError } from "@/lib/http";
import type { EvaluateRequest, EvaluateResult } from "@/lib/thermo";
import { caseInputSchema, type CaseInput, type CaseInputs, type CaseStatus, type CaseUpdate, type CommentInput } from "@/lib/validation/cases";
import type { Case } from "@/models/case";
import type { CaseSnapshot, PinnedVersion } from "@/models/case-snapshot";
import { recordAudit } from "../audit";
import { enqueueMail, enqueueMailToRoles } from "../mail";
import { loadPins, newerApprovedVersions } from "../pins";
import { caseInputOf, EDITABLE, presentComment, type CaseDto, type CommentDto } from "./present";
import { caseFor, caseView, requestFor } from "./queries";

/**
 * The case writes. Each authorises the actor once (the permission table in
 * lib/auth/permissions.ts), loads the case once, and presents the row it wrote.
 */

// ---------------------------------------------------------------- helpers

function requireAuthor(me: Actor, row: Case, what: string): void {
  if (row.authorId !== me.userId) throw new AppError(403, "not-author", `Only the case's author may ${what}.`);
}

function checkLock(row: Case, lockVersion: number): void {
  if (row.lockVersion !== lockVersion) {
    throw conflict("Someone changed this case after you loaded it; reload to see their changes.", { lockVersion: row.lockVersion });
  }
}

/**
 * Write `changes` and the next lockVersion only while the stored case still has the
 * lockVersion (and, with `statuses`, a status among them) that was checked on the loaded row:
 * a command that evaluates outside its transaction re-checks here, in the write itself,
 * instead of loading the case again. Then the loaded row carries the written values.
 * Otherwise 409, worded as the first check would have been.
 */
async function writeIfUnmoved(transaction: Transaction, row: Case, changes: Partial<Pick<Case, "status" | "inputs">>, statuses?: readonly CaseStatus[]): Promise<void> {
  const { Case } = models();
  const values = { ...changes, lockVersion: row.lockVersion + 1, updatedAt: new Date() };
  const where = { id: row.id, lockVersion: row.lockVersion, ...(statuses ? { status: { [Op.in]: [...statuses] } } : {}) };
  const [written] = await Case.update(values, { where, transaction, silent: true });
  if (written !== 1) {
    const now = await Case.findByPk(row.id, { transaction });
    if (!now) throw notFound("Case");
    if (statuses && !statuses.includes(now.status)) throw conflict(`This case is already ${now.status}.`);
    checkLock(now, row.lockVersion);
    throw conflict("Someone changed this case after you loaded it; reload to see their changes.", { lockVersion: now.lockVersion });
  }
  row.set(values, { raw: true });
}

const caseInputsOf = (input: CaseInput): CaseInputs => ({
  terms: input.terms,
  temperatures: input.temperatures,
  referenceK: input.referenceK,
  toleranceKJ: input.toleranceKJ,
  toleranceKFactor: input.toleranceKFactor,
  equilibrium: input.equilibrium ?? null,
});

/**
 * A PATCH changes what its body names and keeps the rest as stored (the equilibrium feed
 * the builder does not show, for one); the merged case is checked as a whole.
 */
function mergeUpdate(row: Case, input: CaseUpdate): CaseInput {
  const { lockVersion: _lock, ...named } = input;
  const given = Object.fromEntries(Object.entries(named).filter(([, v]) => v !== undefined));
  const parsed = caseInputSchema.safeParse({ ...caseInputOf(row), ...given });
  if (!parsed.success) throw validationError(parsed.error);
  return parsed.data;
}

/** Freeze a snapshot of the case as it is now; the caller holds the transaction. */
async function freezeSnapshot(transaction: Transaction, me: Actor, row: Case, pins: PinnedVersion[], request: EvaluateRequest, result: EvaluateResult): Promise<CaseSnapshot> {
  const { CaseSnapshot } = models();
  const last = await CaseSnapshot.max<number, CaseSnapshot>("revision", { where: { caseId: row.id }, transaction });
  const content = snapshotContent({ inputs: caseInputOf(row), pins, request, result });
  return CaseSnapshot.create({ caseId: row.id, teamId: row.teamId, revision: (last ?? 0) + 1, ...content, hash: snapshotHash(content), createdById: me.userId }, { transaction });
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

/** The pins as they stand in the transaction, refused (409) when a pinned version's data moved during the evaluation. */
async function assertPinsUnchanged(teamId: number, inputs: CaseInputs, pins: PinnedVersion[], transaction: Transaction): Promise<PinnedVersion[]> {
  const now = await loadPins(teamId, pinTerms(inputs), { transaction, allowAny: true });
  if (JSON.stringify(now.map((p) => p.data)) !== JSON.stringify(pins.map((p) => p.data))) {
    throw conflict("A pinned model version changed while the case was being evaluated; submit again.");
  }
  return now;
}

// ---------------------------------------------------------------- writes

export async function createCase(actor: Actor | null, input: CaseInput): Promise<CaseDto> {
  const me = requirePermission(actor, "cases.create");
  const row = await db().transaction(async (transaction) => {
    await loadPins(me.teamId, input.terms, { transaction });
    const created = await models().Case.create(
      { teamId: me.teamId, authorId: me.userId, title: input.title, notes: input.notes || null, status: "draft", inputs: caseInputsOf(input) },
      { transaction },
    );
    await recordAudit(transaction, {
      action: "case.created",
      entityType: "case",
      entityId: created.id,
      teamId: me.teamId,
      actorId: me.userId,
      after: { title: created.title, inputs: created.inputs },
    });
    return created;
  });
  return caseView(me, row, { authorName: me.name, latestRevision: null, snapshots: [], comments: [] });
}

export async function updateCase(actor: Actor | null, id: number, input: CaseUpdate): Promise<CaseDto> {
  const me = requirePermission(actor, "cases.create");
  const row = await db().transaction(async (transaction) => {
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
    return row;
  });
  return caseView(me, row, { authorName: me.name });
}

export async function submitCase(actor: Actor | null, id: number, lockVersion: number): Promise<CaseDto> {
  const me = requirePermission(actor, "cases.submit");
  const row = await caseFor(me, id);
  requireAuthor(me, row, "submit it");
  if (!EDITABLE.includes(row.status)) throw conflict(`This case is already ${row.status}.`);
  checkLock(row, lockVersion);
  const run = await prepareRun(row.teamId, row.inputs);
  const before = row.status;
  const pins = await db().transaction(async (transaction) => {
    await writeIfUnmoved(transaction, row, { status: "submitted" }, EDITABLE);
    const pins = await assertPinsUnchanged(row.teamId, row.inputs, run.pins, transaction);
    const snap = await freezeSnapshot(transaction, me, row, run.pins, run.request, run.result);
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
    return pins;
  });
  return caseView(me, row, { authorName: me.name, pins });
}

/**
 * Move every pin with a newer approved version onto it. An approved case is re-run into
 * a new revision at once and goes back for review; a draft or returned case is re-pinned
 * and stays editable.
 */
export async function rerunWithNewerVersions(actor: Actor | null, id: number, lockVersion: number): Promise<CaseDto> {
  const me = requirePermission(actor, "cases.submit");
  const row = await caseFor(me, id);
  requireAuthor(me, row, "re-run it");
  if (row.status === "submitted") throw conflict("This case is awaiting review; wait for the decision before re-running it.");
  checkLock(row, lockVersion);
  const current = await loadPins(row.teamId, pinTerms(row.inputs), { allowAny: true });
  const newer = await newerApprovedVersions(current);
  if (newer.length === 0) throw conflict("Every pinned model version is already the newest approved one.");
  const swap = new Map(newer.map((n) => [n.pinnedVersionId, n.newerVersionId]));
  const inputs: CaseInputs = { ...row.inputs, terms: row.inputs.terms.map((t) => ({ ...t, versionId: swap.get(t.versionId) ?? t.versionId })) };
  if (row.inputs.equilibrium) {
    inputs.equilibrium = {
      ...row.inputs.equilibrium,
      extraTerms: row.inputs.equilibrium.extraTerms.map((t) => ({ ...t, versionId: swap.get(t.versionId) ?? t.versionId })),
    };
  }
  const resubmit = row.status === "approved";
  const run = resubmit ? await prepareRun(row.teamId, inputs) : null;
  const before = { status: row.status, inputs: row.inputs };
  const pins = await db().transaction(async (transaction) => {
    await writeIfUnmoved(transaction, row, { inputs, ...(resubmit ? { status: "submitted" as const } : {}) });
    let snap: CaseSnapshot | null = null;
    let pins: PinnedVersion[] | undefined;
    if (run) {
      pins = await assertPinsUnchanged(row.teamId, inputs, run.pins, transaction);
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
    return pins;
  });
  return caseView(me, row, { authorName: me.name, pins });
}

/**
 * A comment is mailed to the case's author; when the author replies, to the reviewers who
 * decided the case and everyone else who commented on it. Queued in the comment's transaction.
 */
async function mailComment(transaction: Transaction, me: Actor, row: Case, input: CommentInput): Promise<void> {
  const { Comment, Membership, Review, User } = models();
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
  const members = await Membership.findAll({ where: { teamId: row.teamId, userId: { [Op.in]: wanted } }, attributes: ["userId"], transaction });
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
  const comment = await db().transaction(async (transaction) => {
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
    return c;
  });
  return presentComment(comment, me.name, input.revision ?? null);
}
