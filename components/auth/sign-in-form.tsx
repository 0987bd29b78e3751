"use client";

import { useActionState } from "react";
import { Button } from "@/components/ui/button";
import { Field, TextInput } from "@/components/ui/field";
import { initialActionState, type FormAction } from "@/lib/actions";

export function SignInForm({ next, signIn }: { next?: string; signIn: FormAction }) {
  const [state, action, pending] = useActionState(signIn, initialActionState);
  return (
    <form action={action} className="space-y-4" noValidate>
      {next && <input type="hidden" name="next" value={next} />}
      <Field label="E-mail" name="email" error={state.fieldErrors?.email}>
        <TextInput name="email" type="email" autoComplete="username" required defaultValue={state.values?.email} error={state.fieldErrors?.email} />
      </Field>
      <Field label="Password" name="password" error={state.fieldErrors?.password}>
        <TextInput name="password" type="password" autoComplete="current-password" required error={state.fieldErrors?.password} />
      </Field>
      {state.message && (
        <p role="alert" className="rounded-md bg-flag-50 px-3 py-2 text-sm text-flag-700">
          {state.message}
        </p>
      )}
      <Button type="submit" disabled={pending} className="w-full">
        {pending ? "Signing in…" : "Sign in"}
      </Button>
    </form>
  );
}
