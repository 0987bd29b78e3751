import { getActor } from "@/lib/auth/session";
import { json, readJson, withId } from "@/lib/http";
import { fitDataset } from "@/lib/services/datasets";
import { fitParamsSchema } from "@/lib/validation/library";

/** Fit a Cp form to the dataset; returns coefficients, residuals and statistics, stores nothing. */
export const POST = withId(async (request, id) => {
  const actor = await getActor();
  return json({ fit: await fitDataset(actor, id, await readJson(request, fitParamsSchema)) });
});
