"use client";

import { usePathname } from "next/navigation";
import { useEffect, useId, useState } from "react";

/**
 * The phone's menu (below the sm breakpoint): one button in the bar that opens the navigation,
 * the user's name and team, and Sign out. Closes on navigation and on Escape.
 */
export function MobileMenu({ children }: { children: React.ReactNode }) {
  const pathname = usePathname();
  // Open on the page it was opened on: navigating elsewhere closes it.
  const [openOn, setOpenOn] = useState<string | null>(null);
  const open = openOn === pathname;
  const setOpen = (next: boolean | ((o: boolean) => boolean)) => setOpenOn((typeof next === "function" ? next(open) : next) ? pathname : null);
  const id = useId();
  useEffect(() => {
    if (!open) return;
    const onKey = (e: KeyboardEvent) => e.key === "Escape" && setOpenOn(null);
    window.addEventListener("keydown", onKey);
    return () => window.removeEventListener("keydown", onKey);
  }, [open]);
  return (
    <div className="sm:hidden">
      <button
        type="button"
        aria-expanded={open}
        aria-controls={id}
        onClick={() => setOpen((o) => !o)}
        className="inline-flex items-center gap-1.5 rounded-md border border-white/30 px-2.5 py-1 text-sm font-medium text-paper hover:bg-white/10"
      >
        <svg width="16" height="12" viewBox="0 0 16 12" aria-hidden="true">
          <path d={open ? "M3 1l10 10M13 1L3 11" : "M0 1h16M0 6h16M0 11h16"} stroke="currentColor" strokeWidth="2" fill="none" />
        </svg>
        Menu
      </button>
      {open && (
        <div id={id} className="absolute inset-x-0 top-full z-40 border-t border-white/10 bg-ink px-4 pb-4 pt-2 shadow-lg" data-testid="mobile-menu">
          {children}
        </div>
      )}
    </div>
  );
}
