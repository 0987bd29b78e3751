"use client";

export default function ErrorPage({ reset }: { error: Error; reset: () => void }) {
  return (
    <main className="mx-auto max-w-lg px-4 py-24 text-center">
      <h1 className="text-2xl font-semibold">Something went wrong</h1>
      <p className="mt-2 text-sm text-ink-muted">The page could not be shown. Nothing you saved was lost.</p>
      <button onClick={reset} className="mt-6 rounded-md bg-ink px-4 py-2 text-sm text-paper">
        Try again
      </button>
    </main>
  );
}
