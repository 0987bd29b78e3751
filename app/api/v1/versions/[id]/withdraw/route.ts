import { getActor } from "@/lib/auth/session";
import { json, withId } from "@/lib/http";
import { withdrawProposal } from "@/lib/services/library-drafts";

/** Withdraw a proposal back to a draft (its author, or a steward). */
export const POST = withId(async (_request, id) => json({ version: await withdrawProposal(await getActor(), id) }));
