"use client";

import { DISPLAY_UNITS, UNIT_LABELS, type DisplayUnit } from "@/lib/cases/display-unit";

/** K / °C / °F: how temperatures read on this page (the API and the stored numbers stay in kelvin). */
export function UnitSwitch({ unit, onChange }: { unit: DisplayUnit; onChange: (u: DisplayUnit) => void }) {
  return (
    <fieldset className="no-print inline-flex items-center gap-1 text-xs" data-testid="unit-switch">
      <legend className="sr-only">Show temperatures in</legend>
      <span className="mr-1 text-ink-muted" aria-hidden="true">
        Temperatures in
      </span>
      {DISPLAY_UNITS.map((u) => (
        <label
          key={u}
          className={`cursor-pointer rounded-md border px-2 py-1 font-medium focus-within:ring-2 focus-within:ring-frost-500 ${u === unit ? "border-ink bg-ink text-paper" : "border-ink-line bg-white text-ink hover:bg-paper-deep"}`}
        >
          <input type="radio" name="display-unit" value={u} checked={u === unit} onChange={() => onChange(u)} className="sr-only" />
          {UNIT_LABELS[u]}
        </label>
      ))}
    </fieldset>
  );
}
