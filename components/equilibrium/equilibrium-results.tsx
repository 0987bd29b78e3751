"use client";

import { CHART_COLORS } from "@/components/charts/colors";
import { CompositionChart, type CompositionSeries } from "@/components/charts/composition-chart";
import { useDisplayUnit } from "@/components/results/display-unit-context";
import { Badge } from "@/components/ui/badge";
import { DataTable } from "@/components/ui/table";
import { UNIT_LABELS, differenceFromKelvin, fromKelvin, gridValue, niceTicks, type DisplayUnit } from "@/lib/cases/display-unit";
import type { EvaluateResult } from "@/lib/thermo/evaluate";
import { colorOf, compositionRows, gasSpecies, keyRows } from "./series";

/** A fraction as a percentage with `digits` significant figures, trailing zeros kept so columns line up. */
const pct = (x: number | null | undefined, digits = 3) => (x === null || x === undefined ? "—" : x === 0 ? "0 %" : `${(100 * x).toPrecision(digits)} %`);
const plusMinus = (s: number | null | undefined) => (s ? ` ± ${pct(s, 2)}` : "");
const num = (x: number | null | undefined, digits = 4) => (x === null || x === undefined ? "—" : String(Number(x.toPrecision(digits))));

type EqPoint = NonNullable<EvaluateResult["equilibrium"]>[number];

/** At most this many table rows on screen; the CSV export has every point. */
const TABLE_ROWS = 24;

/**
 * Outlet composition against T, corrected against naive K, with ±1σ bands where the data
 * carry uncertainties. Presentational: takes an evaluate result with an `equilibrium` part.
 */
export function EquilibriumResults({ result, compact = false, unit: unitProp }: { result: EvaluateResult; compact?: boolean; unit?: DisplayUnit }) {
  // The case page's display unit (its switch sits above the results); the report passes its own.
  const shared = useDisplayUnit();
  const unit = unitProp ?? shared.unit;
  const eq = result.equilibrium;
  const info = result.equilibriumInfo;
  if (!eq || !info || eq.length === 0) return null;
  const key = info.key;
  const u = UNIT_LABELS[unit];
  const tText = (tK: number) => `${gridValue(tK, unit)} ${u}`;
  type Row = Record<string, number | [number, number] | null>;
  const inUnit = (rows: Row[]): Row[] => rows.map((r) => ({ ...r, t: fromKelvin(r.tK as number, unit) }));
  const lo = fromKelvin(eq[0].tK, unit);
  const hi = fromKelvin(eq[eq.length - 1].tK, unit);
  const axis = {
    xKey: "t",
    xLabel: `T (${u})`,
    xTicks: niceTicks(Math.min(lo, hi), Math.max(lo, hi), 6).filter((t) => t >= Math.min(lo, hi) - 1e-9 && t <= Math.max(lo, hi) + 1e-9),
  };
  const gas = gasSpecies(result);
  const comp: CompositionSeries[] = gas.flatMap((k, i) => [
    { key: `c:${k}`, name: `${k} corrected`, color: colorOf(i) },
    { key: `n:${k}`, name: `${k} naive`, color: colorOf(i), dashed: true },
  ]);
  const keySeries: CompositionSeries[] = [
    { key: "corrected", name: `${key} corrected`, color: CHART_COLORS.ember, bandKey: eq[0].sigma ? "correctedBand" : undefined },
    { key: "naive", name: `${key} naive`, color: CHART_COLORS.frost, dashed: true, bandKey: eq[0].naive.sigma ? "naiveBand" : undefined },
  ];
  const stride = Math.max(1, Math.ceil(eq.length / TABLE_ROWS));
  const rows = eq.filter((_, i) => i % stride === 0 || i === eq.length - 1);
  const over = info.naiveExceedsUncertaintyK;
  const notConverged = eq.filter((p) => !p.converged || !p.naive.converged).length;
  const worst = eq.reduce((a, p) => (Math.abs(p.keyFractionDiff) > Math.abs(a.keyFractionDiff) ? p : a), eq[0]);
  // The printed report keeps the key species' columns only; the other fractions are in the charts and the CSV.
  const others = compact ? [] : gas.filter((k) => k !== key);
  // "±1σ" only where the result carries uncertainties.
  const sigma = Boolean(eq[0].sigma || eq[0].naive.sigma);
  const pm = sigma ? " ±1σ" : "";
  return (
    <div className="space-y-4" data-testid="equilibrium-results">
      <div className="flex flex-wrap items-center gap-2 text-sm">
        <Badge tone="neutral">{info.pressureBar} bar</Badge>
        <Badge tone="neutral">key {key}</Badge>
        <Badge tone="neutral">feed in {info.feedUnit}</Badge>
        {info.reactions.length > 1 && <Badge tone="frost">{info.reactions.length} simultaneous reactions</Badge>}
        <Badge tone={info.gas === "peng-robinson" ? "ember" : "neutral"}>{info.gas === "peng-robinson" ? "Peng–Robinson gas" : "ideal gas"}</Badge>
        {notConverged > 0 ? <Badge tone="flag">{notConverged} points not converged</Badge> : <Badge tone="moss">converged at every T</Badge>}
      </div>
      <p className="text-sm text-ink-soft" data-testid="equilibrium-headline">
        Largest difference in the {key} outlet fraction: <strong>{pct(worst.keyFractionDiff)}</strong> (naive − corrected, absolute) at {tText(worst.tK)}
        {over !== undefined && (
          <>
            {"; "}
            {over.length === 0 ? (
              "the naive error stays within the data's own 1σ everywhere"
            ) : (
              <>
                the naive error exceeds the data&apos;s own 1σ at <strong>{over.length}</strong> of {eq.length} temperatures ({gridValue(over[0], unit)}
                {over.length > 1 ? `–${gridValue(over[over.length - 1], unit)}` : ""} {u})
              </>
            )}
          </>
        )}
        .
      </p>
      {info.reactions.length > 1 && (
        <ol className="list-decimal pl-5 text-xs text-ink-muted">
          {info.reactions.map((r) => (
            <li key={r}>{r}</li>
          ))}
        </ol>
      )}
      <div className={compact ? "grid grid-cols-2 gap-3" : "grid gap-4 lg:grid-cols-2"}>
        <div>
          <h3 className="mb-1 text-xs font-semibold text-ink-soft">
            {key} outlet mole fraction (gas){sigma ? ", ±1σ" : ""}
          </h3>
          <CompositionChart
            data={inUnit(keyRows(result))}
            {...axis}
            series={keySeries}
            yLabel="mole fraction"
            testId="equilibrium-key-chart"
            ariaLabel={`${key} outlet fraction against temperature, corrected and naive`}
            height={compact ? 200 : 260}
          />
        </div>
        <div>
          <h3 className="mb-1 text-xs font-semibold text-ink-soft">Outlet composition (gas): solid corrected, dashed naive</h3>
          <CompositionChart
            data={inUnit(compositionRows(result))}
            {...axis}
            series={comp}
            yLabel="mole fraction"
            testId="equilibrium-composition-chart"
            ariaLabel="Outlet mole fractions against temperature, corrected and naive"
            height={compact ? 200 : 260}
          />
        </div>
      </div>
      <div className="overflow-x-auto">
        <DataTable
          look="numbers"
          nowrap
          testId="equilibrium-table"
          columns={[
            { key: "t", header: `T (${u})`, headerTestId: "equilibrium-t-header", value: (p) => p.tK, cell: (p) => gridValue(p.tK, unit) },
            { key: "conv", header: `${key} conversion corrected`, cell: (p) => pct(p.keyConversion, 4) },
            { key: "convn", header: "naive", cell: (p) => pct(p.naive.keyConversion, 4) },
            {
              key: "x",
              header: `${key} fraction corrected${pm}`,
              cell: (p) => (
                <>
                  {pct(p.keyFraction)}
                  {plusMinus(p.sigma?.keyFraction)}
                </>
              ),
            },
            {
              key: "xn",
              header: `naive${pm}`,
              cell: (p) => (
                <>
                  {pct(p.naive.keyFraction)}
                  {plusMinus(p.naive.sigma?.keyFraction)}
                </>
              ),
            },
            {
              key: "diff",
              header: "naive − corrected",
              className: (p) => (p.naiveExceedsUncertainty ? "font-semibold text-flag-700" : undefined),
              cell: (p) => `${pct(p.keyFractionDiff)}${p.naiveExceedsUncertainty ? " *" : ""}`,
            },
            ...others.map((k) => ({ key: `y:${k}`, header: k, cell: (p: EqPoint) => pct(p.moleFractions[k]) })),
          ]}
          rows={rows}
          rowKey={(p) => p.tK}
        />
        <p className="mt-1 text-xs text-ink-muted">
          {rows.length < eq.length ? `One row in every ${stride} points, and the last; the CSV export has all ${eq.length}. ` : ""}
          Mole fractions of the gas phase; condensed species are pure phases at unit activity.{" "}
          {over !== undefined ? "* the naive error exceeds the 1σ of the corrected fraction." : ""}
        </p>
      </div>
      {info.gas === "peng-robinson" && <FugacityTable result={result} rows={rows} compact={compact} unit={unit} />}
      {result.adiabatic && <AdiabaticSummary result={result} unit={unit} />}
    </div>
  );
}

/** Fugacity coefficients of the corrected solution, and the ideal-gas key conversion beside the real-gas one. */
function FugacityTable({ result, rows, compact, unit }: { result: EvaluateResult; rows: NonNullable<EvaluateResult["equilibrium"]>; compact: boolean; unit: DisplayUnit }) {
  const key = result.equilibriumInfo!.key;
  const gas = gasSpecies(result);
  return (
    <div className="overflow-x-auto">
      <h3 className="mb-1 text-xs font-semibold text-ink-soft">Fugacity coefficients φ (Peng–Robinson, corrected K) and the ideal-gas answer beside</h3>
      <DataTable
        look="numbers"
        nowrap
        testId="fugacity-table"
        columns={[
          { key: "t", header: `T (${UNIT_LABELS[unit]})`, cell: (p) => gridValue(p.tK, unit) },
          { key: "z", header: "Z", cell: (p) => num(p.diagnostics.realGas?.z, 4) },
          ...gas.map((k) => ({ key: `phi:${k}`, header: `φ ${k}`, cell: (p: EqPoint) => num(p.fugacityCoefficients?.[k], 4) })),
          { key: "real", header: `${key} conversion real gas`, cell: (p) => pct(p.keyConversion, 4) },
          { key: "ideal", header: "ideal gas", cell: (p) => pct(p.ideal?.keyConversion, 4) },
          !compact && { key: "idealx", header: `${key} fraction ideal gas`, cell: (p) => pct(p.ideal?.moleFractions[key]) },
        ]}
        rows={rows}
        rowKey={(p) => p.tK}
      />
      <p className="mt-1 text-xs text-ink-muted">van der Waals one-fluid mixing with k_ij = 0 unless given; φ solved self-consistently with the outlet composition.</p>
    </div>
  );
}

/** Adiabatic outlet temperature, corrected against naive (constant ΔrH). */
function AdiabaticSummary({ result, unit }: { result: EvaluateResult; unit: DisplayUnit }) {
  const a = result.adiabatic!;
  const u = UNIT_LABELS[unit];
  // Temperatures to 0.01 of the unit; rises are differences (1 K = 1 °C = 1.8 °F).
  const t = (tK: number) => `${Number(fromKelvin(tK, unit).toFixed(2))} ${u}`;
  const d = (dK: number) => `${dK >= 0 ? "+" : "−"}${Number(Math.abs(differenceFromKelvin(dK, unit)).toFixed(2))} ${u}`;
  const key = result.equilibriumInfo!.key;
  return (
    <div className="rounded-md border border-ink-line bg-paper-deep px-3 py-2 text-sm" data-testid="adiabatic-summary">
      <h3 className="mb-1 text-xs font-semibold text-ink-soft">Adiabatic outlet (equilibrium at the outlet, no heat exchanged)</h3>
      <dl className="grid grid-cols-2 gap-x-4 gap-y-1 sm:grid-cols-4">
        <div>
          <dt className="text-xs text-ink-muted">Inlet</dt>
          <dd className="tabular">{t(a.inletK)}</dd>
        </div>
        <div>
          <dt className="text-xs text-ink-muted">Outlet, corrected</dt>
          <dd className="tabular font-semibold" data-testid="adiabatic-outlet">
            {t(a.outletK)} ({d(a.riseK)})
          </dd>
        </div>
        <div>
          <dt className="text-xs text-ink-muted">Outlet, naive (constant ΔrH)</dt>
          <dd className="tabular" data-testid="adiabatic-naive-outlet">
            {t(a.naiveOutletK)} ({d(a.naiveRiseK)})
          </dd>
        </div>
        <div>
          <dt className="text-xs text-ink-muted">{key} conversion at the outlet</dt>
          <dd className="tabular">
            {pct(a.outlet.keyConversion, 4)} · naive {pct(a.naiveOutlet.keyConversion, 4)}
          </dd>
        </div>
      </dl>
      <p className="mt-1 text-xs text-ink-muted">
        Naive − corrected: {d(a.diffK)}. Root bracketed in [{t(a.bracketK[0])}, {t(a.bracketK[1])}], {a.iterations} iterations; ideal-gas enthalpies (the residual enthalpy of a
        real gas is not included).
      </p>
    </div>
  );
}
