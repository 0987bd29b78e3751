import { getActor } from "@/lib/auth/session";
import { json, withId } from "@/lib/http";
import { versionAudit } from "@/lib/services/library";

export const GET = withId(async (_request, id) => json({ events: await versionAudit(await getActor(), id) }));
