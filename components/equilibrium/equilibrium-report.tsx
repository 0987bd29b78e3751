import { cautionGasOf, equilibriumCautionText } from "@/lib/cases/caution";
import type { DisplayUnit } from "@/lib/cases/display-unit";
import type { EvaluateResult } from "@/lib/thermo/evaluate";
import { EquilibriumResults } from "./equilibrium-results";
import { SourceComparisonView, type SourcesDto } from "./source-comparison";

/** The equilibrium section of the printable report: the frozen composition, then the family spread computed at print time. */
export function EquilibriumReport({ result, sources, unit = "K" }: { result: EvaluateResult; sources: SourcesDto | null; unit?: DisplayUnit }) {
  const info = result.equilibriumInfo!;
  return (
    <section className="space-y-3" data-testid="report-equilibrium">
      <h2 className="text-sm font-semibold">Equilibrium outlet</h2>
      <p className="text-xs">
        Feed ({info.feedUnit}):{" "}
        {Object.entries(info.feed)
          .map(([k, v]) => `${k} ${v}`)
          .join(", ")}{" "}
        · pressure {info.pressureBar} bar · key {info.key}
        {info.reactions.length > 1 ? ` · reactions: ${info.reactions.join("; ")}` : ""}.
      </p>
      <EquilibriumResults result={result} compact unit={unit} />
      <p className="text-xs text-ink-soft" data-testid="equilibrium-caution">
        {equilibriumCautionText(cautionGasOf(result))}
      </p>
      {sources && (
        <div className="break-inside-avoid">
          <SourceComparisonView data={sources} compact />
          <p className="mt-1 text-xs text-ink-muted">Computed when this report was printed from the approved versions of each family; not part of the snapshot.</p>
        </div>
      )}
    </section>
  );
}
