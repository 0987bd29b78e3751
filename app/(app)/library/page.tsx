import { Card, PageHeader } from "@/components/ui/card";

export const metadata = { title: "Library" };

export default function LibraryPage() {
  return (
    <>
      <PageHeader title="Cp library" lead="Heat-capacity models per species and phase, with versions that stewards approve." />
      <Card>
        <p className="text-sm text-ink-soft">
          The shared model library arrives next: species pages with Cp, H and S curves per version, version comparison,
          fitting from measured data and the four-eyes approval of proposed versions.
        </p>
      </Card>
    </>
  );
}
