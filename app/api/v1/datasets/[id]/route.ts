import { getActor } from "@/lib/auth/session";
import { json, withId } from "@/lib/http";
import { getDataset } from "@/lib/services/datasets";

export const GET = withId(async (_request, id) => json({ dataset: await getDataset(await getActor(), id) }));
