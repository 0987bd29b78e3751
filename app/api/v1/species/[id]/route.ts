import { getActor } from "@/lib/auth/session";
import { json, parseWith, route } from "@/lib/http";
import { getSpecies } from "@/lib/services/library";
import { idParamSchema } from "@/lib/validation/library";

type Context = { params: Promise<{ id: string }> };

export const GET = route<Context>(async (_request, { params }) => json({ species: await getSpecies(await getActor(), parseWith(idParamSchema, (await params).id)) }));
