import { requireUser } from "@/lib/auth/guards";
import { getActor } from "@/lib/auth/session";
import { json, route } from "@/lib/http";
import { toMe } from "@/lib/services/auth";

export const GET = route(async () => json(toMe(requireUser(await getActor()))));
