import { getActor } from "@/lib/auth/session";
import { json, parseWith, route } from "@/lib/http";
import { withdrawProposal } from "@/lib/services/library-drafts";
import { idParamSchema } from "@/lib/validation/library";

type Context = { params: Promise<{ id: string }> };

/** Withdraw a proposal back to a draft (its author, or a steward). */
export const POST = route<Context>(async (_request, { params }) => json({ version: await withdrawProposal(await getActor(), parseWith(idParamSchema, (await params).id)) }));
