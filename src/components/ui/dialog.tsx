import { useEffect, useRef, type ReactNode } from "react";
import { Button } from "./button";

/**
 * A modal on the native <dialog>: the browser traps focus, Esc closes it and the page behind is inert.
 * `onClose` fires for Esc, the close button and a click on the backdrop.
 */
export function Dialog({
  open,
  onClose,
  title,
  description,
  children,
  footer,
}: {
  open: boolean;
  onClose: () => void;
  title: string;
  description?: ReactNode;
  children?: ReactNode;
  footer?: ReactNode;
}) {
  const ref = useRef<HTMLDialogElement>(null);
  useEffect(() => {
    const el = ref.current;
    if (!el) return;
    if (open && !el.open) el.showModal();
    if (!open && el.open) el.close();
  }, [open]);
  return (
    <dialog
      ref={ref}
      aria-labelledby="dialog-title"
      onClose={onClose}
      onCancel={(e) => {
        e.preventDefault();
        onClose();
      }}
      onMouseDown={(e) => {
        if (e.target === ref.current) onClose();
      }}
      className="m-auto w-[min(32rem,calc(100vw-2rem))] rounded-md border border-paper-300 bg-paper-50 p-0 text-ink-900 shadow-xl"
    >
      {open && (
        <div className="flex flex-col">
          <header className="flex items-start justify-between gap-4 border-b border-paper-300 px-5 py-3">
            <div>
              <h2 id="dialog-title" className="text-base font-semibold text-ink-900">
                {title}
              </h2>
              {description && <div className="mt-0.5 text-sm text-ink-600">{description}</div>}
            </div>
            <button
              type="button"
              onClick={onClose}
              aria-label="Close"
              className="rounded p-1 text-ink-600 hover:bg-paper-200 hover:text-ink-900"
            >
              <svg viewBox="0 0 16 16" className="h-4 w-4" aria-hidden="true">
                <path d="M4 4l8 8M12 4l-8 8" stroke="currentColor" strokeWidth="1.5" strokeLinecap="round" />
              </svg>
            </button>
          </header>
          {children && <div className="px-5 py-4">{children}</div>}
          {footer && (
            <footer className="flex justify-end gap-2 border-t border-paper-300 bg-paper-100 px-5 py-3">
              {footer}
            </footer>
          )}
        </div>
      )}
    </dialog>
  );
}

/** Cancel plus the dialog's one primary action; `formId` makes the action submit that form. */
export function DialogActions({
  onCancel,
  label,
  busy,
  formId,
  onConfirm,
  variant = "primary",
  disabled = false,
}: {
  onCancel: () => void;
  label: string;
  busy: boolean;
  formId?: string;
  onConfirm?: () => void;
  variant?: "primary" | "danger";
  /** The action waits for something in the dialog (e.g. a confirming checkbox). */
  disabled?: boolean;
}) {
  return (
    <>
      <Button onClick={onCancel}>Cancel</Button>
      <Button
        type={formId ? "submit" : "button"}
        form={formId}
        variant={variant}
        busy={busy}
        disabled={disabled}
        onClick={onConfirm}
      >
        {label}
      </Button>
    </>
  );
}
