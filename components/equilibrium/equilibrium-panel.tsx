"use client";

import dynamic from "next/dynamic";
import { Caution } from "@/components/results/caution";
import { useCaseResults } from "@/components/results/use-case-results";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { cautionGasOf, equilibriumCautionText } from "@/lib/cases/caution";
import { warningMeaning } from "@/lib/cases/warnings";
import type { EvaluateResult } from "@/lib/thermo/evaluate";
import type { CaseEquilibrium } from "@/lib/validation/equilibrium";
import { CondensationNote } from "./condensation-note";
import { ConditionsSection } from "./conditions-section";
import { FeedSection } from "./feed-section";
import { useEquilibriumForm } from "./use-equilibrium-form";

// Charts load only once there is something to draw, keeping recharts out of the page's first load.
const EquilibriumResults = dynamic(() => import("./equilibrium-results").then((m) => m.EquilibriumResults), { ssr: false });
const SourceComparisonView = dynamic(() => import("./source-comparison").then((m) => m.SourceComparisonView), { ssr: false });

/**
 * The equilibrium panel of a case: feed, pressure and key species (and optionally a
 * simultaneous set), the saved result from the case's results (snapshot or live), trial runs,
 * and the comparison of data families. State and actions: use-equilibrium-form.ts.
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
  // The same request as the results view's (one per page view).
  const { data } = useCaseResults(caseId, revision);
  const form = useEquilibriumForm({ caseId, lockVersion, initial, caseKeys, reactantKeys, data });
  const { trial, busy, errors, saved, sources, run } = form;

  const shown = trial ?? data?.result ?? null;
  const hasSaved = Boolean(data?.result.equilibrium);
  const editable = canEdit && data?.source !== "snapshot";

  return (
    <Card title="How far it goes: equilibrium outlet" className="break-inside-avoid">
      <div className="space-y-4" data-testid="equilibrium-panel">
        <p className="text-sm text-ink-muted">
          Outlet composition from a feed at each temperature of the case, with ideal-gas activities (or Peng–Robinson fugacity coefficients) at the given pressure and pure
          condensed phases at unit activity, once with the corrected K and once with the naive K; optionally the adiabatic outlet temperature.
        </p>
        {editable ? (
          <form
            className="grid gap-4 lg:grid-cols-[minmax(0,1fr)_minmax(0,1fr)]"
            onSubmit={(e) => {
              e.preventDefault();
              void run("trial");
            }}
          >
            <FeedSection form={form} />
            <ConditionsSection form={form} hasSaved={hasSaved} />
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
              {trial ? (
                <Badge tone="ember">Trial run, not saved</Badge>
              ) : (
                <Badge tone={data?.source === "snapshot" ? "moss" : "frost"}>
                  {data?.source === "snapshot" ? `Frozen snapshot · revision ${data.revision}` : "Saved feed · live evaluation"}
                </Badge>
              )}
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
