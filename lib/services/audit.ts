import "server-only";
import { Op, type Transaction, type WhereOptions } from "sequelize";
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
  actorId: number | null;
  actorName: string | null;
  before: unknown;
  after: unknown;
  at: string;
};

/** Which events to list: one record (type, optionally its id), one actor, one action; newest first. */
export type AuditFilter = { entityType?: string; entityId?: string; actorId?: number; action?: string; beforeId?: number; limit?: number };

/** The team's audit trail, newest first, filtered by record, actor or action (at most 200 a page; page on with `beforeId`). */
export async function listAudit(actor: Actor | null, filter: AuditFilter | number = {}): Promise<AuditEventDto[]> {
  const me = requirePermission(actor, "audit.view");
  const f: AuditFilter = typeof filter === "number" ? { limit: filter } : filter;
  const { AuditEvent, User } = models();
  const where: WhereOptions = { teamId: me.teamId };
  if (f.entityType) Object.assign(where, { entityType: f.entityType });
  if (f.entityId) Object.assign(where, { entityId: f.entityId });
  if (f.actorId) Object.assign(where, { actorId: f.actorId });
  if (f.action) Object.assign(where, { action: f.action });
  if (f.beforeId) Object.assign(where, { id: { [Op.lt]: f.beforeId } });
  const rows = await AuditEvent.findAll({ where, order: [["id", "DESC"]], limit: Math.min(200, Math.max(1, f.limit ?? 50)) });
  const names = new Map((await User.findAll({ where: { id: [...new Set(rows.map((r) => r.actorId).filter((x): x is number => x != null))] } })).map((u) => [u.id, u.name]));
  return rows.map((r) => ({
    id: r.id,
    action: r.action,
    entityType: r.entityType,
    entityId: r.entityId,
    actorId: r.actorId,
    actorName: r.actorId != null ? (names.get(r.actorId) ?? null) : null,
    before: r.before,
    after: r.after,
    at: r.createdAt.toISOString(),
  }));
}

/** What the filters can choose from: the team's record types, actions and actors that appear in its trail. */
export async function auditFacets(actor: Actor | null): Promise<{ entityTypes: string[]; actions: string[]; actors: { id: number; name: string }[] }> {
  const me = requirePermission(actor, "audit.view");
  const { AuditEvent, User } = models();
  const rows = await AuditEvent.findAll({ where: { teamId: me.teamId }, attributes: ["entityType", "action", "actorId"], group: ["entityType", "action", "actorId"] });
  const ids = [...new Set(rows.map((r) => r.actorId).filter((x): x is number => x != null))];
  const users = ids.length ? await User.findAll({ where: { id: ids }, attributes: ["id", "name"] }) : [];
  return {
    entityTypes: [...new Set(rows.map((r) => r.entityType))].sort(),
    actions: [...new Set(rows.map((r) => r.action))].sort(),
    actors: users.map((u) => ({ id: u.id, name: u.name })).sort((a, b) => a.name.localeCompare(b.name)),
  };
}
