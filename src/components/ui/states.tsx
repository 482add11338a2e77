import type { ReactNode } from "react";
import { ApiError } from "@/lib/api-client";
import { cn } from "@/lib/cn";
import { Button } from "./button";

/** An empty list: what is missing and what to do next. */
export function EmptyState({
  title,
  children,
  action,
}: {
  title: string;
  children?: ReactNode;
  action?: ReactNode;
}) {
  return (
    <div className="flex flex-col items-start gap-1 rounded border border-dashed border-paper-400 bg-paper-50 px-4 py-5">
      <p className="text-sm font-medium text-ink-800">{title}</p>
      {children && <div className="text-sm text-ink-600">{children}</div>}
      {action && <div className="mt-2">{action}</div>}
    </div>
  );
}

/** A failed load with the server's message and a retry button. */
export function ErrorState({
  error,
  onRetry,
  title = "This could not be loaded",
}: {
  error: unknown;
  onRetry?: () => void;
  title?: string;
}) {
  const message = error instanceof Error ? error.message : "Unknown error";
  const code = error instanceof ApiError ? error.code : undefined;
  return (
    <div
      role="alert"
      className="flex items-start justify-between gap-4 rounded border border-fail-100 bg-fail-50 px-4 py-3"
    >
      <div>
        <p className="text-sm font-medium text-fail-800">{title}</p>
        <p className="text-sm text-fail-700">
          {message}
          {code && <span className="ml-2 font-mono text-xs">({code})</span>}
        </p>
      </div>
      {onRetry && (
        <Button size="sm" onClick={onRetry}>
          Retry
        </Button>
      )}
    </div>
  );
}

/** A grey placeholder bar while data loads. */
export function Skeleton({ className }: { className?: string }) {
  return <div aria-hidden="true" className={cn("animate-pulse rounded bg-paper-300/70", className)} />;
}

/** Placeholder rows in the shape of a table. */
export function TableSkeleton({ rows = 4, label = "Loading" }: { rows?: number; label?: string }) {
  return (
    <div
      role="status"
      aria-label={label}
      className="flex flex-col gap-2 rounded border border-paper-300 bg-paper-50 p-3"
    >
      <Skeleton className="h-4 w-1/3" />
      {Array.from({ length: rows }, (_, i) => (
        <Skeleton key={i} className="h-5 w-full" />
      ))}
    </div>
  );
}
