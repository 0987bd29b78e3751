import Link from "next/link";

export default function NotFound() {
  return (
    <main className="mx-auto max-w-lg px-4 py-24 text-center">
      <h1 className="text-2xl font-semibold">Not found</h1>
      <p className="mt-2 text-sm text-ink-muted">That page or record does not exist, or it belongs to another team.</p>
      <Link href="/" className="mt-6 inline-block text-sm font-medium text-frost-600 underline">
        Back to Home
      </Link>
    </main>
  );
}
