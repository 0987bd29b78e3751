import "server-only";
import { Op } from "sequelize";
import { requireNotAuthor, requirePermission, requireSameTeam, type Actor } from "@/lib/auth/guards";
import { can } from "@/lib/auth/permissions";
import { db, models } from "@/lib/db";
import { env } from "@/lib/env";
import { AppError, conflict, notFound } from "@/lib/errors";
import type { DecisionInput } from "@/lib/validation/cases";
import { recordAudit } from "./audit";
import { caseReaction } from "@/lib/cases/request";
import { listCases, type CaseDto, type CaseSummaryDto } from "./cases";
import { caseView } from "./cases/queries";
import { contributedVersionIds } from "./library/rows";
import { enqueueMail } from "./mail";
import { cautionGasOfInputs, cautionText } from "@/lib/cases/caution";

export type ReviewDto = { id: number; revision: number; decision: "approved" | "returned"; reason: string | null; reviewerName: string; at: string };
export type DecisionSummaryDto = ReviewDto & { caseId: number; caseTitle: string; authorName: string };

/** Submitted cases of the team that the actor may decide: everyone's but their own. */
export async function reviewQueue(actor: Actor | null): Promise<CaseSummaryDto[]> {
  const me = requirePermission(actor, "cases.review");
  const rows = await listCases(me, { status: "submitted", excludeMine: true });
  return rows.sort((a, b) => a.updatedAt.localeCompare(b.updatedAt));
}

export async function listReviews(actor: Actor | null, caseId: number): Promise<ReviewDto[]> {
  const me = requirePermission(actor, "cases.view");
  const { Case, Review, CaseSnapshot, User } = models();
  const row = await Case.findByPk(caseId);
  if (!row) throw notFound("Case");
  requireSameTeam(me, row.teamId, "Case");
  const reviews = await Review.findAll({ where: { caseId }, order: [["id", "ASC"]] });
  const snaps = await CaseSnapshot.findAll({ where: { caseId }, attributes: ["id", "revision"] });
  const users = await User.findAll({ where: { id: { [Op.in]: reviews.map((r) => r.reviewerId) } } });
  return reviews.map((r) => ({
    id: r.id,
    revision: snaps.find((s) => s.id === r.snapshotId)?.revision ?? 0,
    decision: r.decision,
    reason: r.reason,
    reviewerName: users.find((u) => u.id === r.reviewerId)?.name ?? "—",
    at: r.createdAt.toISOString(),
  }));
}

/**
 * Approve or return the latest snapshot of a submitted case. Four-eyes: the author
 * cannot decide their own case. A return needs a reason; the author is told by mail.
 */
export async function decideCase(actor: Actor | null, caseId: number, input: DecisionInput): Promise<CaseDto> {
  const me = requirePermission(actor, "cases.review");
  const { Case, CaseSnapshot, Review, User } = models();
  const decided = await db().transaction(async (transaction) => {
    const row = await Case.findByPk(caseId, { transaction });
    if (!row) throw notFound("Case");
    requireSameTeam(me, row.teamId, "Case");
    requireNotAuthor(me, row.authorId, "Nobody reviews their own case: another reviewer must decide it.");
    if (row.status !== "submitted") throw conflict(`This case is ${row.status}, not awaiting review.`);
    const snap = await CaseSnapshot.findOne({ where: { caseId }, order: [["revision", "DESC"]], attributes: ["id", "revision", "hash"], transaction });
    if (!snap) throw new AppError(409, "conflict", "This case has no snapshot to review.");
    if (input.revision !== undefined && input.revision !== snap.revision) {
      throw conflict(`You reviewed revision ${input.revision}, but revision ${snap.revision} is the one awaiting review; reload.`, { revision: snap.revision });
    }
    const reason = input.reason.trim() || null;
    await Review.create({ caseId, snapshotId: snap.id, reviewerId: me.userId, decision: input.decision, reason }, { transaction });
    await row.update({ status: input.decision, lockVersion: row.lockVersion + 1 }, { transaction });
    await recordAudit(transaction, {
      action: input.decision === "approved" ? "case.approved" : "case.returned",
      entityType: "case",
      entityId: row.id,
      teamId: row.teamId,
      actorId: me.userId,
      before: { status: "submitted" },
      after: { status: input.decision, revision: snap.revision, hash: snap.hash, reason },
    });
    const author = await User.findByPk(row.authorId, { transaction });
    if (author) {
      const word = input.decision === "approved" ? "approved" : "returned";
      await enqueueMail(transaction, {
        to: author.email,
        teamId: row.teamId,
        kind: "review-decided",
        subject: `Case ${word}: ${row.title} (revision ${snap.revision})`,
        text: [
          `${me.name} ${word} "${row.title}", revision ${snap.revision}.`,
          ``,
          `Reaction: ${caseReaction(row.inputs)}`,
          reason ? `Reason: ${reason}` : `No reason given.`,
          ``,
          `Open the case: ${env.APP_URL.replace(/\/$/, "")}/cases/${row.id}`,
          ``,
          cautionText(cautionGasOfInputs(row.inputs)),
        ].join("\n"),
      });
    }
    return row;
  });
  return caseView(me, decided);
}

/** Recent decisions in the team, newest first. */
export async function recentDecisions(actor: Actor | null, limit = 5): Promise<{ count30d: number; items: DecisionSummaryDto[] }> {
  const me = requirePermission(actor, "cases.view");
  const { Case, Review, CaseSnapshot, User } = models();
  const cases = await Case.findAll({ where: { teamId: me.teamId }, attributes: ["id", "title", "authorId"] });
  if (cases.length === 0) return { count30d: 0, items: [] };
  const ids = cases.map((c) => c.id);
  const since = new Date(Date.now() - 30 * 86_400_000);
  const count30d = await Review.count({ where: { caseId: { [Op.in]: ids }, createdAt: { [Op.gte]: since } } });
  const reviews = await Review.findAll({ where: { caseId: { [Op.in]: ids } }, order: [["id", "DESC"]], limit });
  const snaps = await CaseSnapshot.findAll({ where: { id: { [Op.in]: reviews.map((r) => r.snapshotId) } }, attributes: ["id", "revision"] });
  const users = await User.findAll({ where: { id: { [Op.in]: [...reviews.map((r) => r.reviewerId), ...cases.map((c) => c.authorId)] } } });
  const name = (id: number) => users.find((u) => u.id === id)?.name ?? "—";
  return {
    count30d,
    items: reviews.map((r) => {
      const c = cases.find((x) => x.id === r.caseId)!;
      return {
        id: r.id,
        caseId: c.id,
        caseTitle: c.title,
        authorName: name(c.authorId),
        revision: snaps.find((s) => s.id === r.snapshotId)?.revision ?? 0,
        decision: r.decision,
        reason: r.reason,
        reviewerName: name(r.reviewerId),
        at: r.createdAt.toISOString(),
      };
    }),
  };
}

/** A proposed model version waiting for the actor's approval. */
export type ProposalSummaryDto = { versionId: number; versionNumber: number; modelName: string; formula: string; authorName: string | null; proposedAt: string | null };

/** What waits for the actor, for the home page. */
export async function homeCounts(actor: Actor | null) {
  const me = requirePermission(actor, "cases.view");
  const drafts = can(me.role, "cases.create") ? (await listCases(me, { mine: true })).filter((c) => c.status === "draft" || c.status === "returned") : [];
  const reviews = can(me.role, "cases.review") ? await reviewQueue(me) : [];
  let proposals = 0;
  let proposalItems: ProposalSummaryDto[] = [];
  if (can(me.role, "models.decide")) {
    // Colleagues' proposals only: nobody decides work they contributed to (four-eyes).
    const rows = await models().ModelVersion.findAll({
      where: {
        teamId: me.teamId,
        status: "proposed",
        id: { [Op.notIn]: await contributedVersionIds(me.userId) },
        [Op.or]: [{ authorId: null }, { authorId: { [Op.ne]: me.userId } }],
      },
      include: [{ model: models().CpModel, as: "model", include: [{ model: models().Species, as: "species" }] }],
      order: [
        ["proposedAt", "ASC"],
        ["id", "ASC"],
      ],
    });
    proposals = rows.length;
    const authors = await models().User.findAll({ where: { id: { [Op.in]: rows.map((r) => r.authorId).filter((x): x is number => x != null) } }, attributes: ["id", "name"] });
    proposalItems = rows.map((v) => ({
      versionId: v.id,
      versionNumber: v.versionNumber,
      modelName: v.model?.name ?? "—",
      formula: v.model?.species?.formula ?? "",
      authorName: authors.find((u) => u.id === v.authorId)?.name ?? null,
      proposedAt: v.proposedAt ? v.proposedAt.toISOString() : null,
    }));
  }
  return { drafts, reviews, proposals, proposalItems, decisions: await recentDecisions(me) };
}
