import { forwardRef, type ButtonHTMLAttributes } from "react";
import { cn } from "@/lib/cn";

type Variant = "primary" | "secondary" | "ghost" | "danger" | "danger-quiet";

const VARIANTS: Record<Variant, string> = {
  primary: "bg-signal-700 text-white hover:bg-signal-800 border-signal-800",
  secondary: "bg-paper-50 text-ink-800 hover:bg-paper-200 border-paper-400",
  ghost: "bg-transparent text-ink-700 hover:bg-paper-200 border-transparent",
  danger: "bg-fail-600 text-white hover:bg-fail-700 border-fail-700",
  // A destructive step offered on every row of a table: outlined, so a list does not read as a column of alarms;
  // the confirm dialog it opens carries the solid `danger` button.
  "danger-quiet": "bg-transparent text-fail-700 hover:bg-fail-50 border-paper-400 hover:border-fail-600",
};

/** A button; `primary` is for the one main action of a page or dialog. */
export const Button = forwardRef<
  HTMLButtonElement,
  ButtonHTMLAttributes<HTMLButtonElement> & { variant?: Variant; size?: "sm" | "md"; busy?: boolean }
>(function Button(
  { variant = "secondary", size = "md", busy = false, className, disabled, children, type, ...rest },
  ref,
) {
  return (
    <button
      ref={ref}
      type={type ?? "button"}
      disabled={disabled || busy}
      aria-busy={busy || undefined}
      className={cn(
        "inline-flex items-center justify-center gap-1.5 rounded border font-medium whitespace-nowrap transition-colors",
        "disabled:cursor-not-allowed disabled:opacity-60",
        size === "sm" ? "h-7 px-2.5 text-xs" : "h-8 px-3 text-sm",
        VARIANTS[variant],
        className,
      )}
      {...rest}
    >
      {busy && (
        <span
          className="h-3 w-3 animate-spin rounded-full border-2 border-current border-r-transparent"
          aria-hidden="true"
        />
      )}
      {children}
    </button>
  );
});
