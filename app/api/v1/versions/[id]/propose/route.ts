import { getActor } from "@/lib/auth/session";
import { json, withId } from "@/lib/http";
import { proposeVersion } from "@/lib/services/library";

export const POST = withId(async (_request, id) => json({ version: await proposeVersion(await getActor(), id) }));
