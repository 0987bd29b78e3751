"use client";

import useSWR from "swr";
import { Button } from "@/components/ui/button";
import { Field, Select, TextInput, inputClass } from "@/components/ui/field";
import { getJson } from "@/lib/api/client";
import { feedUnitHint } from "@/lib/cases/equilibrium-form";
import type { PinOptionDto } from "@/lib/services/pins";
import { FEED_UNITS } from "@/lib/thermo/schema";
import { markerless, type EquilibriumForm } from "./use-equilibrium-form";

/** Unit, pressure, gas model, adiabatic inlet, key species, extra reactions and their pins, and the panel's buttons. */
export function ConditionsSection({ form, hasSaved }: { form: EquilibriumForm; hasSaved: boolean }) {
  const { fields: f, species: s, errors, clearError, reactionErrors, busy, run } = form;
  return (
    <div className="space-y-3">
      <div className="grid grid-cols-2 gap-3">
        <Field label="Unit of amount" name="feedUnit" error={errors.feedUnit} hint={feedUnitHint(f.unit)}>
          <Select
            name="feedUnit"
            value={f.unit}
            error={errors.feedUnit}
            onChange={(e) => {
              f.setUnit(e.target.value);
              clearError("feedUnit");
            }}
          >
            {(FEED_UNITS as readonly string[]).includes(f.unit) ? null : <option value={f.unit}>{f.unit}</option>}
            {FEED_UNITS.map((u) => (
              <option key={u} value={u}>
                {u}
              </option>
            ))}
          </Select>
        </Field>
        <Field label="Pressure" name="pressure" error={errors.pressure} hint="bar, or with a unit: 2.5 MPa, 30 atm">
          <TextInput
            name="pressure"
            value={f.pressure}
            error={errors.pressure}
            onChange={(e) => {
              f.setPressure(e.target.value);
              clearError("pressure");
            }}
          />
        </Field>
      </div>
      <div className="grid grid-cols-2 gap-3">
        <Field label="Gas model" name="gasModel" hint="Peng–Robinson applies fugacity coefficients; it needs critical constants (the library has them for its reference species).">
          <Select name="gasModel" value={f.gasModel} onChange={(e) => f.setGasModel(e.target.value === "peng-robinson" ? "peng-robinson" : "ideal")}>
            <option value="ideal">Ideal gas (φ = 1)</option>
            <option value="peng-robinson">Peng–Robinson</option>
          </Select>
        </Field>
        <Field label="Adiabatic inlet temperature (optional)" name="adiabaticInletK" hint="K, or with a unit: 327 degC. Inert species then need a model version.">
          <TextInput name="adiabaticInletK" value={f.inletK} onChange={(e) => f.setInletK(e.target.value)} placeholder="e.g. 600" />
        </Field>
      </div>
      <Field label="Key species (conversion and slip)" name="key" error={errors.key}>
        <Select
          name="key"
          value={f.key}
          error={errors.key}
          onChange={(e) => {
            f.setKey(e.target.value);
            clearError("key");
          }}
        >
          {s.feedKeys.map((k) => (
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
          value={f.reactionsText}
          onChange={(e) => {
            f.setReactionsText(e.target.value);
            clearError("reactions");
          }}
          placeholder="e.g. CO(g) + H2O(g) -> CO2(g) + H2(g)"
        />
      </Field>
      {s.extraKeys.map((k) => (
        <ExtraPin key={k} speciesKey={k} inert={!s.reactionKeys.includes(k)} value={s.extraPins[k]} onChange={(v) => s.setPin(k, v)} />
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
  );
}

/** The model version of a species that only the extra reactions (or the adiabatic balance, as an inert) need. */
function ExtraPin({ speciesKey, inert, value, onChange }: { speciesKey: string; inert: boolean; value?: number; onChange: (versionId: number) => void }) {
  const { formula } = markerless(speciesKey);
  const { data } = useSWR<{ versions: PinOptionDto[] }>(`/api/v1/pins?formula=${encodeURIComponent(formula)}`, getJson, { revalidateOnFocus: false });
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
