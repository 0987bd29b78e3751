import { getActor } from "@/lib/auth/session";
import { json, readJson, withId } from "@/lib/http";
import { rerunWithNewerVersions } from "@/lib/services/cases";
import { lockSchema } from "@/lib/validation/cases";

/** Move the pins onto newer approved versions; an approved case becomes a new submitted revision. */
export const POST = withId(async (request, id) => {
  const actor = await getActor();
  const { lockVersion } = await readJson(request, lockSchema);
  return json({ case: await rerunWithNewerVersions(actor, id, lockVersion) });
});
