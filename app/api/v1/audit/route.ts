import { getActor } from "@/lib/auth/session";
import { json, route } from "@/lib/http";
import { listAudit } from "@/lib/services/audit";

export const GET = route(async () => json({ events: await listAudit(await getActor()) }));
