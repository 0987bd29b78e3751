import { getActor } from "@/lib/auth/session";
import { resultInView } from "@/lib/cases/results-view";
import { json, parseWith, queryObject, withId } from "@/lib/http";
import { getResults } from "@/lib/services/cases";
import { resultsQuerySchema } from "@/lib/validation/cases";

/** A submitted or approved case answers with its stored snapshot; a draft is evaluated now. */
export const GET = withId(async (request, id) => {
  const { revision, ...view } = parseWith(resultsQuerySchema, queryObject(request));
  const results = await getResults(await getActor(), id, revision);
  return json(view.format === "columns" ? { ...results, result: resultInView(results.result, view) } : results);
});
