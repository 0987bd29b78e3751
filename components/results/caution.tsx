/** The caution that stands beside every result, on screen and in print. */
export function Caution({ className = "" }: { className?: string }) {
  return (
    <aside
      role="note"
      aria-label="Caution"
      data-testid="caution"
      className={`rounded-md border border-ember-100 bg-ember-50 px-3 py-2 text-xs leading-relaxed text-ember-700 print:border-ink-line print:bg-white print:text-ink ${className}`}
    >
      <strong className="font-semibold">Screening estimates</strong> for ideal standard states (1 bar, ideal-gas activities, pure
      condensed phases). Decisions that affect safety follow the organisation&apos;s process-safety review, the applicable codes and
      licensed engineering judgement.
    </aside>
  );
}
