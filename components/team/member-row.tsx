"use client";

import { startTransition, useActionState, useState } from "react";
import { Button } from "@/components/ui/button";
import { inputClass } from "@/components/ui/field";
import { initialActionState, type ActionState, type FormAction } from "@/lib/actions";
import { ROLES, ROLE_LABELS, type Role } from "@/lib/auth/permissions";

export function MemberControls({
  membershipId,
  role,
  name,
  changeRole,
  removeMember,
}: {
  membershipId: number;
  role: Role;
  name: string;
  changeRole: FormAction;
  removeMember: FormAction;
}) {
  // The select is controlled and the form is sent without the automatic form reset (which
  // put the select back on the role it was first rendered with): after "Role saved." it
  // shows what was stored, and a second save sends that again.
  const [chosen, setChosen] = useState<Role>(role);
  const [roleState, roleAction, rolePending] = useActionState(async (prev: ActionState, formData: FormData) => {
    const answer = await changeRole(prev, formData);
    // Refused: the stored role did not change, so show it again.
    if (!answer.ok) setChosen(role);
    return answer;
  }, initialActionState);
  const [removeState, removeAction, removePending] = useActionState(removeMember, initialActionState);
  const message = removeState.message ?? roleState.message;
  const failed = (removeState.message && !removeState.ok) || (roleState.message && !roleState.ok);
  return (
    <div className="flex flex-wrap items-center justify-end gap-2">
      <form
        className="flex items-center gap-2"
        onSubmit={(e) => {
          e.preventDefault();
          const data = new FormData(e.currentTarget);
          startTransition(() => roleAction(data));
        }}
      >
        <input type="hidden" name="membershipId" value={membershipId} />
        <label className="sr-only" htmlFor={`role-${membershipId}`}>
          Role of {name}
        </label>
        <select
          id={`role-${membershipId}`}
          name="role"
          value={chosen}
          onChange={(e) => setChosen(e.target.value as Role)}
          className={`${inputClass} w-36 py-1.5`}
          data-stored-role={role}
        >
          {ROLES.map((r) => (
            <option key={r} value={r}>
              {ROLE_LABELS[r]}
            </option>
          ))}
        </select>
        <Button type="submit" variant="secondary" disabled={rolePending}>
          Save role
        </Button>
      </form>
      <form
        action={removeAction}
        onSubmit={(e) => {
          if (!window.confirm(`Remove ${name} from the team?`)) e.preventDefault();
        }}
      >
        <input type="hidden" name="membershipId" value={membershipId} />
        <Button type="submit" variant="danger" disabled={removePending}>
          Remove
        </Button>
      </form>
      {message && (
        <p role="status" className={`w-full text-right text-xs ${failed ? "text-flag-700" : "text-moss-700"}`}>
          {message}
        </p>
      )}
    </div>
  );
}
