import { getActor } from "@/lib/auth/session";
import { json, parseWith, readJson, route } from "@/lib/http";
import { getCase, updateCase } from "@/lib/services/cases";
import { caseUpdateSchema } from "@/lib/validation/cases";
import { idParamSchema } from "@/lib/validation/team";

type Context = { params: Promise<{ id: string }> };

export const GET = route<Context>(async (_request, { params }) => json({ case: await getCase(await getActor(), parseWith(idParamSchema, (await params).id)) }));

/** Send the lockVersion you loaded; a stale edit is answered 409. */
export const PATCH = route<Context>(async (request, { params }) => {
  const actor = await getActor();
  const id = parseWith(idParamSchema, (await params).id);
  return json({ case: await updateCase(actor, id, await readJson(request, caseUpdateSchema)) });
});
