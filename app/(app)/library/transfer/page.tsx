import Link from "next/link";
import { ImportForm } from "@/components/library/import-form";
import { buttonClass } from "@/components/ui/button";
import { Card, PageHeader } from "@/components/ui/card";
import { can } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/guards";
import { getActor } from "@/lib/auth/session";
import { EXPORT_FORMAT, EXPORT_FORMAT_VERSION } from "@/lib/validation/library";

export const metadata = { title: "Import and export" };

const SAMPLE = `{
  "format": "${EXPORT_FORMAT}",
  "formatVersion": ${EXPORT_FORMAT_VERSION},
  "exportedAt": "2026-12-01T09:00:00.000Z",
  "models": [{
    "species": { "formula": "NiAl2O4", "displayName": "Ni–alumina support" },
    "name": "NiAl2O4 · Maier–Kelley", "family": "measured", "variant": null,
    "versions": [{
      "versionNumber": 2, "status": "approved",
      "data": { "segments": [{ "phase": "cr", "form": "maier-kelley", "tminK": 300, "tmaxK": 900,
                               "coeffs": { "a": 165, "b": 0.022, "c": -3600000 } }],
                "reference": { "tK": 298.15, "phase": "cr", "hkJ": -1925, "sJ": 98 } },
      "citation": "…", "uncertainty": { "cpRelative": 0.005 }, "changeNote": "…"
    }]
  }]
}`;

export default async function TransferPage() {
  const actor = requireUser(await getActor());
  return (
    <>
      <p className="mb-2 text-sm">
        <Link href="/library" className="text-frost-700 hover:underline">
          ← Library
        </Link>
      </p>
      <PageHeader title="Import and export" lead="Model sets travel between teams and scripts in Heatpath's own JSON format, with their citations." />
      <div className="grid gap-6 lg:grid-cols-2">
        <Card title="Export">
          <p className="text-sm text-ink-soft">Every model visible to {actor.teamName} that has an approved version, with that version; or every version of every visible model.</p>
          <div className="mt-3 flex flex-wrap gap-2">
            <a className={buttonClass("primary")} href="/api/v1/library/export">
              Export approved versions
            </a>
            <a className={buttonClass("secondary")} href="/api/v1/library/export?versions=all">
              Export every version
            </a>
          </div>
          <p className="mt-3 text-xs text-ink-muted">
            One model: use “Export this model” on any version page, or <code>/api/v1/library/export?models=ID1,ID2</code>.
          </p>
        </Card>
        <Card title="Import">
          {can(actor.role, "models.edit") ? (
            <>
              <p className="mb-3 text-sm text-ink-soft">
                Every version in the file becomes a <strong>draft</strong> of a team model (matched by species, name, family and variant, else created); nothing is approved by
                importing. A file with any error is refused whole.
              </p>
              <ImportForm />
            </>
          ) : (
            <p className="text-sm text-ink-soft">Stewards import library files.</p>
          )}
        </Card>
      </div>
      <Card title="The format" className="mt-6">
        <pre className="overflow-x-auto rounded-md bg-paper-deep p-3 text-xs leading-relaxed">{SAMPLE}</pre>
        <p className="mt-2 text-xs text-ink-muted">
          <code>data</code> is the engine&apos;s species entry (segments per phase, optional transitions, anchor and standard pressure), exactly as the evaluate API takes it.
        </p>
      </Card>
    </>
  );
}
