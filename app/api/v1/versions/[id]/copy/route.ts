import { getActor } from "@/lib/auth/session";
import { json, withId } from "@/lib/http";
import { copyReferenceVersion } from "@/lib/services/library";

/** Copy a reference version into a team model as a draft. */
export const POST = withId(async (_request, id) => json({ version: await copyReferenceVersion(await getActor(), id) }, 201));
