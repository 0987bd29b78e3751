import { z } from "zod";
import { getActor } from "@/lib/auth/session";
import { json, readJson, withId } from "@/lib/http";
import { saveCaseEquilibrium } from "@/lib/services/case-equilibrium";

/** PUT { lockVersion, equilibrium | null }: save or clear a draft case's equilibrium. */
export const PUT = withId(async (request, id) => json(await saveCaseEquilibrium(await getActor(), id, () => readJson(request, z.unknown()))));
