import { getActor } from "@/lib/auth/session";
import { parseWith, queryObject, withId } from "@/lib/http";
import { exportCsv } from "@/lib/services/cases";
import { exportQuerySchema } from "@/lib/validation/cases";

/** The result points as CSV, the same numbers as GET …/results. */
export const GET = withId(async (request, id) => {
  const { revision, unit } = parseWith(exportQuerySchema, queryObject(request));
  const { filename, csv } = await exportCsv(await getActor(), id, revision, unit);
  return new Response(csv, {
    status: 200,
    headers: { "content-type": "text/csv; charset=utf-8", "content-disposition": `attachment; filename="${filename}"` },
  });
});
