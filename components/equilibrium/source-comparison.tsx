"use client";

import { CompositionChart, type CompositionSeries } from "@/components/charts/composition-chart";
import { DataTable } from "@/components/ui/table";
import type { FamilyOptionDto } from "@/lib/services/equilibrium";
import type { SourceComparison } from "@/lib/thermo/sources";
import { colorOf } from "./series";

export type SourcesDto = { families: FamilyOptionDto[]; comparison: SourceComparison | null; message: string | null };

const num = (x: number | null | undefined, digits = 4) => (x === null || x === undefined ? "—" : String(Number(x.toPrecision(digits))));
const pct = (x: number | null | undefined, digits = 3) => (x === null || x === undefined ? "—" : `${Number((100 * x).toPrecision(digits))} %`);

type Shown = { s: SourceComparison["spread"][number]; i: number };

/** One case run with every approved data family that covers its species: the spread of ΔrG, log10 K and the key outlet fraction. */
export function SourceComparisonView({ data, compact = false }: { data: SourcesDto; compact?: boolean }) {
  if (!data.comparison) {
    return (
      <p className="rounded-md bg-paper-deep px-3 py-2 text-sm" data-testid="sources-message">
        {data.message}
      </p>
    );
  }
  const { variants, spread } = data.comparison;
  const eq = variants[0].result.equilibrium;
  const key = variants[0].result.equilibriumInfo?.key;
  const series: CompositionSeries[] = variants.map((v, i) => ({ key: v.label, name: v.label, color: colorOf(i) }));
  const rows = spread.map((s, i) => {
    const row: Record<string, number | null> = { tK: s.tK };
    for (const v of variants) row[v.label] = v.result.equilibrium?.[i].keyFraction ?? null;
    return row;
  });
  const stride = Math.max(1, Math.ceil(spread.length / 16));
  const shown = spread.map((s, i) => ({ s, i })).filter(({ i }) => i % stride === 0 || i === spread.length - 1);
  const worstLogK = spread.reduce((a, s) => Math.max(a, s.log10K.range), 0);
  return (
    <section className="space-y-3" data-testid="sources">
      <h3 className="text-sm font-semibold">Data families side by side</h3>
      <ul className="text-xs text-ink-muted">
        {data.families.map((f) => (
          <li key={f.family}>
            <strong className="text-ink-soft">{f.family}</strong>: {f.versions.map((v) => `${v.key} ${v.modelName} v${v.versionNumber}`).join("; ")}
          </li>
        ))}
      </ul>
      <p className="text-sm">
        Largest spread of log10 K between families: <strong data-testid="sources-logk-spread">{num(worstLogK, 3)}</strong>
        {eq && spread[0].keyFraction ? (
          <>
            ; of the {key} outlet fraction: <strong>{pct(spread.reduce((a, s) => Math.max(a, s.keyFraction?.range ?? 0), 0))}</strong> (absolute)
          </>
        ) : null}
        .
      </p>
      {eq && <CompositionChart data={rows} series={series} yLabel="mole fraction" testId="sources-chart" ariaLabel={`${key} outlet fraction per data family`} height={240} />}
      <div className="overflow-x-auto">
        <DataTable
          look="numbers"
          nowrap
          dense={compact}
          testId="sources-table"
          columns={[
            { key: "t", header: "T (K)", cell: ({ s }) => num(s.tK, 6) },
            ...variants.map((v) => ({ key: `k:${v.label}`, header: `log10 K ${v.label}`, cell: ({ i }: Shown) => v.result.points[i].log10K.toFixed(4) })),
            { key: "spread", header: "spread", cell: ({ s }) => s.log10K.range.toFixed(4) },
            ...(eq ? variants.map((v) => ({ key: `x:${v.label}`, header: `${key} ${v.label}`, cell: ({ i }: Shown) => pct(v.result.equilibrium?.[i].keyFraction) })) : []),
            !!eq && { key: "xspread", header: "spread", cell: ({ s }) => pct(s.keyFraction?.range) },
          ]}
          rows={shown}
          rowKey={({ s }) => s.tK}
        />
      </div>
    </section>
  );
}
