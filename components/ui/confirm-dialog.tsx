"use client";

import { useEffect, useId, useRef } from "react";

/**
 * Asks once before an act that cannot be taken back. A native modal <dialog>: the browser keeps
 * focus inside it, Escape cancels, and the page behind cannot be used meanwhile. The title says
 * the act, the text says what will happen; the safe choice has the focus.
 */
export function ConfirmDialog({
  open,
  title,
  children,
  confirmLabel,
  cancelLabel = "Cancel",
  onConfirm,
  onCancel,
}: {
  open: boolean;
  title: string;
  children: React.ReactNode;
  confirmLabel: string;
  cancelLabel?: string;
  onConfirm: () => void;
  onCancel: () => void;
}) {
  const ref = useRef<HTMLDialogElement>(null);
  const titleId = useId();
  const bodyId = useId();

  useEffect(() => {
    const dialog = ref.current;
    if (!dialog) return;
    if (open && !dialog.open) dialog.showModal();
    if (!open && dialog.open) dialog.close();
  }, [open]);

  return (
    <dialog
      ref={ref}
      aria-labelledby={titleId}
      aria-describedby={bodyId}
      className="m-auto w-full max-w-lg rounded-lg border-2 border-ink bg-white p-0 text-ink backdrop:bg-ink/60"
      onCancel={(e) => {
        e.preventDefault();
        onCancel();
      }}
    >
      {open && (
        <div className="space-y-4 p-6">
          <h2 id={titleId} className="text-lead font-bold">
            {title}
          </h2>
          <div id={bodyId} className="space-y-2">
            {children}
          </div>
          <div className="flex flex-wrap justify-end gap-3 pt-2">
            <button type="button" className="btn-quiet" onClick={onCancel} autoFocus>
              {cancelLabel}
            </button>
            <button type="button" className="btn-primary" onClick={onConfirm}>
              {confirmLabel}
            </button>
          </div>
        </div>
      )}
    </dialog>
  );
}
