import type { ExportFile } from "@/lib/validation/library";

const slug = (s: string) =>
  s
    .normalize("NFKD")
    .replace(/[\u0300-\u036f]/g, "")
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, "-")
    .replace(/^-|-$/g, "")
    .slice(0, 60) || "model";

/**
 * A download's name says what it holds and the day: `heatpath-library-<model>-…` for one model,
 * `…-<n>-models-…` for a chosen few, `…-all-sets-…` for everything visible; then which versions
 * (`approved` or `all-versions`) and the export date (UTC).
 */
export function exportFilename(file: Pick<ExportFile, "models" | "exportedAt">, query: { models: number[]; versions: "approved" | "all" }): string {
  const what = query.models.length === 0 ? "all-sets" : query.models.length === 1 && file.models[0] ? slug(file.models[0].name) : `${query.models.length}-models`;
  const which = query.versions === "all" ? "all-versions" : "approved";
  const day = (file.exportedAt ?? new Date().toISOString()).slice(0, 10);
  return `heatpath-library-${what}-${which}-${day}.json`;
}
