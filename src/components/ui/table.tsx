import type { HTMLAttributes, ReactNode, TdHTMLAttributes, ThHTMLAttributes } from "react";
import { cn } from "@/lib/cn";

/**
 * A compact data table in a bordered frame; `label` names it for assistive tech. `scrollable`: a table wide
 * enough to scroll sideways gets a keyboard stop on its frame, so it can be scrolled without a mouse.
 */
export function Table({
  label,
  children,
  className,
  scrollable,
}: {
  label: string;
  children: ReactNode;
  className?: string;
  scrollable?: boolean;
}) {
  return (
    <div
      className={cn("overflow-x-auto rounded border border-paper-300 bg-paper-50", className)}
      {...(scrollable ? { tabIndex: 0, role: "region", "aria-label": `${label} (scrolls sideways)` } : {})}
    >
      <table aria-label={label} className="w-full border-collapse text-sm">
        {children}
      </table>
    </div>
  );
}

/** Header cell; `numeric` right-aligns it over a column of numbers. */
export function Th({
  numeric,
  className,
  ...rest
}: ThHTMLAttributes<HTMLTableCellElement> & { numeric?: boolean }) {
  return (
    <th
      scope="col"
      className={cn(
        "border-b border-paper-300 bg-paper-100 px-3 py-1.5 text-xs font-semibold text-ink-700",
        numeric ? "text-right" : "text-left",
        className,
      )}
      {...rest}
    />
  );
}

/** Body cell; `numeric` sets mono tabular figures, right-aligned. */
export function Td({
  numeric,
  className,
  ...rest
}: TdHTMLAttributes<HTMLTableCellElement> & { numeric?: boolean }) {
  return (
    <td
      className={cn(
        "border-b border-paper-200 px-3 py-1.5 align-middle",
        numeric && "text-right font-mono text-[13px]",
        className,
      )}
      {...rest}
    />
  );
}

/** A body row with a calm hover. */
export function Tr({ className, ...rest }: HTMLAttributes<HTMLTableRowElement>) {
  return <tr className={cn("hover:bg-paper-100 last:[&>td]:border-b-0", className)} {...rest} />;
}
