/** Heatpath's mark: a rising path from cold to hot. */
export function Wordmark({ className = "" }: { className?: string }) {
  return (
    <span className={`inline-flex items-center gap-2 font-semibold tracking-tight ${className}`}>
      <svg width="22" height="22" viewBox="0 0 22 22" aria-hidden="true">
        <defs>
          <linearGradient id="hp-path" x1="0" y1="1" x2="1" y2="0">
            <stop offset="0" stopColor="#1f7a99" />
            <stop offset="1" stopColor="#e0591b" />
          </linearGradient>
        </defs>
        <path d="M2 18 C 7 18, 8 6, 12 9 S 17 4, 20 3" fill="none" stroke="url(#hp-path)" strokeWidth="3" strokeLinecap="round" />
      </svg>
      Heatpath
    </span>
  );
}
