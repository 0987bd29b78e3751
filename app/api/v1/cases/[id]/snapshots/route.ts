import { getActor } from "@/lib/auth/session";
import { json, withId } from "@/lib/http";
import { listSnapshots } from "@/lib/services/cases";

export const GET = withId(async (_request, id) => json({ snapshots: await listSnapshots(await getActor(), id) }));
