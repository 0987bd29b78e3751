import Link from "next/link";

/** Shown with status 403 when a signed-in member opens a page their role does not allow. */
export default function Forbidden() {
  return (
    <main className="mx-auto max-w-lg px-4 py-24 text-center">
      <h1 className="text-2xl font-semibold">Not allowed</h1>
      <p className="mt-2 text-sm text-ink-muted">Your role in this team does not allow this page. An admin can change roles on the Team page.</p>
      <Link href="/" className="mt-6 inline-block text-sm font-medium text-frost-600 underline">
        Back to Home
      </Link>
    </main>
  );
}
