import { getActor } from "@/lib/auth/session";
import { json, parseWith, route } from "@/lib/http";
import { copyReferenceVersion } from "@/lib/services/library";
import { idParamSchema } from "@/lib/validation/library";

type Context = { params: Promise<{ id: string }> };

/** Copy a reference version into a team model as a draft. */
export const POST = route<Context>(async (_request, { params }) => json({ version: await copyReferenceVersion(await getActor(), parseWith(idParamSchema, (await params).id)) }, 201));
