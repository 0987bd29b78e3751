import { getActor } from "@/lib/auth/session";
import { json, parseWith, queryObject, readJson, route } from "@/lib/http";
import { createCase, listCases } from "@/lib/services/cases";
import { caseInputSchema, caseListQuerySchema } from "@/lib/validation/cases";

export const GET = route(async (request) => {
  const q = parseWith(caseListQuerySchema, queryObject(request));
  return json({ cases: await listCases(await getActor(), { status: q.status, mine: q.mine === "1" }) });
});

export const POST = route(async (request) => {
  const actor = await getActor();
  return json({ case: await createCase(actor, await readJson(request, caseInputSchema)) }, 201);
});
