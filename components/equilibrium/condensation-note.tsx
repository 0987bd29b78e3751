import { fixed } from "@/lib/cases/format";
import type { EvaluateResult } from "@/lib/thermo/evaluate";

/**
 * Says where a condensed phase could form in the equilibrium: the engine's
 * `condensed-phase-possible` warnings, screened on each species' normal boiling point.
 */
export function CondensationNote({ result }: { result: EvaluateResult }) {
  const list = result.warnings.filter((w) => w.code === "condensed-phase-possible");
  if (list.length === 0) return null;
  return (
    <div role="status" className="rounded-md border border-frost-100 bg-frost-50 px-3 py-2 text-sm text-frost-700" data-testid="condensation-note">
      <p className="font-semibold">A liquid or solid could form</p>
      <ul className="mt-1 space-y-1">
        {list.map((w) => (
          <li key={w.species}>
            <strong>{w.species}</strong> {String(w.message)}
          </li>
        ))}
      </ul>
      <p className="mt-1 text-xs">
        Screened on the normal boiling point (1 atm): a species whose partial pressure reaches 1 atm condenses below it for certain; at lower partial pressures its dew point is
        lower, so the flag may be a false alarm; above 1 atm it may also condense somewhat above it. The outlet shown keeps every species in the gas. Largest partial pressure in
        the flagged range: {list.map((w) => `${w.species} ${fixed(Number(w.partialPressureBar), 3)} bar`).join(", ")}.
      </p>
    </div>
  );
}
