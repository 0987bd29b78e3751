import { getActor } from "@/lib/auth/session";
import { json, parseWith, readJson, route } from "@/lib/http";
import { fitDataset } from "@/lib/services/datasets";
import { fitParamsSchema, idParamSchema } from "@/lib/validation/library";

type Context = { params: Promise<{ id: string }> };

/** Fit a Cp form to the dataset; returns coefficients, residuals and statistics, stores nothing. */
export const POST = route<Context>(async (request, { params }) => {
  const actor = await getActor();
  const id = parseWith(idParamSchema, (await params).id);
  return json({ fit: await fitDataset(actor, id, await readJson(request, fitParamsSchema)) });
});
