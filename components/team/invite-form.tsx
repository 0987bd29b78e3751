"use client";

import Link from "next/link";
import { useActionState } from "react";
import { Button } from "@/components/ui/button";
import { Field, Select, TextInput } from "@/components/ui/field";
import type { ActionState, FormAction } from "@/lib/actions";
import { ROLES, ROLE_LABELS } from "@/lib/auth/permissions";

const initial: ActionState<{ email: string }> = { ok: false };

export function InviteForm({ demo, invite }: { demo: boolean; invite: FormAction<{ email: string }> }) {
  const [state, action, pending] = useActionState(invite, initial);
  return (
    <div className="space-y-4">
      <form action={action} className="grid gap-3 sm:grid-cols-[1fr_12rem_auto] sm:items-end" noValidate>
        <Field label="E-mail address" name="email" error={state.fieldErrors?.email}>
          <TextInput name="email" type="email" placeholder="name@example.test" defaultValue={state.ok ? "" : state.values?.email} error={state.fieldErrors?.email} />
        </Field>
        <Field label="Role" name="role" error={state.fieldErrors?.role}>
          <Select name="role" defaultValue={state.values?.role ?? "engineer"} key={state.values?.role ?? "engineer"}>
            {ROLES.map((r) => (
              <option key={r} value={r}>
                {ROLE_LABELS[r]}
              </option>
            ))}
          </Select>
        </Field>
        <Button type="submit" disabled={pending}>
          {pending ? "Inviting…" : "Invite"}
        </Button>
      </form>
      {state.message && !state.ok && (
        <p role="alert" className="text-sm text-flag-700">
          {state.message}
        </p>
      )}
      {state.ok && state.data && (
        <div role="status" className="rounded-md border border-moss-600/30 bg-moss-50 p-3 text-sm">
          <p className="font-medium text-moss-700">{state.message}</p>
          <p className="mt-1 text-ink-soft">
            The message holds a one-time link that expires in 7 days.
            {demo && (
              <>
                {" "}
                Demo mode: mail goes to the local catcher; read it in the{" "}
                <Link className="font-medium text-frost-600 underline" href="/outbox">
                  Outbox
                </Link>
                .
              </>
            )}
          </p>
        </div>
      )}
    </div>
  );
}
