import { getActor } from "@/lib/auth/session";
import { json, parseWith, route } from "@/lib/http";
import { getDataset } from "@/lib/services/datasets";
import { idParamSchema } from "@/lib/validation/library";

type Context = { params: Promise<{ id: string }> };

export const GET = route<Context>(async (_request, { params }) => json({ dataset: await getDataset(await getActor(), parseWith(idParamSchema, (await params).id)) }));
