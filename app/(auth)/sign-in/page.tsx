import type { Metadata } from "next";
import { SignInForm } from "@/components/auth/sign-in-form";
import { isProduction } from "@/lib/env";
import { signInAction } from "./actions";

export const metadata: Metadata = { title: "Sign in" };

export default async function SignInPage({ searchParams }: { searchParams: Promise<{ next?: string }> }) {
  const { next } = await searchParams;
  return (
    <>
      <h1 className="mb-4 text-lg font-semibold">Sign in</h1>
      <SignInForm next={next} signIn={signInAction} />
      {!isProduction && (
        <p className="mt-4 text-xs text-ink-muted">
          Demo mode: accounts such as <span className="font-medium">erin.engineer@example.test</span> are listed in the README.
        </p>
      )}
    </>
  );
}
