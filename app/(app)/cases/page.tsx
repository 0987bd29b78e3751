import { Card, PageHeader } from "@/components/ui/card";

export const metadata = { title: "Cases" };

export default function CasesPage() {
  return (
    <>
      <PageHeader title="Cases" lead="Reactions and phase changes evaluated over a temperature span, corrected against naive." />
      <Card>
        <p className="text-sm text-ink-soft">
          The case builder arrives after the library: pick species and pinned model versions, set the span and tolerance,
          and see ΔG(T), K(T) and crossover temperatures with the naive shortcut drawn beside them.
        </p>
      </Card>
    </>
  );
}
