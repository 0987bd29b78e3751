import { getActor } from "@/lib/auth/session";
import { json, withId } from "@/lib/http";
import { getModel } from "@/lib/services/library";

export const GET = withId(async (_request, id) => json({ model: await getModel(await getActor(), id) }));
