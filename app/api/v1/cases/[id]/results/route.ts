import { getActor } from "@/lib/auth/session";
import { resultInView } from "@/lib/cases/results-view";
import { json, parseWith, queryObject, route } from "@/lib/http";
import { getResults } from "@/lib/services/cases";
import { resultsQuerySchema } from "@/lib/validation/cases";
import { idParamSchema } from "@/lib/validation/team";

type Context = { params: Promise<{ id: string }> };

/** A submitted or approved case answers with its stored snapshot; a draft is evaluated now. */
export const GET = route<Context>(async (request, { params }) => {
  const id = parseWith(idParamSchema, (await params).id);
  const { revision, ...view } = parseWith(resultsQuerySchema, queryObject(request));
  const results = await getResults(await getActor(), id, revision);
  return json(view.format === "columns" ? { ...results, result: resultInView(results.result, view) } : results);
});
