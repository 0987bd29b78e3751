"use server";

import { revalidatePath } from "next/cache";
import { actionFailure, formObject, type ActionState } from "@/lib/actions";
import { ROLE_LABELS } from "@/lib/auth/permissions";
import { getActor } from "@/lib/auth/session";
import { parseWith } from "@/lib/http";
import * as team from "@/lib/services/team";
import { changeRoleSchema, idParamSchema, inviteSchema } from "@/lib/validation/team";

export async function changeRoleAction(_prev: ActionState, formData: FormData): Promise<ActionState> {
  try {
    const input = formObject(formData);
    const id = parseWith(idParamSchema, input.membershipId);
    const { role } = parseWith(changeRoleSchema, input);
    await team.changeRole(await getActor(), id, role);
    revalidatePath("/team");
    return { ok: true, message: `Role saved: ${ROLE_LABELS[role]}.` };
  } catch (error) {
    return actionFailure(error);
  }
}

export async function removeMemberAction(_prev: ActionState, formData: FormData): Promise<ActionState> {
  try {
    const id = parseWith(idParamSchema, formData.get("membershipId"));
    await team.removeMember(await getActor(), id);
    revalidatePath("/team");
    return { ok: true, message: "Member removed." };
  } catch (error) {
    return actionFailure(error);
  }
}

export async function inviteAction(_prev: ActionState<{ email: string }>, formData: FormData): Promise<ActionState<{ email: string }>> {
  const raw = formObject(formData);
  try {
    const input = parseWith(inviteSchema, raw);
    const created = await team.invite(await getActor(), input);
    revalidatePath("/team");
    return { ok: true, message: `Invitation mailed to ${created.mailedTo}.`, data: { email: created.mailedTo } };
  } catch (error) {
    return actionFailure(error, raw);
  }
}

export async function revokeInvitationAction(_prev: ActionState, formData: FormData): Promise<ActionState> {
  try {
    const id = parseWith(idParamSchema, formData.get("invitationId"));
    await team.revokeInvitation(await getActor(), id);
    revalidatePath("/team");
    return { ok: true, message: "Invitation revoked." };
  } catch (error) {
    return actionFailure(error);
  }
}
