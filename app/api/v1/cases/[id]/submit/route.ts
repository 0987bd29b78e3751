import { getActor } from "@/lib/auth/session";
import { json, readJson, withId } from "@/lib/http";
import { submitCase } from "@/lib/services/cases";
import { lockSchema } from "@/lib/validation/cases";

export const POST = withId(async (request, id) => {
  const actor = await getActor();
  const { lockVersion } = await readJson(request, lockSchema);
  return json({ case: await submitCase(actor, id, lockVersion) });
});
