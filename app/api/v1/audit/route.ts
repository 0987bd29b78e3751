import { getActor } from "@/lib/auth/session";
import { json, parseWith, queryObject, route } from "@/lib/http";
import { listAudit } from "@/lib/services/audit";
import { auditFilterOf, auditQuerySchema } from "@/lib/validation/audit";

/** The team's audit trail, newest first: `?entityType=case&entityId=12&actorId=3&action=case.approved&limit=50&beforeId=…`. */
export const GET = route(async (request) => json({ events: await listAudit(await getActor(), auditFilterOf(parseWith(auditQuerySchema, queryObject(request)))) }));
