import { ROLE_LABELS } from "@/lib/auth/permissions";
import type { Actor } from "@/lib/auth/guards";
import { MobileMenu } from "./mobile-menu";
import { NavLinks, type NavItem } from "./nav-links";
import { Wordmark } from "./wordmark";

function SignOut({ action }: { action: () => Promise<void> }) {
  return (
    <form action={action}>
      <button type="submit" className="rounded-md px-2 py-1 text-paper/80 hover:bg-white/10 hover:text-paper">
        Sign out
      </button>
    </form>
  );
}

/**
 * The bar: on a wide screen the navigation, the user's name and team, the role and Sign out; on a
 * phone the role and one Menu button that holds the rest, so the bar never wraps or scrolls.
 */
/** `signOut`: the layout's server action. */
export function AppHeader({ actor, items, signOut }: { actor: Actor; items: NavItem[]; signOut: () => Promise<void> }) {
  return (
    <header className="no-print relative bg-ink text-paper">
      <div className="mx-auto flex max-w-6xl items-center gap-x-6 gap-y-2 px-4 py-3">
        <Wordmark className="text-lg" />
        <div className="hidden min-w-0 sm:block sm:flex-1">
          <NavLinks items={items} />
        </div>
        <div className="ml-auto flex items-center gap-3 text-sm">
          <span className="hidden text-right leading-tight sm:block">
            <span className="block font-medium" data-testid="user-name">
              {actor.name}
            </span>
            <span className="block text-xs text-paper/70">{actor.teamName}</span>
          </span>
          <span data-testid="user-role" className="rounded-full bg-ember-500 px-2.5 py-0.5 text-xs font-semibold text-white">
            {ROLE_LABELS[actor.role]}
          </span>
          <div className="hidden sm:block">
            <SignOut action={signOut} />
          </div>
          <MobileMenu>
            <NavLinks items={items} vertical />
            <div className="mt-3 flex items-center justify-between gap-3 border-t border-white/10 pt-3 text-sm">
              <span className="leading-tight">
                <span className="block font-medium" data-testid="menu-user-name">
                  {actor.name}
                </span>
                <span className="block text-xs text-paper/70">{actor.teamName}</span>
              </span>
              <SignOut action={signOut} />
            </div>
          </MobileMenu>
        </div>
      </div>
    </header>
  );
}
