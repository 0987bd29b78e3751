import { redirect } from "next/navigation";
import { AppHeader } from "@/components/shell/app-header";
import { can } from "@/lib/auth/permissions";
import { getActor } from "@/lib/auth/session";
import { isProduction } from "@/lib/env";
import { signOutAction } from "./actions";

const NAV = [
  { href: "/", label: "Home" },
  { href: "/library", label: "Library" },
  { href: "/cases", label: "Cases" },
  { href: "/reviews", label: "Reviews" },
  { href: "/team", label: "Team" },
];

export default async function AppLayout({ children }: { children: React.ReactNode }) {
  const actor = await getActor();
  if (!actor) redirect("/sign-in");
  return (
    <>
      {/* Admins read the team's mail; in demo mode everyone reads their own from the local catcher. */}
      <a
        href="#main"
        className="sr-only z-50 rounded-md bg-paper px-3 py-2 text-sm font-medium text-ink focus:not-sr-only focus:absolute focus:left-3 focus:top-3"
        data-testid="skip-link"
      >
        Skip to main content
      </a>
      <AppHeader
        actor={actor}
        signOut={signOutAction}
        items={[
          ...NAV,
          ...(can(actor.role, "audit.view") ? [{ href: "/audit", label: "Audit" }] : []),
          ...(can(actor.role, "outbox.view") || !isProduction ? [{ href: "/outbox", label: "Outbox" }] : []),
        ]}
      />
      <main id="main" tabIndex={-1} className="mx-auto max-w-6xl px-4 py-8 focus:outline-none">
        {children}
      </main>
    </>
  );
}
