import { getActor } from "@/lib/auth/session";
import { json, route } from "@/lib/http";
import { listMembers } from "@/lib/services/team";

export const GET = route(async () => json({ members: await listMembers(await getActor()) }));
