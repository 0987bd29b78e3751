"use client";

import { useActionState } from "react";
import { Button } from "@/components/ui/button";
import { initialActionState, type FormAction } from "@/lib/actions";

export function RevokeInvitationButton({ invitationId, revoke }: { invitationId: number; revoke: FormAction }) {
  const [state, action, pending] = useActionState(revoke, initialActionState);
  return (
    <form action={action} className="inline-flex items-center gap-2">
      <input type="hidden" name="invitationId" value={invitationId} />
      <Button type="submit" variant="ghost" disabled={pending}>
        Revoke
      </Button>
      {state.message && !state.ok && <span className="text-xs text-flag-700">{state.message}</span>}
    </form>
  );
}
