import { getActor } from "@/lib/auth/session";
import { json, parseWith, queryObject, route } from "@/lib/http";
import { exportLibrary } from "@/lib/services/library";
import { exportQuerySchema } from "@/lib/validation/library";

/** Heatpath's library JSON (docs/library.md), as a download. */
export const GET = route(async (request) => {
  const actor = await getActor();
  const file = await exportLibrary(actor, parseWith(exportQuerySchema, queryObject(request)));
  const stamp = file.exportedAt!.slice(0, 10);
  return json(file, 200, { "content-disposition": `attachment; filename="heatpath-library-${stamp}.json"` });
});
