import "server-only";
import { Op } from "sequelize";
import { requirePermission, requireSameTeam, type Actor } from "@/lib/auth/guards";
import { models } from "@/lib/db";
import { notFound } from "@/lib/errors";
import type { CaseStatus, Decision } from "@/lib/validation/cases";

/** One pinned version as the sign-off record states it: what was frozen and who approved it. */
export type SignOffPinDto = {
  key: string;
  modelName: string;
  versionNumber: number;
  /** The version's status when the snapshot was frozen. */
  statusAtFreeze: string;
  /** Published reference versions are not approved inside a team. */
  scope: "reference" | "team";
  approverName: string | null;
  approvedAt: string | null;
};

/** Who did what to one frozen revision: the printed report's sign-off block. */
export type SignOffDto = {
  caseId: number;
  caseStatus: CaseStatus;
  authorName: string;
  revision: number;
  submittedByName: string;
  frozenAt: string;
  hash: string;
  engineVersion: string;
  decision: { decision: Decision; reason: string | null; reviewerName: string; at: string } | null;
  pins: SignOffPinDto[];
};

/** The sign-off record of one revision (the latest without `revision`); null when the case has no snapshot yet. */
export async function signOffRecord(actor: Actor | null, caseId: number, revision?: number): Promise<SignOffDto | null> {
  const me = requirePermission(actor, "cases.view");
  const { Case, CaseSnapshot, Review, ModelVersion, User } = models();
  const row = await Case.findByPk(caseId);
  if (!row) throw notFound("Case");
  requireSameTeam(me, row.teamId, "Case");
  const snap = await CaseSnapshot.findOne({ where: revision === undefined ? { caseId } : { caseId, revision }, order: [["revision", "DESC"]] });
  if (!snap) return null;
  const review = await Review.findOne({ where: { snapshotId: snap.id }, order: [["id", "DESC"]] });
  const versions = await ModelVersion.findAll({
    where: { id: { [Op.in]: snap.pins.map((p) => p.versionId) } },
    attributes: ["id", "teamId", "decidedById", "decidedAt", "status"],
  });
  const userIds = [row.authorId, snap.createdById, review?.reviewerId, ...versions.map((v) => v.decidedById)].filter((x): x is number => typeof x === "number");
  const users = await User.findAll({ where: { id: { [Op.in]: [...new Set(userIds)] } }, attributes: ["id", "name"] });
  const name = (id: number | null | undefined) => users.find((u) => u.id === id)?.name ?? null;
  return {
    caseId,
    caseStatus: row.status,
    authorName: name(row.authorId) ?? "—",
    revision: snap.revision,
    submittedByName: name(snap.createdById) ?? "—",
    frozenAt: snap.createdAt.toISOString(),
    hash: snap.hash,
    engineVersion: snap.engineVersion,
    decision: review ? { decision: review.decision, reason: review.reason, reviewerName: name(review.reviewerId) ?? "—", at: review.createdAt.toISOString() } : null,
    pins: snap.pins.map((p) => {
      const v = versions.find((x) => x.id === p.versionId);
      const decided = v && (v.status === "approved" || v.status === "superseded");
      return {
        key: p.key,
        modelName: p.modelName,
        versionNumber: p.versionNumber,
        statusAtFreeze: p.status,
        scope: v?.teamId == null ? "reference" : "team",
        approverName: decided ? name(v.decidedById) : null,
        approvedAt: decided && v.decidedAt ? v.decidedAt.toISOString() : null,
      };
    }),
  };
}
