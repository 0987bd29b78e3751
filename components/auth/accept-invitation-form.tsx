"use client";

import { useActionState } from "react";
import { Button } from "@/components/ui/button";
import { Field, TextInput } from "@/components/ui/field";
import { initialActionState, type FormAction } from "@/lib/actions";

export function AcceptInvitationForm({ token, email, accept }: { token: string; email: string; accept: FormAction }) {
  const [state, action, pending] = useActionState(accept, initialActionState);
  return (
    <form action={action} className="space-y-4" noValidate>
      <input type="hidden" name="token" value={token} />
      <Field label="E-mail" name="email-shown">
        <TextInput name="email-shown" value={email} readOnly disabled />
      </Field>
      <Field label="Your name" name="name" error={state.fieldErrors?.name}>
        <TextInput name="name" autoComplete="name" defaultValue={state.values?.name} error={state.fieldErrors?.name} />
      </Field>
      <Field label="Choose a password" name="password" error={state.fieldErrors?.password} hint="At least 10 characters, with a digit or symbol.">
        <TextInput name="password" type="password" autoComplete="new-password" error={state.fieldErrors?.password} />
      </Field>
      {state.message && (
        <p role="alert" className="rounded-md bg-flag-50 px-3 py-2 text-sm text-flag-700">
          {state.message}
        </p>
      )}
      <Button type="submit" className="w-full" disabled={pending}>
        {pending ? "Joining…" : "Join the team"}
      </Button>
    </form>
  );
}
