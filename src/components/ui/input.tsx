import { forwardRef, type InputHTMLAttributes } from "react";
import { cn } from "@/lib/cn";

/** A single-line text input with the house border and focus ring. */
export const Input = forwardRef<HTMLInputElement, InputHTMLAttributes<HTMLInputElement> & { invalid?: boolean }>(
  function Input({ className, invalid, ...rest }, ref) {
    return (
      <input
        ref={ref}
        aria-invalid={invalid || undefined}
        className={cn(
          "h-8 w-full rounded border bg-white px-2.5 text-sm text-ink-900 placeholder:text-ink-500",
          "focus:border-signal-600 focus:outline-none focus-visible:outline-2 focus-visible:outline-signal-500",
          invalid ? "border-fail-600" : "border-paper-400",
          className,
        )}
        {...rest}
      />
    );
  },
);
