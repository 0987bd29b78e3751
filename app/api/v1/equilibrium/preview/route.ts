import { z } from "zod";
import { getActor } from "@/lib/auth/session";
import { json, readJson, route } from "@/lib/http";
import { previewCaseEquilibrium } from "@/lib/services/case-equilibrium";

/** POST { caseId, equilibrium }: the case evaluated with that equilibrium, not saved. */
export const POST = route(async (request) => json(await previewCaseEquilibrium(await getActor(), () => readJson(request, z.unknown()))));
