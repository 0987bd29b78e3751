import { z } from "zod";
import { getActor } from "@/lib/auth/session";
import { json, readJson, route } from "@/lib/http";
import { importLibrary } from "@/lib/services/library";

/** Import a Heatpath library file as team drafts; the service checks the file's shape. */
export const POST = route(async (request) => {
  const actor = await getActor();
  return json(await importLibrary(actor, await readJson(request, z.unknown(), 4 * 1024 * 1024)), 201);
});
