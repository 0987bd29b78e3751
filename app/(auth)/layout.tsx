import { Wordmark } from "@/components/shell/wordmark";

export default function AuthLayout({ children }: { children: React.ReactNode }) {
  return (
    <main className="flex min-h-screen items-center justify-center px-4 py-12">
      <div className="w-full max-w-sm">
        <div className="mb-8 text-center">
          <Wordmark className="text-2xl text-ink" />
          <p className="mt-2 text-sm text-ink-muted">Reaction thermodynamics, corrected for temperature.</p>
        </div>
        <div className="rounded-lg border border-ink-line bg-white p-6 shadow-card">{children}</div>
      </div>
    </main>
  );
}
