import { fixed } from "@/lib/cases/format";
import type { EvaluateResult } from "@/lib/thermo/evaluate";

/**
 * The report's columns: each species' share of corrected − naive ΔrG (kJ/mol) at the summary
 * rows, and their sum. Rows are the caller's (the same stride as the table summary).
 */
export function ContributionsTable({ result, rowIndexes }: { result: EvaluateResult; rowIndexes: number[] }) {
  const c = result.contributions;
  if (!c) {
    return <p className="text-xs text-ink-muted" data-testid="report-contributions-missing">This snapshot was frozen before the engine split the error by species; it is not recomputed.</p>;
  }
  const keys = Object.keys(c);
  const sigma = result.contributionsSigma;
  const th = "border-b border-ink-line px-2 py-1 text-right font-medium";
  const td = "px-2 py-0.5 text-right tabular";
  return (
    <>
      <table className="w-full text-xs" data-testid="report-contributions">
        <thead>
          <tr>
            <th className={th}>T (K)</th>
            {keys.map((k) => (
              <th key={k} className={th}>
                {k} (kJ/mol)
              </th>
            ))}
            <th className={th}>sum = corrected − naive (kJ/mol)</th>
            {sigma && <th className={th}>1σ of ΔrG (kJ/mol)</th>}
          </tr>
        </thead>
        <tbody>
          {rowIndexes.map((i) => {
            const p = result.points[i];
            return (
              <tr key={p.tK}>
                <td className={td}>{fixed(p.tK, 2)}</td>
                {keys.map((k) => (
                  <td key={k} className={td}>
                    {fixed(c[k][i], 3)}
                    {sigma ? <span className="text-ink-muted"> ({fixed(sigma[k][i], 3)})</span> : null}
                  </td>
                ))}
                <td className={td}>{fixed(-p.diffKJ, 3)}</td>
                {sigma && <td className={td}>{fixed(p.sigmaDGkJ, 3)}</td>}
              </tr>
            );
          })}
        </tbody>
      </table>
      <p className="mt-1 text-xs text-ink-muted">
        Each column is ν·[(H(T) − H(Tref)) − T·(S(T) − S(Tref))] of one species; they add up to corrected − naive ΔrG (the negative of the table summary&apos;s naive − corrected).
        {sigma ? " In brackets: the species' variance share of the 1σ of ΔrG, (ν·σᵢ)²/σ; these add up to the last column." : ""}
      </p>
    </>
  );
}
