import { noWarningsText, type CautionGas } from "@/lib/cases/caution";
import { formatTemperature, type DisplayUnit } from "@/lib/cases/display-unit";
import { fixed } from "@/lib/cases/format";
import { signCaseSentence } from "@/lib/cases/sign-case";
import { warningMeaning } from "@/lib/cases/warnings";
import type { EvaluateResult } from "@/lib/thermo/evaluate";

/** Reference values, crossovers (to 0.1 of the display unit) and the sign case in words. */
export function ResultSummary({ result, unit = "K" }: { result: EvaluateResult; unit?: DisplayUnit }) {
  const r = result.reference;
  const c = result.crossover;
  const first = result.points[0]?.tK;
  const last = result.points[result.points.length - 1]?.tK;
  return (
    <dl className="grid gap-x-6 gap-y-3 text-sm sm:grid-cols-2 lg:grid-cols-3" data-testid="result-summary">
      <div>
        <dt className="text-xs text-ink-muted">At the reference temperature ({formatTemperature(r.tK, unit, 2)})</dt>
        <dd className="tabular">
          ΔrH° = <span data-testid="ref-dh">{fixed(r.dHkJ, 3)}</span> kJ/mol · ΔrS° = {fixed(r.dSJ, 3)} J/(mol·K) · ΔrG° = {fixed(r.dGkJ, 3)} kJ/mol
        </dd>
      </div>
      <div>
        <dt className="text-xs text-ink-muted">Sign case of (ΔrH°, ΔrS°)</dt>
        <dd data-testid="sign-case">
          <span className="font-medium">{result.signCase.text}</span> <code className="text-xs text-ink-muted">{result.signCase.code}</code>
          <span className="block text-xs" data-testid="sign-agrees">
            {signCaseSentence(result, unit)}
          </span>
        </dd>
      </div>
      <div>
        <dt className="text-xs text-ink-muted">Crossover temperatures (ΔrG = 0)</dt>
        <dd className="tabular" data-testid="crossovers">
          <span className="block">
            Naive T*:{" "}
            {c.naiveK === null
              ? "none (ΔrH° and ΔrS° have opposite signs)"
              : `${formatTemperature(c.naiveK, unit)}${c.naiveInSpan ? "" : ` (outside ${formatTemperature(first, unit, 0)} to ${formatTemperature(last, unit, 0)})`}`}
          </span>
          <span className="block">Corrected: {c.correctedK.length === 0 ? "none in the span" : c.correctedK.map((t) => formatTemperature(t, unit)).join(", ")}</span>
        </dd>
      </div>
    </dl>
  );
}

export function WarningList({ warnings, gas = "ideal" }: { warnings: EvaluateResult["warnings"]; gas?: CautionGas }) {
  if (warnings.length === 0)
    return (
      <p className="text-sm text-moss-700" data-testid="no-warnings">
        {noWarningsText(gas)}
      </p>
    );
  return (
    <ul className="space-y-2" data-testid="warnings">
      {warnings.map((w, i) => (
        <li key={i} className="rounded-md border border-flag-600/30 bg-flag-50 px-3 py-2 text-sm print:bg-white">
          <code className="mr-2 rounded bg-white px-1.5 py-0.5 text-xs font-semibold text-flag-700 ring-1 ring-flag-600/20">{w.code}</code>
          {w.species && <span className="mr-2 font-medium">{w.species}</span>}
          <span>{w.message}</span>
          <span className="mt-0.5 block text-xs text-ink-muted">{warningMeaning(w.code)}</span>
        </li>
      ))}
    </ul>
  );
}
