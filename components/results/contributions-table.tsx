import { DataTable } from "@/components/ui/table";
import { fixed } from "@/lib/cases/format";
import type { EvaluateResult } from "@/lib/thermo/evaluate";

/**
 * The report's columns: each species' share of corrected − naive ΔrG (kJ/mol) at the summary
 * rows, and their sum. Rows are the caller's (the same stride as the table summary).
 */
export function ContributionsTable({ result, rowIndexes }: { result: EvaluateResult; rowIndexes: number[] }) {
  const c = result.contributions;
  if (!c) {
    return (
      <p className="text-xs text-ink-muted" data-testid="report-contributions-missing">
        This snapshot was frozen before the engine split the error by species; it is not recomputed.
      </p>
    );
  }
  const keys = Object.keys(c);
  const sigma = result.contributionsSigma;
  return (
    <>
      <DataTable
        look="numbers"
        testId="report-contributions"
        columns={[
          { key: "t", header: "T (K)", cell: (i) => fixed(result.points[i].tK, 2) },
          ...keys.map((k) => ({
            key: k,
            header: `${k} (kJ/mol)`,
            cell: (i: number) => (
              <>
                {fixed(c[k][i], 3)}
                {sigma ? <span className="text-ink-muted"> ({fixed(sigma[k][i], 3)})</span> : null}
              </>
            ),
          })),
          { key: "sum", header: "sum = corrected − naive (kJ/mol)", cell: (i) => fixed(-result.points[i].diffKJ, 3) },
          sigma && { key: "sigma", header: "1σ of ΔrG (kJ/mol)", cell: (i) => fixed(result.points[i].sigmaDGkJ, 3) },
        ]}
        rows={rowIndexes}
        rowKey={(i) => result.points[i].tK}
      />
      <p className="mt-1 text-xs text-ink-muted">
        Each column is ν·[(H(T) − H(Tref)) − T·(S(T) − S(Tref))] of one species; they add up to corrected − naive ΔrG (the negative of the table summary&apos;s naive − corrected).
        {sigma ? " In brackets: the species' variance share of the 1σ of ΔrG, (ν·σᵢ)²/σ; these add up to the last column." : ""}
      </p>
    </>
  );
}
