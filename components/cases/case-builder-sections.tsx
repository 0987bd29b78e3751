"use client";

import { Button } from "@/components/ui/button";
import { Field, inputClass, Select, TextInput } from "@/components/ui/field";
import { TEMPERATURE_UNITS, UNIT_LABELS, type TemperatureUnit } from "@/lib/cases/temperature";
import type { BuilderOption, CaseBuilderState, TermRow } from "./use-case-builder";

const PHASE_LABEL: Record<string, string> = { g: "gas (g)", l: "liquid (l)", cr: "solid (cr)" };

const card = "rounded-lg border border-ink-line bg-white p-4 shadow-card";

function UnitSelect({ name, value, onChange, label }: { name: string; value: TemperatureUnit; onChange: (u: TemperatureUnit) => void; label: string }) {
  return (
    <select aria-label={label} name={name} value={value} onChange={(e) => onChange(e.target.value as TemperatureUnit)} className={`${inputClass} !w-24`}>
      {TEMPERATURE_UNITS.map((u) => (
        <option key={u} value={u}>
          {UNIT_LABELS[u]}
        </option>
      ))}
    </select>
  );
}

/** Title and notes. */
export function DetailsSection({ b }: { b: CaseBuilderState }) {
  const { fields, setField, err } = b;
  return (
    <section className={`grid gap-4 md:grid-cols-2 ${card}`}>
      <Field label="Title" name="title" error={err("title")}>
        <TextInput name="title" value={fields.title} onChange={(e) => setField("title", e.target.value)} error={err("title")} placeholder="Shift converter, start-up span" />
      </Field>
      <Field label="Notes" name="notes" error={err("notes")} hint="What the case is for, operating pressure, anything a reviewer should know.">
        <textarea id="notes" name="notes" className={inputClass} rows={2} value={fields.notes} onChange={(e) => setField("notes", e.target.value)} />
      </Field>
    </section>
  );
}

/** One term: side, coefficient, species, phase and the pinned model version. */
function TermEditor({ b, options, row: r, i }: { b: CaseBuilderState; options: BuilderOption[]; row: TermRow; i: number }) {
  const { err, updateRow: update } = b;
  const versions = options.filter((o) => o.formula === r.formula && (!r.phase || o.phases.includes(r.phase)));
  const chosen = options.find((o) => String(o.versionId) === r.versionId);
  const phases = [...new Set(options.filter((o) => o.formula === r.formula).flatMap((o) => o.phases))];
  const n = i + 1;
  return (
    <div className="grid grid-cols-2 gap-2 rounded-md border border-ink-line/70 p-2 sm:grid-cols-[7rem_5rem_1fr_9rem_2fr_auto]" data-testid={`term-${i}`}>
      <Select name={`terms.${i}.side`} aria-label={`Term ${n} side`} value={r.side} onChange={(e) => update(i, { side: e.target.value as TermRow["side"] })}>
        <option value="reactant">reactant</option>
        <option value="product">product</option>
      </Select>
      <div>
        <TextInput
          name={`terms.${i}.coefficient`}
          aria-label={`Term ${n} coefficient`}
          inputMode="decimal"
          value={r.amount}
          onChange={(e) => update(i, { amount: e.target.value })}
          error={err(`terms.${i}.coefficient`)}
        />
      </div>
      <div>
        <Select
          name={`terms.${i}.formula`}
          aria-label={`Term ${n} species`}
          value={r.formula}
          onChange={(e) => update(i, { formula: e.target.value })}
          error={err(`terms.${i}.formula`)}
        >
          <option value="">Species…</option>
          {b.formulas.map(([f, name]) => (
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
        <Select
          name={`terms.${i}.versionId`}
          aria-label={`Term ${n} model version`}
          value={r.versionId}
          onChange={(e) => update(i, { versionId: e.target.value })}
          error={err(`terms.${i}.versionId`)}
        >
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
      <Button type="button" variant="ghost" aria-label={`Remove term ${n}`} onClick={() => b.removeRow(i)} focusableWhenDisabled disabled={b.rows.length <= 2}>
        Remove
      </Button>
    </div>
  );
}

/** The terms, Add species, and the live balance. */
export function ReactionSection({ b, options }: { b: CaseBuilderState; options: BuilderOption[] }) {
  const { preview, unreadable, balance, err } = b;
  return (
    <section className={card}>
      <div className="mb-3 flex flex-wrap items-baseline justify-between gap-2">
        <h2 className="text-sm font-semibold">Reaction</h2>
        <p className="text-xs text-ink-muted">Reactants are written with a negative coefficient, products positive. No phase: the stable phase (lowest G) at each T.</p>
      </div>
      <div className="space-y-3">
        {b.rows.map((r, i) => (
          <TermEditor key={i} b={b} options={options} row={r} i={i} />
        ))}
      </div>
      <div className="mt-3 flex flex-wrap items-center justify-between gap-3">
        <Button type="button" variant="secondary" onClick={b.addRow}>
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
  );
}

/** Span and step or a list, in one unit. */
function Temperatures({ b }: { b: CaseBuilderState }) {
  const { fields: f, setField, err, errors } = b;
  const u = UNIT_LABELS[f.unit];
  return (
    <div className="space-y-3">
      <h2 className="text-sm font-semibold">Temperatures</h2>
      <div className="flex flex-wrap items-center gap-4 text-sm">
        <label className="flex items-center gap-2">
          <input type="radio" name="mode" checked={f.mode === "span"} onChange={() => setField("mode", "span")} /> Span and step
        </label>
        <label className="flex items-center gap-2">
          <input type="radio" name="mode" checked={f.mode === "list"} onChange={() => setField("mode", "list")} /> List
        </label>
        <UnitSelect name="unit" value={f.unit} onChange={b.switchUnit} label="Temperature unit" />
      </div>
      {f.mode === "span" ? (
        <div className="grid grid-cols-3 gap-2">
          <Field label={`From (${u})`} name="temperatures.fromK" error={err("temperatures.fromK")}>
            <TextInput name="temperatures.fromK" inputMode="decimal" value={f.from} onChange={(e) => setField("from", e.target.value)} error={err("temperatures.fromK")} />
          </Field>
          <Field label={`To (${u})`} name="temperatures.toK" error={err("temperatures.toK")}>
            <TextInput name="temperatures.toK" inputMode="decimal" value={f.to} onChange={(e) => setField("to", e.target.value)} error={err("temperatures.toK")} />
          </Field>
          <Field label={`Step (${u})`} name="temperatures.stepK" error={err("temperatures.stepK")}>
            <TextInput name="temperatures.stepK" inputMode="decimal" value={f.step} onChange={(e) => setField("step", e.target.value)} error={err("temperatures.stepK")} />
          </Field>
        </div>
      ) : (
        <Field
          label={`Temperatures (${u}), separated by commas or spaces`}
          name="temperatures.listK"
          error={err("temperatures.listK") ?? Object.entries(errors).find(([k]) => k.startsWith("temperatures.listK."))?.[1]}
        >
          <textarea id="temperatures.listK" name="temperatures.listK" className={inputClass} rows={2} value={f.listText} onChange={(e) => setField("listText", e.target.value)} />
        </Field>
      )}
      {err("temperatures") && (
        <p role="alert" className="text-xs font-medium text-flag-700">
          {err("temperatures")}
        </p>
      )}
    </div>
  );
}

/** The naive line's reference temperature and the tolerances. */
function ReferenceAndTolerance({ b }: { b: CaseBuilderState }) {
  const { fields: f, setField, err } = b;
  return (
    <div className="space-y-3">
      <h2 className="text-sm font-semibold">Reference and tolerance</h2>
      <div className="flex items-end gap-2">
        <div className="flex-1">
          <Field label="Reference temperature" name="referenceK" error={err("referenceK")} hint="The naive line is ΔrH − T·ΔrS taken here.">
            <TextInput name="referenceK" inputMode="decimal" value={f.ref} onChange={(e) => setField("ref", e.target.value)} error={err("referenceK")} />
          </Field>
        </div>
        <div className="pb-5">
          <UnitSelect name="refUnit" value={f.refUnit} onChange={b.switchRefUnit} label="Reference temperature unit" />
        </div>
      </div>
      <div className="grid grid-cols-2 gap-2">
        <Field label="Tolerance on ΔrG (kJ/mol)" name="toleranceKJ" error={err("toleranceKJ")}>
          <TextInput name="toleranceKJ" inputMode="decimal" value={f.tol} onChange={(e) => setField("tol", e.target.value)} error={err("toleranceKJ")} />
        </Field>
        <Field label="Tolerance on K (factor, optional)" name="toleranceKFactor" error={err("toleranceKFactor")}>
          <TextInput
            name="toleranceKFactor"
            inputMode="decimal"
            value={f.kFactor}
            onChange={(e) => setField("kFactor", e.target.value)}
            error={err("toleranceKFactor")}
            placeholder="e.g. 2"
          />
        </Field>
      </div>
    </div>
  );
}

/** Temperatures beside reference and tolerance. */
export function ConditionsSection({ b }: { b: CaseBuilderState }) {
  return (
    <section className={`grid gap-4 md:grid-cols-2 ${card}`}>
      <Temperatures b={b} />
      <ReferenceAndTolerance b={b} />
    </section>
  );
}
