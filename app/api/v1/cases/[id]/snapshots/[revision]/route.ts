import { getActor } from "@/lib/auth/session";
import { json, parseWith, withId } from "@/lib/http";
import { getSnapshot } from "@/lib/services/cases";
import { revisionParamSchema } from "@/lib/validation/cases";

export const GET = withId(async (_request, id, { revision }) => json({ snapshot: await getSnapshot(await getActor(), id, parseWith(revisionParamSchema, revision)) }));
