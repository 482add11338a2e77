import { cn } from "@/lib/cn";

/** Tapwright's mark: a compressed pulse, one tall narrow peak over low sidelobes. */
export function Mark({ className }: { className?: string }) {
  return (
    <svg viewBox="0 0 32 32" aria-hidden="true" className={cn("shrink-0", className)}>
      <rect width="32" height="32" rx="6" className="fill-ink-950" />
      <path
        d="M3 25h4l1.5-2 1.5 2h2l1.5-4L15 6h2l1.5 15 1.5 4h2l1.5-2 1.5 2h4"
        fill="none"
        className="stroke-signal-300"
        strokeWidth="2"
        strokeLinejoin="round"
        strokeLinecap="round"
      />
      <circle cx="16" cy="6" r="1.6" className="fill-copper-400" />
    </svg>
  );
}

/** The mark beside the word "Tapwright". */
export function Wordmark({ className }: { className?: string }) {
  return (
    <span className={cn("inline-flex items-center gap-2", className)}>
      <Mark className="h-7 w-7" />
      <span className="text-[15px] font-semibold tracking-tight">Tapwright</span>
    </span>
  );
}
