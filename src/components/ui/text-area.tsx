import { forwardRef, type TextareaHTMLAttributes } from "react";
import { textBoxClass } from "./input";

/** A multi-line plain-text input with the house border and focus ring. */
export const TextArea = forwardRef<
  HTMLTextAreaElement,
  TextareaHTMLAttributes<HTMLTextAreaElement> & { invalid?: boolean }
>(function TextArea({ className, invalid, ...rest }, ref) {
  return (
    <textarea
      ref={ref}
      aria-invalid={invalid || undefined}
      className={textBoxClass(invalid, "py-1.5", className)}
      {...rest}
    />
  );
});

/** True for Ctrl+Enter (Cmd+Enter on a Mac): the "post" chord of every text box here. */
export function isSubmitChord(e: { key: string; ctrlKey: boolean; metaKey: boolean }): boolean {
  return e.key === "Enter" && (e.ctrlKey || e.metaKey);
}
