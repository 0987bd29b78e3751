import { getActor } from "@/lib/auth/session";
import { json, parseWith, readJson, route } from "@/lib/http";
import { rerunWithNewerVersions } from "@/lib/services/cases";
import { lockSchema } from "@/lib/validation/cases";
import { idParamSchema } from "@/lib/validation/team";

type Context = { params: Promise<{ id: string }> };

/** Move the pins onto newer approved versions; an approved case becomes a new submitted revision. */
export const POST = route<Context>(async (request, { params }) => {
  const actor = await getActor();
  const id = parseWith(idParamSchema, (await params).id);
  const { lockVersion } = await readJson(request, lockSchema);
  return json({ case: await rerunWithNewerVersions(actor, id, lockVersion) });
});
