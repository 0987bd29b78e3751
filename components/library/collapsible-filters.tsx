"use client";

import { useId, useState } from "react";

/**
 * On a phone the library's filters fold behind one button (the search box stays out); from the
 * sm breakpoint up they sit in the form's grid as before.
 */
export function CollapsibleFilters({ active, children }: { active: number; children: React.ReactNode }) {
  const [open, setOpen] = useState(false);
  const id = useId();
  return (
    <>
      <button
        type="button"
        aria-expanded={open}
        aria-controls={id}
        onClick={() => setOpen((o) => !o)}
        className="flex items-center justify-between rounded-md border border-ink-line bg-white px-3 py-2 text-sm font-medium text-ink sm:hidden"
      >
        <span>Filters{active > 0 ? ` (${active} set)` : ""}</span>
        <span aria-hidden="true">{open ? "▴" : "▾"}</span>
      </button>
      <div id={id} className={`${open ? "grid gap-3" : "hidden"} sm:contents`} data-testid="library-filters">
        {children}
      </div>
    </>
  );
}
