import { Card } from "@/components/ui/card";
import { formatQuantity } from "@/lib/cases/temperature";
import type { PinDto } from "@/lib/services/cases";
import type { CaseInputs } from "@/lib/validation/cases";

const PHASE_WORDS: Record<string, string> = { g: "gas", l: "liquid", cr: "solid" };

export function temperaturesText(t: CaseInputs["temperatures"]): string {
  if ("listK" in t) return t.listK.map(formatQuantity).join(", ");
  return `${formatQuantity(t.fromK)} to ${formatQuantity(t.toK)}, step ${formatQuantity(t.stepK)}`;
}

/** The case's inputs as entered (units kept). */
export function InputsCard({ inputs, notes }: { inputs: CaseInputs; notes?: string }) {
  const row = "flex justify-between gap-3 py-1";
  return (
    <Card title="Inputs">
      <dl className="divide-y divide-ink-line/60 text-sm">
        <div className={row}>
          <dt className="text-ink-muted">Temperatures</dt>
          <dd className="text-right tabular" data-testid="input-temperatures">
            {temperaturesText(inputs.temperatures)}
          </dd>
        </div>
        <div className={row}>
          <dt className="text-ink-muted">Reference temperature</dt>
          <dd className="tabular">{formatQuantity(inputs.referenceK)}</dd>
        </div>
        <div className={row}>
          <dt className="text-ink-muted">Tolerance on ΔrG</dt>
          <dd className="tabular">{inputs.toleranceKJ} kJ/mol</dd>
        </div>
        <div className={row}>
          <dt className="text-ink-muted">Tolerance on K</dt>
          <dd className="tabular">{inputs.toleranceKFactor === null ? "—" : `factor ${inputs.toleranceKFactor}`}</dd>
        </div>
      </dl>
      {notes ? <p className="mt-3 whitespace-pre-wrap border-t border-ink-line pt-3 text-sm text-ink-soft">{notes}</p> : null}
    </Card>
  );
}

/** Pinned versions with their citations. */
export function PinsCard({ pins, coefficients }: { pins: PinDto[]; coefficients: Record<string, number> }) {
  return (
    <Card title="Pinned model versions">
      <ul className="space-y-2 text-sm" data-testid="pins">
        {pins.map((p) => (
          <li key={p.key} className="border-b border-ink-line/60 pb-2 last:border-0 last:pb-0">
            <div className="flex flex-wrap items-baseline justify-between gap-2">
              <span>
                <span className="tabular">{coefficients[p.key] ?? ""}</span> <strong>{p.key}</strong>{" "}
                <span className="text-xs text-ink-muted">{p.phase ? (PHASE_WORDS[p.phase.split("-")[0]] ?? p.phase) : "stable phase (lowest G)"}</span>
              </span>
              <span className={`text-xs ${p.status === "approved" ? "text-moss-700" : "font-semibold text-flag-700"}`}>
                {p.modelName} · v{p.versionNumber} · {p.status}
              </span>
            </div>
            <p className="text-xs text-ink-muted">{p.citation}</p>
          </li>
        ))}
      </ul>
    </Card>
  );
}
