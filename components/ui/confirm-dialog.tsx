"use client";

import { useEffect, useId, useRef } from "react";
import { Button } from "./button";

/**
 * A modal confirmation (the native <dialog>): focus moves into it, Escape or Cancel closes
 * it, and nothing is sent until the confirm button is pressed.
 */
export function ConfirmDialog({
  open,
  title,
  children,
  confirmLabel,
  tone = "primary",
  busy = false,
  onConfirm,
  onCancel,
}: {
  open: boolean;
  title: string;
  children?: React.ReactNode;
  confirmLabel: string;
  tone?: "primary" | "danger";
  busy?: boolean;
  onConfirm: () => void;
  onCancel: () => void;
}) {
  const ref = useRef<HTMLDialogElement>(null);
  const titleId = useId();
  useEffect(() => {
    const d = ref.current;
    if (!d) return;
    if (open && !d.open) d.showModal();
    if (!open && d.open) d.close();
  }, [open]);
  return (
    <dialog
      ref={ref}
      aria-labelledby={titleId}
      onCancel={(e) => {
        e.preventDefault();
        onCancel();
      }}
      className="m-auto w-[min(32rem,calc(100vw-2rem))] rounded-lg border border-ink-line bg-white p-0 text-ink shadow-card backdrop:bg-ink/40"
      data-testid="confirm-dialog"
    >
      {open && (
        <div className="space-y-3 p-5">
          <h2 id={titleId} className="text-base font-semibold">
            {title}
          </h2>
          <div className="space-y-2 text-sm text-ink-soft">{children}</div>
          <div className="flex justify-end gap-2 pt-2">
            <Button type="button" variant="ghost" onClick={onCancel} disabled={busy}>
              Cancel
            </Button>
            <Button type="button" variant={tone} onClick={onConfirm} disabled={busy} autoFocus>
              {confirmLabel}
            </Button>
          </div>
        </div>
      )}
    </dialog>
  );
}
