"use server";

import { redirect } from "next/navigation";
import { actionFailure, formObject, type ActionState } from "@/lib/actions";
import { startSession } from "@/lib/auth/session";
import { parseWith } from "@/lib/http";
import { acceptInvitation } from "@/lib/services/team";
import { acceptInvitationSchema } from "@/lib/validation/team";

export async function acceptInvitationAction(_prev: ActionState, formData: FormData): Promise<ActionState> {
  const raw = formObject(formData);
  try {
    const input = parseWith(acceptInvitationSchema, raw);
    const { userId, teamId } = await acceptInvitation(input);
    await startSession(userId, teamId);
  } catch (error) {
    return actionFailure(error, raw);
  }
  redirect("/");
}
