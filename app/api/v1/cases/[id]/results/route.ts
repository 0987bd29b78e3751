import { getActor } from "@/lib/auth/session";
import { json, parseWith, queryObject, withId } from "@/lib/http";
import { getResults } from "@/lib/services/cases";
import { inFormat } from "@/lib/thermo/columns";
import { resultsQuerySchema } from "@/lib/validation/cases";

/** A submitted or approved case answers with its stored snapshot; a draft is evaluated now. */
export const GET = withId(async (request, id) => {
  const { revision, format } = parseWith(resultsQuerySchema, queryObject(request));
  const results = await getResults(await getActor(), id, revision);
  return json(format === "columns" ? { ...results, result: inFormat(results.result, format) } : results);
});
