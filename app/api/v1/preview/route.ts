import { getActor } from "@/lib/auth/session";
import { json, readJson, route } from "@/lib/http";
import { previewCurve } from "@/lib/services/library";
import { previewSchema } from "@/lib/validation/library";

/** The editor's live curve for unsaved data; nothing is stored. */
export const POST = route(async (request) => {
  const actor = await getActor();
  return json(await previewCurve(actor, await readJson(request, previewSchema)));
});
