import { getActor } from "@/lib/auth/session";
import { json, parseWith, route } from "@/lib/http";
import { proposeVersion } from "@/lib/services/library";
import { idParamSchema } from "@/lib/validation/library";

type Context = { params: Promise<{ id: string }> };

export const POST = route<Context>(async (_request, { params }) => json({ version: await proposeVersion(await getActor(), parseWith(idParamSchema, (await params).id)) }));
