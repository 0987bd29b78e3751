import { getActor } from "@/lib/auth/session";
import { json, readJson, withId } from "@/lib/http";
import { getCase, updateCase } from "@/lib/services/cases";
import { caseUpdateSchema } from "@/lib/validation/cases";

export const GET = withId(async (_request, id) => json({ case: await getCase(await getActor(), id) }));

/** Send the lockVersion you loaded; a stale edit is answered 409. */
export const PATCH = withId(async (request, id) => {
  const actor = await getActor();
  return json({ case: await updateCase(actor, id, await readJson(request, caseUpdateSchema)) });
});
