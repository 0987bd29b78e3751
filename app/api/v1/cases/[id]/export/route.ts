import { getActor } from "@/lib/auth/session";
import { parseWith, queryObject, route } from "@/lib/http";
import { exportCsv } from "@/lib/services/cases";
import { exportQuerySchema } from "@/lib/validation/cases";
import { idParamSchema } from "@/lib/validation/team";

type Context = { params: Promise<{ id: string }> };

/** The result points as CSV, the same numbers as GET …/results. */
export const GET = route<Context>(async (request, { params }) => {
  const id = parseWith(idParamSchema, (await params).id);
  const { revision, unit } = parseWith(exportQuerySchema, queryObject(request));
  const { filename, csv } = await exportCsv(await getActor(), id, revision, unit);
  return new Response(csv, {
    status: 200,
    headers: { "content-type": "text/csv; charset=utf-8", "content-disposition": `attachment; filename="${filename}"` },
  });
});
