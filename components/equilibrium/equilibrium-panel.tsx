"use client";

import dynamic from "next/dynamic";
import { useRouter } from "next/navigation";
import { useState } from "react";
import useSWR, { useSWRConfig } from "swr";
import { Caution } from "@/components/results/caution";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { Field, Select, TextInput, inputClass } from "@/components/ui/field";
import { cautionGasOf, equilibriumCautionText } from "@/lib/cases/caution";
import { checkEquilibriumForm, checkReactionLine, checkSpeciesKey, FEED_UNIT_HINT } from "@/lib/cases/equilibrium-form";
import { warningMeaning } from "@/lib/cases/warnings";
import type { ResultsDto } from "@/lib/services/cases";
import type { PinOptionDto } from "@/lib/services/pins";
import type { EvaluateResult } from "@/lib/thermo/evaluate";
import type { CaseEquilibrium, ExtraTerm } from "@/lib/validation/equilibrium";
import type { SourcesDto } from "./source-comparison";
import { CondensationNote } from "./condensation-note";

// Charts load only once there is something to draw, keeping recharts out of the page's first load.
const EquilibriumResults = dynamic(() => import("./equilibrium-results").then((m) => m.EquilibriumResults), { ssr: false });
const SourceComparisonView = dynamic(() => import("./source-comparison").then((m) => m.SourceComparisonView), { ssr: false });

type ApiError = { code: string; message: string; details?: { fields?: Record<string, string> } };

async function fetchJson<T>(url: string): Promise<T> {
  const res = await fetch(url, { headers: { accept: "application/json" } });
  const body = await res.json().catch(() => null);
  if (!res.ok) throw (body?.error as ApiError) ?? { code: "http", message: `Request failed (${res.status}).` };
  return body as T;
}

async function send<T>(method: string, url: string, body: unknown): Promise<T> {
  const res = await fetch(url, { method, headers: { "content-type": "application/json", accept: "application/json" }, body: JSON.stringify(body) });
  const data = await res.json().catch(() => null);
  if (!res.ok) throw (data?.error as ApiError) ?? { code: "http", message: `Request failed (${res.status}).` };
  return data as T;
}

/** Species keys of a reaction text ("2 H2(g) + O2(g) -> 2 H2O(g)" → H2(g), O2(g), H2O(g)). */
export function keysOfReaction(text: string): string[] {
  return text
    .split(/->|=/)
    .flatMap((side) => side.split("+"))
    .map((t) => t.trim().replace(/^(\d+(?:\.\d+)?(?:\/\d+)?|\.\d+)\s*\*?\s*/, ""))
    .filter(Boolean);
}

const markerless = (key: string) => {
  const m = /^(.*?)(?:\((cr(?:-[A-Za-z0-9_.]+)?|l|g)\))?$/.exec(key)!;
  return { formula: m[1], phase: m[2] ?? null };
};

type Row = { key: string; amount: string };

/**
 * The API's refusal → messages keyed by the panel's field names (`feed.<key>`, `feedUnit`,
 * `pressure`, `key`, `reactions.<i>`), in plain words without field paths; what names no field
 * comes back as `_`.
 */
export function panelErrors(error: ApiError): Record<string, string> {
  const out: Record<string, string> = {};
  const sentence = (m: string) => {
    const t = m.trim();
    return t ? `${t[0].toUpperCase()}${t.slice(1)}${/[.!?]$/.test(t) ? "" : "."}` : t;
  };
  const place = (path: string, message: string) => {
    const p = path.replace(/^equilibrium\./, "").replace(/\[(\d+)\]/g, ".$1").replace(/^pressureBar/, "pressure");
    const field = /^(feedUnit|pressure|key|feed(\..+)?|reactions\.\d+)$/.test(p) ? p : null;
    if (field && !out[field]) out[field] = sentence(message);
    return field !== null;
  };
  let placed = false;
  for (const [f, m] of Object.entries(error.details?.fields ?? {})) placed = place(f, m) || placed;
  if (!placed) {
    const missing = /^species "(.+)" is used in equilibrium\.reactions\[(\d+)\]/.exec(error.message);
    const pathed = /^(equilibrium\.[A-Za-z]+(?:\[\d+\])?): (.*)$/.exec(error.message);
    if (missing) placed = place(`reactions.${missing[2]}`, `${missing[1]} has no model version: pick one below, or check the spelling`);
    else if (pathed) placed = place(pathed[1], pathed[2].replace(/^reaction "[^"]*": /, ""));
  }
  if (!placed) out._ = sentence(error.message.replace(/^[A-Za-z.[\]0-9]+: /, ""));
  return out;
}

/**
 * The equilibrium panel of a case: feed, pressure and key species (and optionally a
 * simultaneous set), the saved result from the case's results (snapshot or live), trial runs,
 * and the comparison of data families.
 */
export function EquilibriumPanel({
  caseId,
  revision,
  canEdit,
  lockVersion,
  initial,
  caseKeys,
  reactantKeys,
}: {
  caseId: number;
  revision?: number;
  canEdit: boolean;
  lockVersion: number;
  initial: CaseEquilibrium | null;
  caseKeys: string[];
  reactantKeys: string[];
}) {
  const router = useRouter();
  const { mutate } = useSWRConfig();
  const resultsKey = `/api/v1/cases/${caseId}/results${revision ? `?revision=${revision}` : ""}`;
  const { data } = useSWR<ResultsDto, ApiError>(resultsKey, fetchJson, { revalidateOnFocus: false });

  const [rows, setRows] = useState<Row[]>(() => {
    const feed = initial?.feed ?? Object.fromEntries(caseKeys.map((k) => [k, reactantKeys.includes(k) ? 1 : 0]));
    const keys = [...new Set([...caseKeys, ...Object.keys(feed)])];
    return keys.map((k) => ({ key: k, amount: String(feed[k] ?? 0) }));
  });
  const [unit, setUnit] = useState(initial?.feedUnit ?? "mol");
  const [pressure, setPressure] = useState(String(initial?.pressure ?? "1 bar"));
  const [key, setKey] = useState(initial?.key ?? reactantKeys[0] ?? caseKeys[0]);
  const [reactionsText, setReactionsText] = useState((initial?.reactions ?? []).join("\n"));
  const [extraPins, setExtraPins] = useState<Record<string, number>>(() =>
    Object.fromEntries((initial?.extraTerms ?? []).map((t) => [t.phase ? `${t.formula}(${t.phase})` : t.formula, t.versionId])),
  );
  const [gasModel, setGasModel] = useState<"ideal" | "peng-robinson">(initial?.gas ?? "ideal");
  const [inletK, setInletK] = useState(initial?.adiabaticInletK === null || initial?.adiabaticInletK === undefined ? "" : String(initial.adiabaticInletK));
  const [newKey, setNewKey] = useState("");
  const [trial, setTrial] = useState<EvaluateResult | null>(null);
  const [busy, setBusy] = useState<string | null>(null);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [saved, setSaved] = useState<string | null>(null);
  const [sources, setSources] = useState<SourcesDto | null>(null);

  const reactions = reactionsText.split("\n").map((l) => l.trim()).filter(Boolean);
  const reactionErrors = reactions.flatMap((_, i) => (errors[`reactions.${i}`] ? [`Line ${i + 1}: ${errors[`reactions.${i}`]}`] : []));
  // Species come only from lines that read as reactions; a malformed line is flagged, not mined for names.
  const reactionKeys = [...new Set(reactions.filter((r) => checkReactionLine(r) === null).flatMap(keysOfReaction))].filter((k) => !caseKeys.includes(k));
  // Inert species carry heat in the adiabatic balance, so they need a pinned model version too.
  const inertKeys = rows.map((r) => r.key).filter((k) => !caseKeys.includes(k) && !reactionKeys.includes(k));
  const extraKeys = [...reactionKeys, ...(inletK.trim() ? inertKeys : [])];
  const feedKeys = [...new Set([...rows.map((r) => r.key), ...extraKeys])];

  const equilibrium = (): CaseEquilibrium => {
    const amounts = new Map(rows.map((r) => [r.key, Number(r.amount)]));
    const feed: Record<string, number> = {};
    for (const k of feedKeys) feed[k] = Number.isFinite(amounts.get(k)) ? amounts.get(k)! : 0;
    const extraTerms: ExtraTerm[] = extraKeys.map((k) => ({ ...markerless(k), versionId: extraPins[k] ?? 0 }));
    const p = pressure.trim();
    const isNumber = (v: string) => /^[-+]?\d*\.?\d+(e[-+]?\d+)?$/i.test(v);
    const t = inletK.trim();
    return {
      feed,
      feedUnit: unit.trim() || "mol",
      pressure: isNumber(p) ? Number(p) : p,
      key: key || null,
      reactions,
      extraTerms,
      ...(gasModel === "peng-robinson" ? { gas: gasModel } : {}),
      ...(t ? { adiabaticInletK: isNumber(t) ? Number(t) : t } : {}),
      // Feed rows that are in no reaction were added as inert species: say so, or the server refuses them.
      inert: feedKeys.filter((k) => !caseKeys.includes(k) && !extraKeys.includes(k)),
    };
  };

  const run = async (what: "trial" | "save" | "clear" | "sources") => {
    setSaved(null);
    if (what === "trial" || what === "save") {
      // Every field is checked at once; nothing is sent while any is wrong.
      const found = checkEquilibriumForm({ amounts: Object.fromEntries(feedKeys.map((k) => [k, rows.find((r) => r.key === k)?.amount ?? "0"])), feedUnit: unit, pressure, key, reactions });
      // An inert still waiting in its field to be added keeps its message.
      const inert = newKey.trim() ? checkSpeciesKey(newKey) : null;
      if (inert) found.inert = inert;
      setErrors(found);
      if (Object.keys(found).length) return;
    } else setErrors({});
    setBusy(what);
    try {
      if (what === "trial") {
        setTrial(await send<EvaluateResult>("POST", "/api/v1/equilibrium/preview", { caseId, equilibrium: equilibrium() }));
      } else if (what === "save" || what === "clear") {
        await send("PUT", `/api/v1/equilibrium/cases/${caseId}`, { lockVersion, equilibrium: what === "clear" ? null : equilibrium() });
        setTrial(null);
        setSaved(what === "clear" ? "Equilibrium removed from the case." : "Saved to the case.");
        await mutate(resultsKey);
        router.refresh();
      } else if (data) {
        const shown = trial ?? data.result;
        const eqReq = trial
          ? { feed: equilibrium().feed, feedUnit: unit, pressureBar: equilibrium().pressure, key: key || undefined, ...(reactions.length ? { reactions } : {}), ...(gasModel === "peng-robinson" ? { gas: gasModel } : {}) }
          : data.request.equilibrium;
        const keys = [...new Set([...Object.keys(data.request.species), ...(trial ? extraKeys : [])])];
        setSources(
          await send<SourcesDto>("POST", "/api/v1/equilibrium/sources", {
            reaction: data.request.reaction,
            species: Object.fromEntries(keys.map((k) => [k, {}])),
            temperatures: data.request.temperatures,
            referenceK: data.request.referenceK,
            ...(shown.equilibrium && eqReq ? { equilibrium: eqReq } : {}),
          }),
        );
      }
    } catch (e) {
      setErrors(panelErrors(e as ApiError));
    } finally {
      setBusy(null);
    }
  };

  const shown = trial ?? data?.result ?? null;
  const hasSaved = Boolean(data?.result.equilibrium);
  const editable = canEdit && data?.source !== "snapshot";

  return (
    <Card title="How far it goes: equilibrium outlet" className="break-inside-avoid">
      <div className="space-y-4" data-testid="equilibrium-panel">
        <p className="text-sm text-ink-muted">
          Outlet composition from a feed at each temperature of the case, with ideal-gas activities (or Peng–Robinson fugacity coefficients) at the given
          pressure and pure condensed phases at unit activity, once with the corrected K and once with the naive K; optionally the adiabatic outlet temperature.
        </p>
        {editable ? (
          <form
            className="grid gap-4 lg:grid-cols-[minmax(0,1fr)_minmax(0,1fr)]"
            onSubmit={(e) => {
              e.preventDefault();
              void run("trial");
            }}
          >
            <fieldset className="space-y-2">
              <legend className="mb-1 text-sm font-medium text-ink-soft">Feed</legend>
              <div className="space-y-2" data-testid="feed-rows">
                {feedKeys.map((k) => {
                  const row = rows.find((r) => r.key === k);
                  const id = `feed-${k.replace(/[^A-Za-z0-9]/g, "_")}`;
                  const bad = errors[`feed.${k}`];
                  return (
                    <div key={k}>
                    <div className="flex items-center gap-2">
                      <label htmlFor={id} className="w-28 shrink-0 truncate text-sm font-medium" title={k}>
                        {k}
                      </label>
                      <input
                        id={id}
                        name={id}
                        type="text"
                        inputMode="decimal"
                        className={inputClass}
                        aria-invalid={bad ? true : undefined}
                        aria-describedby={bad ? `${id}-error` : undefined}
                        value={row?.amount ?? "0"}
                        onChange={(e) => {
                          const v = e.target.value;
                          setErrors(({ [`feed.${k}`]: _gone, feed: _none, ...rest }) => rest);
                          setRows((rs) => (rs.some((r) => r.key === k) ? rs.map((r) => (r.key === k ? { ...r, amount: v } : r)) : [...rs, { key: k, amount: v }]));
                        }}
                      />
                      <span className="w-16 shrink-0 text-xs text-ink-muted">{unit}</span>
                      {!caseKeys.includes(k) && !extraKeys.includes(k) && (
                        <button type="button" className="text-xs text-flag-700 underline" onClick={() => setRows((rs) => rs.filter((r) => r.key !== k))} aria-label={`Remove ${k}`}>
                          remove
                        </button>
                      )}
                    </div>
                    {bad && (
                      <p id={`${id}-error`} role="alert" className="ml-[7.5rem] mt-0.5 text-xs font-medium text-flag-700">
                        {bad}
                      </p>
                    )}
                    </div>
                  );
                })}
              </div>
              {errors.feed && (
                <p role="alert" className="text-xs font-medium text-flag-700">
                  {errors.feed}
                </p>
              )}
              <div className="flex items-start gap-2">
                <div className="grow">
                  <Field label="Inert species (rides along, e.g. N2(g))" name="inert" error={errors.inert}>
                    <TextInput
                      name="inert"
                      value={newKey}
                      error={errors.inert}
                      onChange={(e) => {
                        setNewKey(e.target.value);
                        setErrors(({ inert: _gone, ...rest }) => rest);
                      }}
                      placeholder="N2(g)"
                    />
                  </Field>
                </div>
                <Button
                  type="button"
                  variant="secondary"
                  className="mt-6"
                  onClick={() => {
                    const k = newKey.trim();
                    const bad = checkSpeciesKey(k) ?? (feedKeys.includes(k) ? `${k} is already in the feed.` : null);
                    if (bad) {
                      setErrors((e) => ({ ...e, inert: bad }));
                      return;
                    }
                    setRows((rs) => [...rs, { key: k, amount: "0" }]);
                    setNewKey("");
                  }}
                >
                  Add
                </Button>
              </div>
            </fieldset>
            <div className="space-y-3">
              <div className="grid grid-cols-2 gap-3">
                <Field label="Unit of amount" name="feedUnit" error={errors.feedUnit} hint={`${FEED_UNIT_HINT}; moles come back in the same unit.`}>
                  <TextInput name="feedUnit" value={unit} error={errors.feedUnit} onChange={(e) => { setUnit(e.target.value); setErrors(({ feedUnit: _gone, ...rest }) => rest); }} />
                </Field>
                <Field label="Pressure" name="pressure" error={errors.pressure} hint="bar, or with a unit: 2.5 MPa, 30 atm">
                  <TextInput name="pressure" value={pressure} error={errors.pressure} onChange={(e) => { setPressure(e.target.value); setErrors(({ pressure: _gone, ...rest }) => rest); }} />
                </Field>
              </div>
              <div className="grid grid-cols-2 gap-3">
                <Field label="Gas model" name="gasModel" hint="Peng–Robinson applies fugacity coefficients; it needs critical constants (the library has them for its reference species).">
                  <Select name="gasModel" value={gasModel} onChange={(e) => setGasModel(e.target.value === "peng-robinson" ? "peng-robinson" : "ideal")}>
                    <option value="ideal">Ideal gas (φ = 1)</option>
                    <option value="peng-robinson">Peng–Robinson</option>
                  </Select>
                </Field>
                <Field label="Adiabatic inlet temperature (optional)" name="adiabaticInletK" hint="K, or with a unit: 327 degC. Inert species then need a model version.">
                  <TextInput name="adiabaticInletK" value={inletK} onChange={(e) => setInletK(e.target.value)} placeholder="e.g. 600" />
                </Field>
              </div>
              <Field label="Key species (conversion and slip)" name="key" error={errors.key}>
                <Select name="key" value={key} error={errors.key} onChange={(e) => { setKey(e.target.value); setErrors(({ key: _gone, ...rest }) => rest); }}>

                  {feedKeys.map((k) => (
                    <option key={k} value={k}>
                      {k}
                    </option>
                  ))}
                </Select>
              </Field>
              <Field
                label="Simultaneous reactions (optional, one per line)"
                name="reactions"
                error={reactionErrors.length ? reactionErrors.join(" ") : undefined}
                hint="Empty: the case's own reaction. Give independent reactions, e.g. reforming and shift."
              >
                <textarea
                  id="reactions"
                  name="reactions"
                  rows={3}
                  className={inputClass}
                  aria-invalid={reactionErrors.length ? true : undefined}
                  aria-describedby={reactionErrors.length ? "reactions-error" : undefined}
                  value={reactionsText}
                  onChange={(e) => {
                    setReactionsText(e.target.value);
                    setErrors((er) => Object.fromEntries(Object.entries(er).filter(([f]) => !f.startsWith("reactions."))));
                  }}
                  placeholder="e.g. CO(g) + H2O(g) -> CO2(g) + H2(g)"
                />
              </Field>
              {extraKeys.map((k) => (
                <ExtraPin key={k} speciesKey={k} inert={!reactionKeys.includes(k)} value={extraPins[k]} onChange={(v) => setExtraPins((p) => ({ ...p, [k]: v }))} />
              ))}
              <div className="flex flex-wrap gap-2">
                <Button type="submit" focusableWhenDisabled disabled={busy !== null}>
                  {busy === "trial" ? "Solving…" : "Solve"}
                </Button>
                <Button type="button" variant="secondary" focusableWhenDisabled disabled={busy !== null} onClick={() => void run("save")}>
                  {busy === "save" ? "Saving…" : "Save to case"}
                </Button>
                {hasSaved && (
                  <Button type="button" variant="ghost" focusableWhenDisabled disabled={busy !== null} onClick={() => void run("clear")}>
                    Remove from case
                  </Button>
                )}
              </div>
            </div>
          </form>
        ) : (
          !hasSaved && <p className="text-sm text-ink-muted">This case has no equilibrium feed{canEdit ? "" : "; its author can add one while it is a draft"}.</p>
        )}

        {Object.keys(errors).length > 0 && (
          <div role="alert" className="rounded-md border border-flag-600/30 bg-flag-50 px-3 py-2 text-sm text-flag-700" data-testid="equilibrium-error">
            {errors._ ?? "Nothing was solved: fix the marked fields."}
          </div>
        )}
        {saved && (
          <p role="status" className="text-sm text-moss-700">
            {saved}
          </p>
        )}

        {shown?.equilibrium && (
          <>
            <div className="flex flex-wrap items-center justify-between gap-2">
              {trial ? <Badge tone="ember">Trial run, not saved</Badge> : <Badge tone={data?.source === "snapshot" ? "moss" : "frost"}>{data?.source === "snapshot" ? `Frozen snapshot · revision ${data.revision}` : "Saved feed · live evaluation"}</Badge>}
              <Button type="button" variant="secondary" focusableWhenDisabled disabled={busy !== null} onClick={() => void run("sources")} data-testid="compare-sources">
                {busy === "sources" ? "Comparing…" : "Compare data families"}
              </Button>
            </div>
            <EquilibriumResults result={shown} />
            <CondensationNote result={shown} />
            <WarningCodes result={shown} />
          </>
        )}
        {sources && <SourceComparisonView data={sources} />}
        <p className="rounded-md border border-ember-100 bg-ember-50 px-3 py-2 text-xs leading-relaxed text-ember-700" data-testid="equilibrium-caution">
          {equilibriumCautionText(cautionGasOf(shown))}
        </p>
        <Caution gas={cautionGasOf(shown)} />
      </div>
    </Card>
  );
}

function WarningCodes({ result }: { result: EvaluateResult }) {
  const high = result.warnings.find((w) => w.code === "high-pressure");
  const nc = result.warnings.find((w) => w.code === "equilibrium-not-converged");
  const liquid = result.warnings.find((w) => w.code === "real-gas-liquid-root");
  // With a real gas the fugacity coefficients are applied, so the high-pressure caution no longer applies as written.
  const showHigh = high && result.equilibriumInfo?.gas !== "peng-robinson";
  if (!showHigh && !nc && !liquid) return null;
  return (
    <ul className="space-y-1 text-xs text-flag-700" data-testid="equilibrium-warnings">
      {showHigh && (
        <li>
          <code>high-pressure</code> {high.message}
          <span className="block text-ink-muted">{warningMeaning("high-pressure")}</span>
        </li>
      )}
      {liquid && (
        <li>
          <code>real-gas-liquid-root</code> {liquid.message}
        </li>
      )}
      {nc && (
        <li>
          <code>equilibrium-not-converged</code> {nc.message}
          <span className="block text-ink-muted">{warningMeaning("equilibrium-not-converged")}</span>
        </li>
      )}
    </ul>
  );
}

function ExtraPin({ speciesKey, inert, value, onChange }: { speciesKey: string; inert: boolean; value?: number; onChange: (versionId: number) => void }) {
  const { formula } = markerless(speciesKey);
  const { data } = useSWR<{ versions: PinOptionDto[] }>(`/api/v1/pins?formula=${encodeURIComponent(formula)}`, fetchJson, { revalidateOnFocus: false });
  const options = data?.versions ?? [];
  const name = `pin-${speciesKey.replace(/[^A-Za-z0-9]/g, "_")}`;
  return (
    <Field label={`Model version for ${speciesKey} (${inert ? "inert; carries heat in the adiabatic balance" : "only in the extra reactions"})`} name={name}>
      <Select name={name} value={value ?? ""} onChange={(e) => onChange(Number(e.target.value))}>
        <option value="">Pick a version…</option>
        {options.map((o) => (
          <option key={o.versionId} value={o.versionId}>
            {o.modelName} · v{o.versionNumber} · {o.status}
          </option>
        ))}
      </Select>
    </Field>
  );
}
