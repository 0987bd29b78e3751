import { getActor } from "@/lib/auth/session";
import { jsonBody, parseWith, queryObject, route } from "@/lib/http";
import { getResults } from "@/lib/services/cases";
import { resultsJson } from "@/lib/services/results-cache";
import { inFormat } from "@/lib/thermo/columns";
import { resultsQuerySchema } from "@/lib/validation/cases";
import { idParamSchema } from "@/lib/validation/team";

type Context = { params: Promise<{ id: string }> };

/** A submitted or approved case answers with its stored snapshot; a draft is evaluated now. */
export const GET = route<Context>(async (request, { params }) => {
  const id = parseWith(idParamSchema, (await params).id);
  const { revision, format } = parseWith(resultsQuerySchema, queryObject(request));
  const results = await getResults(await getActor(), id, revision);
  // A frozen snapshot's result is serialised once per view and process (lib/services/results-cache.ts).
  return jsonBody(resultsJson(results, format ?? "rows", () => inFormat(results.result, format)));
});
