import { orNotFound, pageId } from "@/lib/pages";
import Link from "next/link";
import { CriticalConstants } from "@/components/library/critical-constants";
import { PropertyCharts } from "@/components/library/property-charts";
import { ScopeBadge, StatusBadge } from "@/components/library/status-badge";
import { Caution } from "@/components/results/caution";
import { buttonClass } from "@/components/ui/button";
import { Card, PageHeader } from "@/components/ui/card";
import { inputClass } from "@/components/ui/field";
import { requireUser } from "@/lib/auth/guards";
import { getActor } from "@/lib/auth/session";
import { getSpecies, getVersion, versionCurve } from "@/lib/services/library";
import { getSpeciesCritical } from "@/lib/services/species-critical";
import { defaultRange } from "@/lib/thermo/curve";
import { removeCriticalAction, saveCriticalAction } from "./actions";
import { FAMILY_LABELS } from "@/lib/validation/library";

type Props = { params: Promise<{ id: string }>; searchParams: Promise<Record<string, string | undefined>> };

const SHORT: Record<string, string> = { "nasa7-2015": "NASA-7 2015", "nasa7-gri30": "GRI 3.0", "shomate-janaf": "Shomate", measured: "fitted", custom: "team" };

const num = (s: string | undefined) => (s && Number.isFinite(Number(s)) && Number(s) > 0 ? Number(s) : undefined);

export default async function SpeciesPage({ params, searchParams }: Props) {
  const actor = requireUser(await getActor());
  const id = await pageId(params);
  const sp = await searchParams;
  const species = await orNotFound(getSpecies(actor, id));
  const critical = await getSpeciesCritical(actor, id);
  const all = species.models.flatMap((m) => m.versions.map((v) => ({ ...v, model: m })));
  const chosenId = num(sp.v) ?? all.find((v) => v.status === "approved")?.id ?? all[0]?.id;
  const chosen = all.find((v) => v.id === chosenId);
  const other = all.find((v) => v.id === num(sp.vs) && v.id !== chosenId);
  let curveError: string | null = null;
  let charts = null;
  if (chosen) {
    try {
      const full = await getVersion(actor, chosen.id);
      const [f, t] = defaultRange(full.data);
      const fromK = num(sp.from) ?? f;
      const toK = num(sp.to) ?? t;
      const a = await versionCurve(actor, chosen.id, { fromK, toK, points: 161, edges: !other });
      const b = other ? await versionCurve(actor, other.id, { fromK, toK, points: 161, edges: false }) : undefined;
      charts = { a, b, fromK, toK };
    } catch (e) {
      curveError = e instanceof Error ? e.message : "The curve could not be computed.";
    }
  }
  const label = (v: (typeof all)[number]) => `${v.model.name} v${v.versionNumber}`;
  // Short names for the legends, so they fit beside the curves.
  const short = (v: (typeof all)[number]) =>
    `${SHORT[v.model.family] ?? v.model.family}${v.model.variant ? ` ${v.model.variant}` : ""}${v.model.scope === "team" ? " (team)" : ""} v${v.versionNumber}`;
  const href = (q: Record<string, string | number | undefined>) =>
    `/library/species/${id}?${new URLSearchParams(
      Object.entries(q)
        .filter(([, v]) => v !== undefined)
        .map(([k, v]) => [k, String(v)]),
    )}`;
  return (
    <>
      <p className="mb-2 text-sm">
        <Link href="/library" className="text-frost-700 hover:underline">
          ← Library
        </Link>
      </p>
      <PageHeader
        title={`${species.formula} · ${species.displayName}`}
        lead={
          <>
            {Object.entries(species.elements)
              .map(([el, n]) => `${el} ${n}`)
              .join(", ")}{" "}
            · M = {species.molarMassGPerMol.toFixed(4)} g/mol · <ScopeBadge scope={species.scope} />
            {species.phasePoints && (
              <span className="mt-1 block text-xs" data-testid="phase-points">
                {species.phasePoints.boilingPointK !== null ? `Normal boiling point ${species.phasePoints.boilingPointK} K` : "No normal boiling point"}
                {species.phasePoints.triplePointK !== null ? ` · triple point ${species.phasePoints.triplePointK} K` : ""}
                {species.phasePoints.citation ? ` (${species.phasePoints.citation})` : ""}
              </span>
            )}
          </>
        }
      />
      <div className="grid gap-6 lg:grid-cols-[20rem_1fr]">
        <div className="space-y-4">
          <Card title="Critical constants (Peng–Robinson)">
            <CriticalConstants
              speciesId={id}
              critical={critical.critical}
              canEdit={critical.canEdit}
              scope={critical.scope}
              save={saveCriticalAction}
              remove={removeCriticalAction}
            />
          </Card>
          {species.models.map((m) => (
            <Card
              key={m.id}
              title={
                <span className="flex flex-wrap items-center gap-2">
                  {m.name} <ScopeBadge scope={m.scope} />
                </span>
              }
            >
              <p className="mb-2 text-xs text-ink-muted">{FAMILY_LABELS[m.family] ?? m.family}</p>
              <ul className="space-y-2" data-testid="version-list">
                {m.versions.map((v) => (
                  <li key={v.id} className={`rounded-md border px-2 py-1.5 text-sm ${v.id === chosenId ? "border-ember-500 bg-ember-50" : "border-ink-line"}`}>
                    <div className="flex flex-wrap items-center justify-between gap-2">
                      <Link href={href({ v: v.id, from: sp.from, to: sp.to })} className="font-medium hover:underline">
                        v{v.versionNumber}
                      </Link>
                      <StatusBadge status={v.status} short />
                    </div>
                    <div className="mt-1 flex flex-wrap gap-x-3 text-xs">
                      <Link className="text-frost-700 hover:underline" href={`/library/versions/${v.id}`}>
                        details
                      </Link>
                      {chosen && v.id !== chosenId && (
                        <Link className="text-frost-700 hover:underline" href={href({ v: chosenId, vs: v.id, from: sp.from, to: sp.to })}>
                          overlay on chosen
                        </Link>
                      )}
                    </div>
                  </li>
                ))}
              </ul>
            </Card>
          ))}
        </div>
        <Card
          title={
            chosen ? (
              <span className="flex flex-wrap items-center gap-2">
                {label(chosen)} <StatusBadge status={chosen.status} />
                {other && <span className="text-ink-muted">vs {label(other)}</span>}
              </span>
            ) : (
              "No versions yet"
            )
          }
          action={
            chosen && (
              <Link href={`/library/versions/${chosen.id}`} className={buttonClass("ghost")}>
                Open version
              </Link>
            )
          }
        >
          {chosen && (
            <form className="mb-4 flex flex-wrap items-end gap-3 text-sm" aria-label="Plot range">
              <input type="hidden" name="v" value={chosen.id} />
              {other && <input type="hidden" name="vs" value={other.id} />}
              <label className="space-y-1">
                <span className="block text-ink-soft">From (K)</span>
                <input name="from" inputMode="decimal" defaultValue={charts?.fromK} className={`${inputClass} w-28`} />
              </label>
              <label className="space-y-1">
                <span className="block text-ink-soft">To (K)</span>
                <input name="to" inputMode="decimal" defaultValue={charts?.toK} className={`${inputClass} w-28`} />
              </label>
              <button className={buttonClass("secondary")}>Replot</button>
              {other && (
                <Link className={buttonClass("ghost")} href={href({ v: chosen.id, from: sp.from, to: sp.to })}>
                  Remove overlay
                </Link>
              )}
            </form>
          )}
          {curveError && (
            <p role="alert" className="text-sm text-flag-700">
              {curveError}
            </p>
          )}
          {charts && <PropertyCharts a={charts.a} b={charts.b} labelA={short(chosen!)} labelB={other ? short(other) : undefined} />}
          {charts && charts.a.warnings.length > 0 && (
            <ul className="mt-3 space-y-1 text-xs text-ember-700">
              {charts.a.warnings.slice(0, 6).map((w, i) => (
                <li key={i}>
                  {w.code}: {w.message}
                </li>
              ))}
            </ul>
          )}
          <Caution className="mt-4" />
        </Card>
      </div>
    </>
  );
}
