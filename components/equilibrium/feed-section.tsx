"use client";

import { Button } from "@/components/ui/button";
import { Field, TextInput, inputClass } from "@/components/ui/field";
import type { EquilibriumForm } from "./use-equilibrium-form";

/** The feed: one amount per species (the case's, the extra reactions', the inert ones) and a field to add an inert species. */
export function FeedSection({ form }: { form: EquilibriumForm }) {
  const { species: s, fields: f, errors, clearError } = form;
  return (
    <fieldset className="space-y-2">
      <legend className="mb-1 text-sm font-medium text-ink-soft">Feed</legend>
      <div className="space-y-2" data-testid="feed-rows">
        {s.feedKeys.map((k) => {
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
                  value={s.amountOf(k)}
                  onChange={(e) => s.setAmount(k, e.target.value)}
                />
                <span className="w-16 shrink-0 text-xs text-ink-muted">{f.unit}</span>
                {s.removable(k) && (
                  <button type="button" className="text-xs text-flag-700 underline" onClick={() => s.removeRow(k)} aria-label={`Remove ${k}`}>
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
              value={f.newKey}
              error={errors.inert}
              onChange={(e) => {
                f.setNewKey(e.target.value);
                clearError("inert");
              }}
              placeholder="N2(g)"
            />
          </Field>
        </div>
        <Button type="button" variant="secondary" className="mt-6" onClick={s.addInert}>
          Add
        </Button>
      </div>
    </fieldset>
  );
}
