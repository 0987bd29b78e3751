import { getActor } from "@/lib/auth/session";
import { json, parseWith, route } from "@/lib/http";
import { getSnapshot } from "@/lib/services/cases";
import { revisionParamSchema } from "@/lib/validation/cases";
import { idParamSchema } from "@/lib/validation/team";

type Context = { params: Promise<{ id: string; revision: string }> };

export const GET = route<Context>(async (_request, { params }) => {
  const p = await params;
  return json({ snapshot: await getSnapshot(await getActor(), parseWith(idParamSchema, p.id), parseWith(revisionParamSchema, p.revision)) });
});
