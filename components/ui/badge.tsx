import type { ReactNode } from "react";

type Tone = "neutral" | "ember" | "frost" | "moss" | "flag";

const tones: Record<Tone, string> = {
  neutral: "bg-paper-deep text-ink-soft ring-ink-line",
  ember: "bg-ember-50 text-ember-700 ring-ember-100",
  frost: "bg-frost-50 text-frost-700 ring-frost-100",
  moss: "bg-moss-50 text-moss-700 ring-moss-600/20",
  flag: "bg-flag-50 text-flag-700 ring-flag-600/20",
};

export function Badge({ tone = "neutral", children }: { tone?: Tone; children: ReactNode }) {
  return <span className={`inline-flex items-center rounded-full px-2 py-0.5 text-xs font-medium ring-1 ring-inset ${tones[tone]}`}>{children}</span>;
}
