'use client';

import { useEffect, useRef, type ReactNode } from 'react';

/**
 * A modal question (the browser's <dialog>: focus kept inside, Escape cancels) with what will
 * happen in `children`, a confirm and a cancel button.
 */
export function ConfirmDialog({
  open,
  title,
  confirmLabel,
  confirmDisabled = false,
  onConfirm,
  onCancel,
  children,
}: {
  open: boolean;
  title: string;
  confirmLabel: string;
  confirmDisabled?: boolean;
  onConfirm(): void;
  onCancel(): void;
  children: ReactNode;
}) {
  const ref = useRef<HTMLDialogElement>(null);
  useEffect(() => {
    const dialog = ref.current;
    if (!dialog) return;
    if (open && !dialog.open) dialog.showModal();
    if (!open && dialog.open) dialog.close();
  }, [open]);
  return (
    <dialog
      ref={ref}
      aria-labelledby="confirm-dialog-title"
      className="w-[min(40rem,calc(100vw-2rem))] rounded-lg border border-ink-200 p-0 shadow-xl backdrop:bg-ink-950/40"
      onCancel={(event) => {
        event.preventDefault();
        onCancel();
      }}
    >
      {open ? (
        <div className="space-y-4 p-5">
          <h2 id="confirm-dialog-title">{title}</h2>
          <div className="max-h-[60vh] overflow-y-auto text-sm text-ink-800">{children}</div>
          <div className="flex justify-end gap-2">
            <button type="button" className="btn-quiet" onClick={onCancel}>
              Cancel
            </button>
            <button
              type="button"
              className="btn-primary"
              disabled={confirmDisabled}
              onClick={onConfirm}
            >
              {confirmLabel}
            </button>
          </div>
        </div>
      ) : null}
    </dialog>
  );
}
