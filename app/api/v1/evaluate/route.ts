import { z } from "zod";
import { getActor } from "@/lib/auth/session";
import { json, readJson, route } from "@/lib/http";
import { runEvaluation } from "@/lib/services/evaluate";

export const POST = route(async (request) => json(await runEvaluation(await getActor(), () => readJson(request, z.unknown()))));
