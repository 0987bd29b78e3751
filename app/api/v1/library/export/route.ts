import { getActor } from "@/lib/auth/session";
import { json, parseWith, queryObject, route } from "@/lib/http";
import { exportLibrary } from "@/lib/services/library";
import { exportFilename } from "@/lib/services/library-export-name";
import { exportQuerySchema } from "@/lib/validation/library";

/** Heatpath's library JSON (docs/library.md), as a download named for what it holds and the day. */
export const GET = route(async (request) => {
  const actor = await getActor();
  const query = parseWith(exportQuerySchema, queryObject(request));
  const file = await exportLibrary(actor, query);
  return json(file, 200, { "content-disposition": `attachment; filename="${exportFilename(file, query)}"` });
});
