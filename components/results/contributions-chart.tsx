"use client";

import { useMemo } from "react";
import { CHART_COLORS } from "@/components/charts/colors";
import { StackedAreaChart, type StackSeries } from "@/components/charts/stacked-area-chart";
import { colorOf } from "@/components/equilibrium/series";
import { columnOf, contributionSeries } from "@/lib/cases/contributions";
import { UNIT_LABELS, formatTemperature, fromKelvin, niceTicks, type DisplayUnit } from "@/lib/cases/display-unit";
import { fixed } from "@/lib/cases/format";
import type { EvaluateResult } from "@/lib/thermo/evaluate";

/**
 * Which species' heat capacity pulls ΔrG away from the naive line, and by how much: the
 * engine's `contributions`, stacked per species, summing to corrected − naive.
 */
export function ContributionsChart({ result, compact = false, unit = "K" }: { result: EvaluateResult; compact?: boolean; unit?: DisplayUnit }) {
  const s = useMemo(() => contributionSeries(result), [result]);
  // Rows stay in kelvin; the axis reads in the page's display unit like the other charts.
  const axis = useMemo(() => {
    if (!s) return null;
    const withT = (rows: Record<string, number>[]) => rows.map((r) => ({ ...r, t: fromKelvin(r.tK, unit) }));
    const rows = withT(s.rows);
    const lo = rows.length ? rows[0].t : 0;
    const hi = rows.length ? rows[rows.length - 1].t : 0;
    const ticks = niceTicks(lo, hi, 6).filter((t) => t >= lo - 1e-9 && t <= hi + 1e-9);
    return { rows, sigmaRows: s.sigmaRows ? withT(s.sigmaRows) : null, ticks, label: `T (${UNIT_LABELS[unit]})` };
  }, [s, unit]);
  const panel = "rounded-lg border border-ink-line bg-white p-3 break-inside-avoid print:border-ink-line";
  if (!s || !axis) {
    return (
      <section className={panel} data-testid="contributions-missing">
        <h3 className="mb-1 text-sm font-semibold text-ink">Where the naive error comes from</h3>
        <p className="text-xs text-ink-muted">
          This snapshot was frozen before the engine split the error by species; a frozen result is never recomputed. A new revision (or a draft) shows it.
        </p>
      </section>
    );
  }
  const series: StackSeries[] = s.species.map((k, i) => ({ key: columnOf(i), name: k, color: colorOf(i) }));
  const w = s.worst;
  return (
    <section className={panel} data-testid="contributions">
      <h3 className="mb-1 text-sm font-semibold text-ink">Where the naive error comes from, species by species</h3>
      <p className="mb-2 text-xs text-ink-muted">
        Each band is one species&apos; ν·[(H(T) − H(Tref)) − T·(S(T) − S(Tref))]: what its heat capacity adds between Tref and T that the naive line leaves out. Bands above zero
        push the corrected ΔrG up, bands below pull it down; together they make the black line, corrected − naive.
      </p>
      {w && w.shares.length > 0 && Math.abs(w.totalKJ) > 0 && (
        <p className="mb-2 text-xs text-ink-soft" data-testid="contributions-headline">
          At {formatTemperature(w.tK, unit, 2)}, where the gap is widest ({fixed(w.totalKJ, 3)} kJ/mol), the largest share is <strong>{w.shares[0].key}</strong> with{" "}
          {fixed(w.shares[0].kJ, 3)} kJ/mol
          {w.shares.length > 1
            ? `; then ${w.shares
                .slice(1)
                .map((x) => `${x.key} ${fixed(x.kJ, 3)}`)
                .join(", ")} kJ/mol`
            : ""}
          .
        </p>
      )}
      <StackedAreaChart
        testId="chart-contributions"
        ariaLabel="Contribution of each species to corrected minus naive reaction Gibbs energy, stacked, against temperature"
        data={axis.rows}
        xKey="t"
        xLabel={axis.label}
        xTicks={axis.ticks}
        series={series}
        total={{ key: "total", name: "corrected − naive", color: CHART_COLORS.ink }}
        yLabel="share of ΔrG gap (kJ/mol)"
        height={compact ? 220 : 300}
      />
      {axis.sigmaRows && (
        <div className="mt-3" data-testid="contributions-sigma">
          <h4 className="mb-1 text-xs font-semibold text-ink">The 1σ band of ΔrG, split the same way</h4>
          <p className="mb-1 text-xs text-ink-muted">
            Each species&apos; share of the variance, (ν·σᵢ)²/σ, so the bands add up to the 1σ of the corrected ΔrG (black line). A species without a stated uncertainty has no
            band.
          </p>
          <StackedAreaChart
            testId="chart-contributions-sigma"
            ariaLabel="Share of each species in the one-sigma uncertainty of the reaction Gibbs energy"
            data={axis.sigmaRows!}
            xKey="t"
            xLabel={axis.label}
            xTicks={axis.ticks}
            series={series}
            total={{ key: "total", name: "1σ of ΔrG", color: CHART_COLORS.ink }}
            yLabel="share of 1σ (kJ/mol)"
            height={compact ? 180 : 220}
          />
        </div>
      )}
    </section>
  );
}
