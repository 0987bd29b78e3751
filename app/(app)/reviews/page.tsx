import { Card, PageHeader } from "@/components/ui/card";

export const metadata = { title: "Reviews" };

export default function ReviewsPage() {
  return (
    <>
      <PageHeader title="Reviews" lead="Submitted cases waiting for a reviewer's decision." />
      <Card>
        <p className="text-sm text-ink-soft">
          The review queue arrives with cases: each submitted case freezes a result snapshot that a reviewer approves or
          returns with comments.
        </p>
      </Card>
    </>
  );
}
