"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import { actionFailure, formObject, type ActionState } from "@/lib/actions";
import { ROLE_LABELS } from "@/lib/auth/permissions";
import { getActor } from "@/lib/auth/session";
import { parseWith } from "@/lib/http";
import * as team from "@/lib/services/team";
import { strictObject } from "@/lib/validation/strict";
import { idParamSchema } from "@/lib/validation/params";
import { changeRoleSchema, inviteSchema } from "@/lib/validation/team";

// The forms' own fields; the framework's $ACTION_* keys are dropped by formObject, anything else is refused.
const membershipForm = strictObject({ membershipId: z.string({ error: "Expected a numeric id." }) });
const invitationForm = strictObject({ invitationId: z.string({ error: "Expected a numeric id." }) });
const changeRoleForm = changeRoleSchema.extend(membershipForm.shape);

export async function changeRoleAction(_prev: ActionState, formData: FormData): Promise<ActionState> {
  try {
    const { membershipId, role } = parseWith(changeRoleForm, formObject(formData));
    const id = parseWith(idParamSchema, membershipId);
    await team.changeRole(await getActor(), id, role);
    revalidatePath("/team");
    return { ok: true, message: `Role saved: ${ROLE_LABELS[role]}.` };
  } catch (error) {
    return actionFailure(error);
  }
}

export async function removeMemberAction(_prev: ActionState, formData: FormData): Promise<ActionState> {
  try {
    const { membershipId } = parseWith(membershipForm, formObject(formData));
    const id = parseWith(idParamSchema, membershipId);
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
    const { invitationId } = parseWith(invitationForm, formObject(formData));
    const id = parseWith(idParamSchema, invitationId);
    await team.revokeInvitation(await getActor(), id);
    revalidatePath("/team");
    return { ok: true, message: "Invitation revoked." };
  } catch (error) {
    return actionFailure(error);
  }
}
