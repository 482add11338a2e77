import { forwardRef, type InputHTMLAttributes } from "react";
import { cn } from "@/lib/cn";

/** The house text-box look (border, focus ring, red border when invalid), shared by Input and TextArea. */
export function textBoxClass(invalid: boolean | undefined, ...extra: Array<string | undefined>): string {
  return cn(
    "w-full rounded border bg-white px-2.5 text-sm text-ink-900 placeholder:text-ink-500",
    "focus:border-signal-600 focus:outline-none focus-visible:outline-2 focus-visible:outline-signal-500",
    invalid ? "border-fail-600" : "border-paper-400",
    ...extra,
  );
}

/** A single-line text input with the house border and focus ring. */
export const Input = forwardRef<
  HTMLInputElement,
  InputHTMLAttributes<HTMLInputElement> & { invalid?: boolean }
>(function Input({ className, invalid, ...rest }, ref) {
  return (
    <input
      ref={ref}
      aria-invalid={invalid || undefined}
      className={textBoxClass(invalid, "h-8", className)}
      {...rest}
    />
  );
});
