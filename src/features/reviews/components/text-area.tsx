import { forwardRef, type TextareaHTMLAttributes } from "react";
import { cn } from "@/lib/cn";

/** A multi-line plain-text input with the house border and focus ring. */
export const TextArea = forwardRef<
  HTMLTextAreaElement,
  TextareaHTMLAttributes<HTMLTextAreaElement> & { invalid?: boolean }
>(function TextArea({ className, invalid, ...rest }, ref) {
  return (
    <textarea
      ref={ref}
      aria-invalid={invalid || undefined}
      className={cn(
        "w-full rounded border bg-white px-2.5 py-1.5 text-sm text-ink-900 placeholder:text-ink-500",
        "focus:border-signal-600 focus:outline-none focus-visible:outline-2 focus-visible:outline-signal-500",
        invalid ? "border-fail-600" : "border-paper-400",
        className,
      )}
      {...rest}
    />
  );
});

/** True for Ctrl+Enter (Cmd+Enter on a Mac): the "post" chord of every text box here. */
export function isSubmitChord(e: { key: string; ctrlKey: boolean; metaKey: boolean }): boolean {
  return e.key === "Enter" && (e.ctrlKey || e.metaKey);
}
