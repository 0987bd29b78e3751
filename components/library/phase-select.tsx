"use client";

import { inputClass } from "@/components/ui/field";

const LABEL: Record<string, string> = { g: "gas (g)", l: "liquid (l)", cr: "solid (cr)" };

export const phaseLabel = (p: string) => LABEL[p] ?? `solid ${p.replace(/^cr-/, "")} (${p})`;

/** The phases a species already has first, then cr, l and g; the current value always stays offered. */
export function phaseChoices(known: readonly string[], current = ""): string[] {
  return [...new Set([...known, ...(current ? [current] : []), "g", "l", "cr"])];
}

/** The phase to preselect: the dataset's own, else the species' one phase; "" (choose) when that is not clear. */
export function defaultPhase(known: readonly string[], datasetPhase?: string | null): string {
  if (datasetPhase) return datasetPhase;
  return known.length === 1 ? known[0] : "";
}

/**
 * A phase picker: never free text and never a silent "cr". With nothing chosen it reads
 * "Choose a phase…" and the form refuses to go on.
 */
export function PhaseSelect({
  value,
  onChange,
  known,
  label,
  id,
  className = "",
  invalid,
  describedBy,
}: {
  value: string;
  onChange: (phase: string) => void;
  known: readonly string[];
  label: string;
  id?: string;
  className?: string;
  invalid?: boolean;
  describedBy?: string;
}) {
  const existing = new Set(known);
  return (
    <select
      id={id}
      className={`${inputClass} ${className}`}
      value={value}
      onChange={(e) => onChange(e.target.value)}
      aria-label={label}
      aria-invalid={invalid || undefined}
      aria-describedby={describedBy}
    >
      <option value="">Choose a phase…</option>
      {phaseChoices(known, value).map((p) => (
        <option key={p} value={p}>
          {phaseLabel(p)}
          {existing.has(p) ? " · in the library" : ""}
        </option>
      ))}
    </select>
  );
}
