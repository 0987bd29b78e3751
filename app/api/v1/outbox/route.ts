import { getActor } from "@/lib/auth/session";
import { json, route } from "@/lib/http";
import { listOutbox } from "@/lib/services/mail";

export const GET = route(async () => json(await listOutbox(await getActor())));
