import { getActor } from "@/lib/auth/session";
import { json, parseWith, route } from "@/lib/http";
import { listSnapshots } from "@/lib/services/cases";
import { idParamSchema } from "@/lib/validation/team";

type Context = { params: Promise<{ id: string }> };

export const GET = route<Context>(async (_request, { params }) =>
  json({ snapshots: await listSnapshots(await getActor(), parseWith(idParamSchema, (await params).id)) }),
);
