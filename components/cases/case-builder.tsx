"use client";

import { Button } from "@/components/ui/button";
import { ConditionsSection, DetailsSection, ReactionSection } from "./case-builder-sections";
import { useCaseBuilder, type BuilderInitial, type BuilderOption } from "./use-case-builder";

/** Build or revise a case: species and pinned versions, coefficients, span or list, reference, tolerance. */
export function CaseBuilder({ options, initial }: { options: BuilderOption[]; initial?: BuilderInitial }) {
  const b = useCaseBuilder(options, initial);
  return (
    <form onSubmit={b.save} noValidate className="space-y-6" aria-label="Case builder">
      {b.banner && (
        <div role="alert" className="rounded-md border border-flag-600/30 bg-flag-50 px-3 py-2 text-sm text-flag-700" data-testid="builder-banner">
          {b.banner}
        </div>
      )}
      <DetailsSection b={b} />
      <ReactionSection b={b} options={options} />
      <ConditionsSection b={b} />
      <div className="flex justify-end gap-2">
        <Button type="button" variant="ghost" onClick={b.cancel}>
          Cancel
        </Button>
        <Button type="submit" disabled={b.busy}>
          {b.editing ? "Save changes" : "Save draft"}
        </Button>
      </div>
    </form>
  );
}
