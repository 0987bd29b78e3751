/** The audit trail's filters, shared by the /audit screen and GET /api/v1/audit. zod only. */
import { z } from "zod";
import { strictObject } from "./strict";

const token = (what: string) =>
  z
    .string()
    .trim()
    .max(60, `Use at most 60 characters for the ${what}.`)
    .regex(/^[a-z0-9.-]*$/i, { error: `Use letters, digits, dots and dashes for the ${what}.` });

export const auditQuerySchema = strictObject({
  /** A record type (case, model-version, membership, …). */
  entityType: token("record type").optional(),
  /** One record's id; with entityType. */
  entityId: z.string().trim().max(40, "Use at most 40 characters for the record id.").regex(/^\d*$/, { error: "A record id is a whole number." }).optional(),
  actorId: z.union([z.literal(""), z.coerce.number().int().positive({ error: "Pick a person." })]).optional(),
  action: token("action").optional(),
  beforeId: z.coerce.number().int().positive().optional(),
  limit: z.coerce.number().int().min(1).max(200, "At most 200 events a page.").optional(),
});
export type AuditQuery = z.infer<typeof auditQuerySchema>;

/** The filter the service takes: empty strings mean "any". */
export function auditFilterOf(q: AuditQuery) {
  return {
    entityType: q.entityType || undefined,
    entityId: q.entityId || undefined,
    actorId: typeof q.actorId === "number" ? q.actorId : undefined,
    action: q.action || undefined,
    beforeId: q.beforeId,
    limit: q.limit,
  };
}
