"use client";

import { useRouter } from "next/navigation";
import { useMemo, useState } from "react";
import { Button } from "@/components/ui/button";
import { Field, inputClass, Select, TextInput } from "@/components/ui/field";
import { elementBalance, reactionText, termKey } from "@/lib/cases/balance";
import { refreshCaseResults } from "@/components/results/use-case-results";
import { sendJson, settle } from "@/lib/api/client";
import { convertTyped, convertTypedList, joinQuantity, splitQuantity, TEMPERATURE_UNITS, UNIT_LABELS, type Quantity, type TemperatureUnit } from "@/lib/cases/temperature";
import { phaseForSpecies } from "@/lib/cases/phase-choice";
import { fieldErrorsOf } from "@/lib/cases/zod-errors";
import { caseInputSchema, type CaseInputs } from "@/lib/validation/cases";

/** What the builder needs of a pinnable version (PinOptionDto). */
export type BuilderOption = {
  versionId: number;
  formula: string;
  speciesName: string;
  modelName: string;
  versionNumber: number;
  status: string;
  phases: string[];
  tminK: number;
  tmaxK: number;
  warning: string | null;
};

type Row = { side: "reactant" | "product"; amount: string; formula: string; phase: string; versionId: string };

export type BuilderInitial = { id: number; lockVersion: number; title: string; notes: string; inputs: CaseInputs };

const PHASE_LABEL: Record<string, string> = { g: "gas (g)", l: "liquid (l)", cr: "solid (cr)" };

function firstApproved(options: BuilderOption[], formula: string, phase: string): string {
  const fits = options.filter((o) => o.formula === formula && (!phase || o.phases.includes(phase)));
  return String((fits.find((o) => o.status === "approved") ?? fits[0])?.versionId ?? "");
}

function rowsOf(inputs: CaseInputs | undefined): Row[] {
  if (!inputs) {
    return [
      { side: "reactant", amount: "1", formula: "", phase: "", versionId: "" },
      { side: "product", amount: "1", formula: "", phase: "", versionId: "" },
    ];
  }
  return inputs.terms.map((t) => ({
    side: t.coefficient < 0 ? "reactant" : "product",
    amount: String(Math.abs(t.coefficient)),
    formula: t.formula,
    phase: t.phase ?? "",
    versionId: String(t.versionId),
  }));
}

function unitOf(q: Quantity | undefined, fallback: TemperatureUnit = "K"): TemperatureUnit {
  return q === undefined ? fallback : (splitQuantity(q)?.unit ?? fallback);
}
const valueOf = (q: Quantity | undefined, fallback = "") => (q === undefined ? fallback : String(splitQuantity(q)?.value ?? q));

/** Build or revise a case: species and pinned versions, coefficients, span or list, reference, tolerance. */
export function CaseBuilder({ options, initial }: { options: BuilderOption[]; initial?: BuilderInitial }) {
  const router = useRouter();
  const inputs = initial?.inputs;
  const span = inputs && "fromK" in inputs.temperatures ? inputs.temperatures : null;
  const list = inputs && "listK" in inputs.temperatures ? inputs.temperatures.listK : null;

  const [title, setTitle] = useState(initial?.title ?? "");
  const [notes, setNotes] = useState(initial?.notes ?? "");
  const [rows, setRows] = useState<Row[]>(rowsOf(inputs));
  const [mode, setMode] = useState<"span" | "list">(list ? "list" : "span");
  const [unit, setUnit] = useState<TemperatureUnit>(unitOf(span?.fromK ?? list?.[0]));
  const [from, setFrom] = useState(valueOf(span?.fromK, "300"));
  const [to, setTo] = useState(valueOf(span?.toK, "1000"));
  const [step, setStep] = useState(valueOf(span?.stepK, "10"));
  const [listText, setListText] = useState(list ? list.map((q) => valueOf(q)).join(", ") : "");
  const [refUnit, setRefUnit] = useState<TemperatureUnit>(unitOf(inputs?.referenceK));
  const [ref, setRef] = useState(valueOf(inputs?.referenceK, "298.15"));
  const [tol, setTol] = useState(String(inputs?.toleranceKJ ?? 1));
  const [kFactor, setKFactor] = useState(inputs?.toleranceKFactor ? String(inputs.toleranceKFactor) : "");
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [banner, setBanner] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  const formulas = useMemo(() => {
    const seen = new Map<string, string>();
    for (const o of options) if (!seen.has(o.formula)) seen.set(o.formula, o.speciesName);
    return [...seen].sort((a, b) => a[0].localeCompare(b[0]));
  }, [options]);

  /** Editing a field clears its error (and the banner); the next save checks again. */
  const touch = (...prefixes: string[]) => {
    setErrors((e) => Object.fromEntries(Object.entries(e).filter(([k]) => !prefixes.some((p) => k === p || k.startsWith(`${p}.`)))));
    setBanner(null);
  };

  const update = (i: number, patch: Partial<Row>) => {
    touch(`terms.${i}`, "terms");
    setRows((rs) =>
      rs.map((r, j) => {
        if (j !== i) return r;
        const next = { ...r, ...patch };
        if (patch.formula !== undefined && patch.phase === undefined) next.phase = phaseForSpecies(options, next.formula, next.phase);
        if (patch.formula !== undefined || patch.phase !== undefined) {
          const current = options.find((o) => String(o.versionId) === next.versionId);
          const fits = current && current.formula === next.formula && (!next.phase || current.phases.includes(next.phase));
          if (!fits) next.versionId = firstApproved(options, next.formula, next.phase);
        }
        return next;
      }),
    );
  };

  const signed = rows.map((r) => ({ ...r, coefficient: (r.side === "reactant" ? -1 : 1) * Number(r.amount) }));
  const complete = signed.filter((r) => r.formula && Number.isFinite(r.coefficient) && r.coefficient !== 0);
  // A coefficient that is not a number is named, never silently left out of the balance.
  const unreadable = rows.flatMap((r, i) => (r.formula && !(r.amount.trim() !== "" && Number.isFinite(Number(r.amount)) && Number(r.amount) !== 0) ? [`term ${i + 1} (${r.formula}): “${r.amount.trim()}” is not a coefficient`] : []));
  const balance = complete.length >= 2 ? elementBalance(complete) : null;
  const preview = complete.length >= 2 ? reactionText(complete.map((r) => ({ key: termKey({ formula: r.formula, phase: r.phase || null }), coefficient: r.coefficient }))) : "";

  const num = (s: string) => (s.trim() === "" ? NaN : Number(s));
  function payload() {
    const temperatures =
      mode === "span"
        ? { fromK: joinQuantity(num(from), unit), toK: joinQuantity(num(to), unit), stepK: joinQuantity(num(step), unit) }
        : { listK: listText.split(/[\s,;]+/).filter(Boolean).map((s) => joinQuantity(num(s), unit)) };
    return {
      title,
      notes,
      terms: signed.map((r) => ({ formula: r.formula, phase: r.phase || null, coefficient: r.coefficient, versionId: Number(r.versionId) })),
      temperatures,
      referenceK: joinQuantity(num(ref), refUnit),
      toleranceKJ: num(tol),
      toleranceKFactor: kFactor.trim() ? num(kFactor) : null,
    };
  }

  async function save(e: React.FormEvent) {
    e.preventDefault();
    setBanner(null);
    const body = payload();
    const parsed = caseInputSchema.safeParse(body);
    if (!parsed.success) {
      setErrors(fieldErrorsOf(parsed.error.issues));
      setBanner("Fix the marked fields.");
      return;
    }
    setErrors({});
    setBusy(true);
    const answer = initial
      ? await settle(sendJson<{ case: { id: number } }>("PATCH", `/api/v1/cases/${initial.id}`, { ...parsed.data, lockVersion: initial.lockVersion }))
      : await settle(sendJson<{ case: { id: number } }>("POST", "/api/v1/cases", parsed.data));
    setBusy(false);
    if (!answer.ok) {
      if (answer.error.fields) setErrors(answer.error.fields);
      setBanner(answer.error.fields ? "Fix the marked fields." : answer.error.message);
      return;
    }
    await refreshCaseResults(answer.data.case.id);
    router.push(`/cases/${answer.data.case.id}`);
    router.refresh();
  }

  /** A unit switch converts what is typed, so the span stays the same temperatures (a step is a difference). */
  const switchUnit = (next: TemperatureUnit) => {
    touch("temperatures");
    setFrom((v) => convertTyped(v, unit, next));
    setTo((v) => convertTyped(v, unit, next));
    setStep((v) => convertTyped(v, unit, next, "difference"));
    setListText((v) => convertTypedList(v, unit, next));
    setUnit(next);
  };
  const switchRefUnit = (next: TemperatureUnit) => {
    touch("referenceK");
    setRef((v) => convertTyped(v, refUnit, next));
    setRefUnit(next);
  };

  const err = (k: string) => errors[k];
  const unitSelect = (name: string, value: TemperatureUnit, set: (u: TemperatureUnit) => void, label: string) => (
    <select aria-label={label} name={name} value={value} onChange={(e) => set(e.target.value as TemperatureUnit)} className={`${inputClass} !w-24`}>
      {TEMPERATURE_UNITS.map((u) => (
        <option key={u} value={u}>
          {UNIT_LABELS[u]}
        </option>
      ))}
    </select>
  );

  return (
    <form onSubmit={save} noValidate className="space-y-6" aria-label="Case builder">
      {banner && (
        <div role="alert" className="rounded-md border border-flag-600/30 bg-flag-50 px-3 py-2 text-sm text-flag-700" data-testid="builder-banner">
          {banner}
        </div>
      )}
      <section className="grid gap-4 rounded-lg border border-ink-line bg-white p-4 shadow-card md:grid-cols-2">
        <Field label="Title" name="title" error={err("title")}>
          <TextInput name="title" value={title} onChange={(e) => { touch("title"); setTitle(e.target.value); }} error={err("title")} placeholder="Shift converter, start-up span" />
        </Field>
        <Field label="Notes" name="notes" error={err("notes")} hint="What the case is for, operating pressure, anything a reviewer should know.">
          <textarea id="notes" name="notes" className={inputClass} rows={2} value={notes} onChange={(e) => setNotes(e.target.value)} />
        </Field>
      </section>

      <section className="rounded-lg border border-ink-line bg-white p-4 shadow-card">
        <div className="mb-3 flex flex-wrap items-baseline justify-between gap-2">
          <h2 className="text-sm font-semibold">Reaction</h2>
          <p className="text-xs text-ink-muted">Reactants are written with a negative coefficient, products positive. No phase: the stable phase (lowest G) at each T.</p>
        </div>
        <div className="space-y-3">
          {rows.map((r, i) => {
            const versions = options.filter((o) => o.formula === r.formula && (!r.phase || o.phases.includes(r.phase)));
            const chosen = options.find((o) => String(o.versionId) === r.versionId);
            const phases = [...new Set(options.filter((o) => o.formula === r.formula).flatMap((o) => o.phases))];
            const n = i + 1;
            return (
              <div key={i} className="grid grid-cols-2 gap-2 rounded-md border border-ink-line/70 p-2 sm:grid-cols-[7rem_5rem_1fr_9rem_2fr_auto]" data-testid={`term-${i}`}>
                <Select name={`terms.${i}.side`} aria-label={`Term ${n} side`} value={r.side} onChange={(e) => update(i, { side: e.target.value as Row["side"] })}>
                  <option value="reactant">reactant</option>
                  <option value="product">product</option>
                </Select>
                <div>
                  <TextInput name={`terms.${i}.coefficient`} aria-label={`Term ${n} coefficient`} inputMode="decimal" value={r.amount} onChange={(e) => update(i, { amount: e.target.value })} error={err(`terms.${i}.coefficient`)} />
                </div>
                <div>
                  <Select name={`terms.${i}.formula`} aria-label={`Term ${n} species`} value={r.formula} onChange={(e) => update(i, { formula: e.target.value })} error={err(`terms.${i}.formula`)}>
                    <option value="">Species…</option>
                    {formulas.map(([f, name]) => (
                      <option key={f} value={f}>
                        {f} · {name}
                      </option>
                    ))}
                  </Select>
                </div>
                <Select name={`terms.${i}.phase`} aria-label={`Term ${n} phase`} value={r.phase} onChange={(e) => update(i, { phase: e.target.value })}>
                  <option value="">stable phase</option>
                  {phases.map((p) => (
                    <option key={p} value={p}>
                      {PHASE_LABEL[p] ?? p}
                    </option>
                  ))}
                </Select>
                <div className="col-span-2 sm:col-span-1">
                  <Select name={`terms.${i}.versionId`} aria-label={`Term ${n} model version`} value={r.versionId} onChange={(e) => update(i, { versionId: e.target.value })} error={err(`terms.${i}.versionId`)}>
                    <option value="">Model version…</option>
                    {versions.map((o) => (
                      <option key={o.versionId} value={o.versionId}>
                        {o.modelName} · v{o.versionNumber}
                        {o.status === "approved" ? "" : ` · ${o.status.toUpperCase()}`} · {Math.round(o.tminK)}–{Math.round(o.tmaxK)} K
                      </option>
                    ))}
                  </Select>
                  {chosen?.warning && (
                    <p role="alert" className="mt-1 text-xs font-semibold text-flag-700" data-testid={`term-${i}-warning`}>
                      {chosen.warning}
                    </p>
                  )}
                  {(err(`terms.${i}.versionId`) || err(`terms.${i}.formula`) || err(`terms.${i}.coefficient`)) && (
                    <p role="alert" className="mt-1 text-xs font-medium text-flag-700">
                      {err(`terms.${i}.formula`) ?? err(`terms.${i}.coefficient`) ?? err(`terms.${i}.versionId`)}
                    </p>
                  )}
                </div>
                <Button type="button" variant="ghost" aria-label={`Remove term ${n}`} onClick={() => { touch("terms"); setRows((rs) => rs.filter((_, j) => j !== i)); }} focusableWhenDisabled disabled={rows.length <= 2}>
                  Remove
                </Button>
              </div>
            );
          })}
        </div>
        <div className="mt-3 flex flex-wrap items-center justify-between gap-3">
          <Button type="button" variant="secondary" onClick={() => setRows((rs) => [...rs, { side: "product", amount: "1", formula: "", phase: "", versionId: "" }])}>
            Add species
          </Button>
          <div className="text-sm" aria-live="polite" data-testid="balance">
            {preview && <span className="mr-3 font-medium">{preview}</span>}
            {unreadable.length > 0 ? (
              <span className="font-medium text-flag-700" data-testid="balance-unreadable">
                Balance not checked: {unreadable.join("; ")}.
              </span>
            ) : balance === null ? (
              <span className="text-ink-muted">Pick at least two species.</span>
            ) : balance.ok ? (
              <span className="font-medium text-moss-700">Balanced: {Object.keys(balance.elements).join(", ")}</span>
            ) : (
              <span className="font-medium text-flag-700">{balance.message}</span>
            )}
          </div>
        </div>
        {err("terms") && (
          <p role="alert" className="mt-2 text-xs font-medium text-flag-700">
            {err("terms")}
          </p>
        )}
      </section>

      <section className="grid gap-4 rounded-lg border border-ink-line bg-white p-4 shadow-card md:grid-cols-2">
        <div className="space-y-3">
          <h2 className="text-sm font-semibold">Temperatures</h2>
          <div className="flex flex-wrap items-center gap-4 text-sm">
            <label className="flex items-center gap-2">
              <input type="radio" name="mode" checked={mode === "span"} onChange={() => setMode("span")} /> Span and step
            </label>
            <label className="flex items-center gap-2">
              <input type="radio" name="mode" checked={mode === "list"} onChange={() => setMode("list")} /> List
            </label>
            {unitSelect("unit", unit, switchUnit, "Temperature unit")}
          </div>
          {mode === "span" ? (
            <div className="grid grid-cols-3 gap-2">
              <Field label={`From (${UNIT_LABELS[unit]})`} name="temperatures.fromK" error={err("temperatures.fromK")}>
                <TextInput name="temperatures.fromK" inputMode="decimal" value={from} onChange={(e) => { touch("temperatures"); setFrom(e.target.value); }} error={err("temperatures.fromK")} />
              </Field>
              <Field label={`To (${UNIT_LABELS[unit]})`} name="temperatures.toK" error={err("temperatures.toK")}>
                <TextInput name="temperatures.toK" inputMode="decimal" value={to} onChange={(e) => { touch("temperatures"); setTo(e.target.value); }} error={err("temperatures.toK")} />
              </Field>
              <Field label={`Step (${UNIT_LABELS[unit === "K" ? "K" : unit]})`} name="temperatures.stepK" error={err("temperatures.stepK")}>
                <TextInput name="temperatures.stepK" inputMode="decimal" value={step} onChange={(e) => { touch("temperatures"); setStep(e.target.value); }} error={err("temperatures.stepK")} />
              </Field>
            </div>
          ) : (
            <Field label={`Temperatures (${UNIT_LABELS[unit]}), separated by commas or spaces`} name="temperatures.listK" error={err("temperatures.listK") ?? Object.entries(errors).find(([k]) => k.startsWith("temperatures.listK."))?.[1]}>
              <textarea id="temperatures.listK" name="temperatures.listK" className={inputClass} rows={2} value={listText} onChange={(e) => { touch("temperatures"); setListText(e.target.value); }} />
            </Field>
          )}
          {err("temperatures") && <p role="alert" className="text-xs font-medium text-flag-700">{err("temperatures")}</p>}
        </div>
        <div className="space-y-3">
          <h2 className="text-sm font-semibold">Reference and tolerance</h2>
          <div className="flex items-end gap-2">
            <div className="flex-1">
              <Field label="Reference temperature" name="referenceK" error={err("referenceK")} hint="The naive line is ΔrH − T·ΔrS taken here.">
                <TextInput name="referenceK" inputMode="decimal" value={ref} onChange={(e) => { touch("referenceK"); setRef(e.target.value); }} error={err("referenceK")} />
              </Field>
            </div>
            <div className="pb-5">{unitSelect("refUnit", refUnit, switchRefUnit, "Reference temperature unit")}</div>
          </div>
          <div className="grid grid-cols-2 gap-2">
            <Field label="Tolerance on ΔrG (kJ/mol)" name="toleranceKJ" error={err("toleranceKJ")}>
              <TextInput name="toleranceKJ" inputMode="decimal" value={tol} onChange={(e) => { touch("toleranceKJ"); setTol(e.target.value); }} error={err("toleranceKJ")} />
            </Field>
            <Field label="Tolerance on K (factor, optional)" name="toleranceKFactor" error={err("toleranceKFactor")}>
              <TextInput name="toleranceKFactor" inputMode="decimal" value={kFactor} onChange={(e) => { touch("toleranceKFactor"); setKFactor(e.target.value); }} error={err("toleranceKFactor")} placeholder="e.g. 2" />
            </Field>
          </div>
        </div>
      </section>

      <div className="flex justify-end gap-2">
        <Button type="button" variant="ghost" onClick={() => router.back()}>
          Cancel
        </Button>
        <Button type="submit" disabled={busy}>
          {initial ? "Save changes" : "Save draft"}
        </Button>
      </div>
    </form>
  );
}
