import { CAUTION_BASIS, CAUTION_SAFETY, type CautionGas } from "@/lib/cases/caution";

/**
 * The caution that stands beside every result, on screen and in print. `gas`: the gas model of
 * the result's equilibrium (lib/cases/caution.ts `cautionGasOf`), ideal unless it says otherwise.
 */
export function Caution({ className = "", gas = "ideal" }: { className?: string; gas?: CautionGas }) {
  return (
    <aside
      role="note"
      aria-label="Caution"
      data-testid="caution"
      data-gas={gas}
      className={`rounded-md border border-ember-100 bg-ember-50 px-3 py-2 text-xs leading-relaxed text-ember-700 print:border-ink-line print:bg-white print:text-ink ${className}`}
    >
      <strong className="font-semibold">Screening estimates</strong> for {CAUTION_BASIS[gas]}. {CAUTION_SAFETY}
    </aside>
  );
}
