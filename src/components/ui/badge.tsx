import type { ReactNode } from "react";
import { cn } from "@/lib/cn";

type Tone = "neutral" | "signal" | "copper" | "pass" | "warn" | "fail";

const TONES: Record<Tone, string> = {
  neutral: "bg-ink-100 text-ink-800 border-ink-200",
  signal: "bg-signal-50 text-signal-800 border-signal-200",
  copper: "bg-copper-50 text-copper-800 border-copper-200",
  pass: "bg-pass-50 text-pass-700 border-pass-100",
  warn: "bg-warn-50 text-warn-800 border-warn-100",
  fail: "bg-fail-50 text-fail-700 border-fail-100",
};

/** A small label for a state or a role. */
export function Badge({
  tone = "neutral",
  children,
  className,
}: {
  tone?: Tone;
  children: ReactNode;
  className?: string;
}) {
  return (
    <span
      className={cn(
        "inline-flex items-center whitespace-nowrap rounded-sm border px-1.5 py-px text-xs font-medium leading-4",
        TONES[tone],
        className,
      )}
    >
      {children}
    </span>
  );
}
