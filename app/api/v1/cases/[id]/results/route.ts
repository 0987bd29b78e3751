import { getActor } from "@/lib/auth/session";
import { resultInView } from "@/lib/cases/results-view";
import { jsonBody, parseWith, queryObject, withId } from "@/lib/http";
import { getResults } from "@/lib/services/cases";
import { resultsJson } from "@/lib/services/results-cache";
import { resultsQuerySchema } from "@/lib/validation/cases";

/** A submitted or approved case answers with its stored snapshot; a draft is evaluated now. */
export const GET = withId(async (request, id) => {
  const { revision, ...view } = parseWith(resultsQuerySchema, queryObject(request));
  const results = await getResults(await getActor(), id, revision);
  // A frozen snapshot's result is serialised once per view (every query field but the revision) and process (lib/services/results-cache.ts).
  return jsonBody(resultsJson(results, JSON.stringify(view), () => resultInView(results.result, view)));
});
