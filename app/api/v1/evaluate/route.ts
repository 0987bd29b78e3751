import { z } from "zod";
import { strictObject } from "@/lib/validation/strict";
import { getActor } from "@/lib/auth/session";
import { jsonBody, parseWith, queryObject, readJson, route } from "@/lib/http";
import { runEvaluation } from "@/lib/services/evaluate";
import { resultFormatSchema } from "@/lib/thermo/columns";

const querySchema = strictObject({ format: resultFormatSchema.optional() });

export const POST = route(async (request) => {
  const { format } = parseWith(querySchema, queryObject(request));
  return jsonBody(await runEvaluation(await getActor(), () => readJson(request, z.unknown()), format));
});
