"use client";

import { useActionState } from "react";
import { Button } from "@/components/ui/button";
import { Field, TextInput } from "@/components/ui/field";
import type { ActionState } from "@/lib/actions";

type Critical = { tcK: number; pcBar: number; omega: number; citation: string };
type Action = (prev: ActionState, form: FormData) => Promise<ActionState>;

const initial: ActionState = { ok: false };

/**
 * A species' critical constants (read by the Peng–Robinson equilibrium) with their source; for a
 * team species and a steward or admin, the form that sets or removes them. The actions come as
 * props; the server checks role and team on every call.
 */
export function CriticalConstants({
  speciesId,
  critical,
  canEdit,
  scope,
  save,
  remove,
}: {
  speciesId: number;
  critical: Critical | null;
  canEdit: boolean;
  scope: "reference" | "team";
  save: Action;
  remove: Action;
}) {
  const [saved, saveAction, saving] = useActionState(save, initial);
  const [removed, removeAction, removing] = useActionState(remove, initial);
  const values = saved.ok ? undefined : saved.values;
  const v = (name: keyof Critical) => values?.[name] ?? (critical ? String(critical[name]) : "");
  const errors = saved.fieldErrors ?? {};
  const banners = [saved, removed].filter((s) => s.message);
  return (
    <div className="space-y-3 text-sm" data-testid="critical-constants">
      {critical ? (
        <dl className="grid grid-cols-3 gap-2 tabular" data-testid="critical-shown">
          <div>
            <dt className="text-xs text-ink-muted">
              T<sub>c</sub>
            </dt>
            <dd>{critical.tcK} K</dd>
          </div>
          <div>
            <dt className="text-xs text-ink-muted">
              p<sub>c</sub>
            </dt>
            <dd>{critical.pcBar} bar</dd>
          </div>
          <div>
            <dt className="text-xs text-ink-muted">ω</dt>
            <dd>{critical.omega}</dd>
          </div>
          <p className="col-span-3 text-xs text-ink-soft" data-testid="critical-citation">
            Source: {critical.citation || "not given"}
          </p>
        </dl>
      ) : (
        <p className="text-ink-muted" data-testid="critical-none">
          None: a Peng–Robinson equilibrium with this species is refused until they are given{scope === "team" ? "" : " (the reference library has none for it)"}.
        </p>
      )}
      {canEdit && (
        <form action={saveAction} className="space-y-3 border-t border-ink-line pt-3" noValidate aria-label="Critical constants">
          <input type="hidden" name="speciesId" value={speciesId} />
          <div className="grid grid-cols-3 gap-2">
            <Field label="Tc (K)" name="tcK" error={errors.tcK}>
              <TextInput name="tcK" inputMode="decimal" defaultValue={v("tcK")} key={`tc-${v("tcK")}`} error={errors.tcK} />
            </Field>
            <Field label="pc (bar)" name="pcBar" error={errors.pcBar}>
              <TextInput name="pcBar" inputMode="decimal" defaultValue={v("pcBar")} key={`pc-${v("pcBar")}`} error={errors.pcBar} />
            </Field>
            <Field label="ω" name="omega" error={errors.omega}>
              <TextInput name="omega" inputMode="decimal" defaultValue={v("omega")} key={`om-${v("omega")}`} error={errors.omega} />
            </Field>
          </div>
          <Field label="Source" name="citation" error={errors.citation} hint='Table, edition and page; a recalled value says "(from memory)".'>
            <TextInput name="citation" defaultValue={v("citation")} key={`ci-${v("citation")}`} error={errors.citation} />
          </Field>
          <Button type="submit" disabled={saving}>
            {saving ? "Saving…" : "Save constants"}
          </Button>
        </form>
      )}
      {canEdit && critical && (
        <form action={removeAction}>
          <input type="hidden" name="speciesId" value={speciesId} />
          <Button type="submit" variant="ghost" disabled={removing}>
            {removing ? "Removing…" : "Remove the constants"}
          </Button>
        </form>
      )}
      {banners.map((b, i) => (
        <p key={i} role={b.ok ? "status" : "alert"} className={`text-sm ${b.ok ? "text-moss-700" : "text-flag-700"}`}>
          {b.message}
        </p>
      ))}
    </div>
  );
}
