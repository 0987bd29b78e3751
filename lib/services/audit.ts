import "server-only";
import type { Transaction } from "sequelize";
import type { Actor } from "@/lib/auth/guards";
import { requirePermission } from "@/lib/auth/guards";
import { models } from "@/lib/db";

export type AuditInput = {
  action: string;
  entityType: string;
  entityId: string | number;
  teamId?: number | null;
  actorId?: number | null;
  before?: unknown;
  after?: unknown;
};

/** Write one audit event inside the caller's transaction. */
export async function recordAudit(transaction: Transaction, input: AuditInput): Promise<void> {
  await models().AuditEvent.create(
    {
      action: input.action,
      entityType: input.entityType,
      entityId: String(input.entityId),
      teamId: input.teamId ?? null,
      actorId: input.actorId ?? null,
      before: input.before ?? null,
      after: input.after ?? null,
    },
    { transaction },
  );
}

export type AuditEventDto = {
  id: number;
  action: string;
  entityType: string;
  entityId: string;
  actorName: string | null;
  before: unknown;
  after: unknown;
  at: string;
};

export async function listAudit(actor: Actor | null, limit = 50): Promise<AuditEventDto[]> {
  const me = requirePermission(actor, "audit.view");
  const { AuditEvent, User } = models();
  const rows = await AuditEvent.findAll({
    where: { teamId: me.teamId },
    order: [["id", "DESC"]],
    limit,
  });
  const names = new Map(
    (await User.findAll({ where: { id: [...new Set(rows.map((r) => r.actorId).filter((x): x is number => x != null))] } })).map(
      (u) => [u.id, u.name],
    ),
  );
  return rows.map((r) => ({
    id: r.id,
    action: r.action,
    entityType: r.entityType,
    entityId: r.entityId,
    actorName: r.actorId != null ? (names.get(r.actorId) ?? null) : null,
    before: r.before,
    after: r.after,
    at: r.createdAt.toISOString(),
  }));
}
