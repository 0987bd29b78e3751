import { z } from "zod";
import { getActor } from "@/lib/auth/session";
import { json, parseWith, readJson, route } from "@/lib/http";
import { saveCaseEquilibrium } from "@/lib/services/case-equilibrium";

const idSchema = z.coerce.number({ error: "Expected a case id." }).int().positive("Expected a case id.");

/** PUT { lockVersion, equilibrium | null }: save or clear a draft case's equilibrium. */
export const PUT = route<{ params: Promise<{ id: string }> }>(async (request, { params }) => {
  const id = parseWith(idSchema, (await params).id);
  return json(await saveCaseEquilibrium(await getActor(), id, () => readJson(request, z.unknown())));
});
