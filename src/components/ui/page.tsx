import type { ReactNode } from "react";

/** A page's title row: heading, a line of context, and the one primary action at the right. */
export function PageHeader({
  title,
  subtitle,
  action,
}: {
  title: ReactNode;
  subtitle?: ReactNode;
  action?: ReactNode;
}) {
  return (
    <div className="mb-5 flex items-end justify-between gap-4 border-b border-paper-300 pb-3">
      <div className="min-w-0">
        <h1 className="truncate text-xl font-semibold tracking-tight text-ink-900">{title}</h1>
        {subtitle && <div className="mt-0.5 text-sm text-ink-600">{subtitle}</div>}
      </div>
      {action && <div className="flex shrink-0 items-center gap-2">{action}</div>}
    </div>
  );
}

/** A titled block inside a page (no frame of its own: the table or list inside brings one). */
export function Section({
  title,
  action,
  children,
}: {
  title: string;
  action?: ReactNode;
  children: ReactNode;
}) {
  return (
    <section className="mb-6" aria-label={title}>
      <div className="mb-2 flex items-center justify-between">
        <h2 className="text-sm font-semibold text-ink-800">{title}</h2>
        {action}
      </div>
      {children}
    </section>
  );
}
