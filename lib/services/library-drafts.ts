import "server-only";
import { requirePermission, type Actor } from "@/lib/auth/guards";
import { can } from "@/lib/auth/permissions";
import { db, models } from "@/lib/db";
import { AppError, conflict } from "@/lib/errors";
import type { ModelVersion } from "@/models/model-version";
import { recordAudit } from "./audit";
import type { VersionDto } from "./library";
import { loadVersion, presentVersion, READ_ONLY } from "./library/rows";

/** The author may take back their own draft or proposal; anyone else's needs a steward (models.edit). */
function requireAuthorOrSteward(me: Actor, version: ModelVersion, doing: string): void {
  if (version.teamId === null) throw new AppError(403, "read-only", READ_ONLY);
  if (version.authorId !== me.userId && !can(me.role, "models.edit")) {
    throw new AppError(403, "forbidden", `Only the author or a steward can ${doing} this version.`);
  }
}

/**
 * Withdraw a proposal: it goes back to a draft the author can edit, and leaves the
 * stewards' queue. Only a proposed version can be withdrawn.
 */
export async function withdrawProposal(actor: Actor | null, id: number): Promise<VersionDto> {
  const me = requirePermission(actor, "models.draft");
  return db().transaction(async (transaction) => {
    const version = await loadVersion(me, id, transaction);
    requireAuthorOrSteward(me, version, "withdraw");
    if (version.status !== "proposed") throw conflict(`Version ${version.versionNumber} is ${version.status}; only a proposal can be withdrawn.`);
    version.status = "draft";
    version.proposedAt = null;
    version.lockVersion += 1;
    await version.save({ transaction });
    await recordAudit(transaction, {
      action: "model-version.withdrawn",
      entityType: "model-version",
      entityId: id,
      teamId: me.teamId,
      actorId: me.userId,
      before: { status: "proposed" },
      after: { status: "draft" },
    });
    return presentVersion(version, transaction);
  });
}

/** Cases of the team that pin this version (in their reaction or their equilibrium set). */
async function casesPinning(teamId: number, versionId: number, transaction: Parameters<typeof loadVersion>[2]): Promise<{ id: number; title: string }[]> {
  const rows = await models().Case.findAll({ where: { teamId }, attributes: ["id", "title", "inputs"], transaction });
  return rows
    .filter((c) => c.inputs.terms.some((t) => t.versionId === versionId) || (c.inputs.equilibrium?.extraTerms ?? []).some((t) => t.versionId === versionId))
    .map((c) => ({ id: c.id, title: c.title }));
}

/**
 * Delete a draft or a proposal that nothing depends on. Approved, superseded and rejected
 * versions are records and stay; a version a case pins is refused (409) naming the cases.
 * A team model left without versions goes with its last one.
 */
export async function deleteVersion(actor: Actor | null, id: number): Promise<{ deleted: { versionId: number; modelId: number; modelDeleted: boolean } }> {
  const me = requirePermission(actor, "models.draft");
  const { CpModel, ModelVersion } = models();
  return db().transaction(async (transaction) => {
    const version = await loadVersion(me, id, transaction);
    requireAuthorOrSteward(me, version, "delete");
    if (version.status !== "draft" && version.status !== "proposed") {
      throw new AppError(409, "immutable", `Version ${version.versionNumber} is ${version.status}: a decided version stays on record and cannot be deleted.`);
    }
    const pinned = await casesPinning(me.teamId, id, transaction);
    if (pinned.length) {
      throw conflict(`Cases pin this version (${pinned.map((c) => `“${c.title}”`).join(", ")}); re-pin them before deleting it.`, { cases: pinned });
    }
    const before = { status: version.status, versionNumber: version.versionNumber, modelId: version.modelId, citation: version.citation };
    await ModelVersion.destroy({ where: { id }, transaction });
    await recordAudit(transaction, { action: "model-version.deleted", entityType: "model-version", entityId: id, teamId: me.teamId, actorId: me.userId, before, after: null });
    const left = await ModelVersion.count({ where: { modelId: version.modelId }, transaction });
    let modelDeleted = false;
    if (left === 0) {
      const model = await CpModel.findByPk(version.modelId, { transaction });
      if (model && model.teamId === me.teamId) {
        await recordAudit(transaction, {
          action: "cp-model.deleted",
          entityType: "cp-model",
          entityId: model.id,
          teamId: me.teamId,
          actorId: me.userId,
          before: { name: model.name },
          after: null,
        });
        await model.destroy({ transaction });
        modelDeleted = true;
      }
    }
    return { deleted: { versionId: id, modelId: version.modelId, modelDeleted } };
  });
}
