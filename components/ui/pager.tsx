import Link from "next/link";
import type { ReactNode } from "react";
import { buttonClass } from "./button";

/**
 * Previous / next links under a server-rendered list (the page or cursor lives in the URL). A side
 * with no href keeps its place empty so the other side and the status stay where they are.
 */
export function Pager({
  previousHref,
  nextHref,
  previousLabel = "← Previous",
  nextLabel = "Next →",
  status,
  className = "mt-4",
}: {
  previousHref?: string | null;
  nextHref?: string | null;
  previousLabel?: string;
  nextLabel?: string;
  /** Between the two links, e.g. "Page 2 of 5". */
  status?: ReactNode;
  className?: string;
}) {
  if (!previousHref && !nextHref) return null;
  return (
    <nav aria-label="Pages" className={`${className} flex items-center justify-between gap-3 text-sm`}>
      {previousHref ? (
        <Link className={buttonClass("secondary")} href={previousHref}>
          {previousLabel}
        </Link>
      ) : (
        <span />
      )}
      {status ? <span className="text-ink-muted">{status}</span> : <span />}
      {nextHref ? (
        <Link className={buttonClass("secondary")} href={nextHref}>
          {nextLabel}
        </Link>
      ) : (
        <span />
      )}
    </nav>
  );
}
