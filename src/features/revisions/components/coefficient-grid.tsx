import { useVirtualizer } from "@tanstack/react-virtual";
import { useRef, useState, type FormEvent } from "react";
import type { CoefficientTable } from "@shared/schemas/designs";
import { Button } from "@/components/ui/button";
import { Input } from "@/components/ui/input";
import { ErrorState, Skeleton } from "@/components/ui/states";
import { formatCount } from "@/lib/format";
import { useTableValues } from "../api/get-table-values";
import type { Samples } from "../lib/signal-views";

const ROW_PX = 24;
/**
 * Rows per page. Browsers cap an element's height (about 33.5 M px in Chromium), so 4 M rows of 24 px cannot
 * live in one scroll area: pages of 2^19 rows (12.6 M px) stay well under it.
 */
export const ROWS_PER_PAGE = 524_288;

/** Full precision: the shortest decimal that reads back as the same float64. */
const full = (v: number) => String(v);

function Grid({ table, samples }: { table: CoefficientTable; samples: Samples }) {
  const n = samples.re.length;
  const pages = Math.ceil(n / ROWS_PER_PAGE);
  const [page, setPage] = useState(0);
  const [jump, setJump] = useState("");
  const scroller = useRef<HTMLDivElement>(null);
  const first = page * ROWS_PER_PAGE;
  const count = Math.min(ROWS_PER_PAGE, n - first);
  const virtual = useVirtualizer({
    count,
    getScrollElement: () => scroller.current,
    estimateSize: () => ROW_PX,
    overscan: 20,
  });
  const items = virtual.getVirtualItems();
  const top = items[0]?.start ?? 0;
  const bottom = virtual.getTotalSize() - (items[items.length - 1]?.end ?? 0);

  const goTo = (e: FormEvent) => {
    e.preventDefault();
    const index = Number(jump);
    if (!Number.isInteger(index) || index < 0 || index >= n) return;
    const target = Math.floor(index / ROWS_PER_PAGE);
    setPage(target);
    // Wait for the page's rows to exist before scrolling to the one asked for.
    requestAnimationFrame(() => virtual.scrollToIndex(index - target * ROWS_PER_PAGE, { align: "center" }));
  };
  const label = `${table.role} coefficients`;

  return (
    <div className="flex flex-col gap-2">
      <div className="flex flex-wrap items-center justify-between gap-2 text-xs text-ink-600">
        <span>
          Rows <span className="font-mono">{formatCount(first)}</span>–
          <span className="font-mono">{formatCount(first + count - 1)}</span> of{" "}
          <span className="font-mono">{formatCount(n)}</span>
          {pages > 1 && (
            <>
              {" "}
              · page {page + 1} of {pages}{" "}
              <Button size="sm" variant="ghost" disabled={page === 0} onClick={() => setPage(page - 1)}>
                Previous page
              </Button>
              <Button
                size="sm"
                variant="ghost"
                disabled={page === pages - 1}
                onClick={() => setPage(page + 1)}
              >
                Next page
              </Button>
            </>
          )}
        </span>
        <form onSubmit={goTo} className="flex items-center gap-1">
          <label htmlFor={`jump-${table.id}`}>Go to index</label>
          <Input
            id={`jump-${table.id}`}
            inputMode="numeric"
            value={jump}
            onChange={(e) => setJump(e.target.value)}
            className="h-7 w-28 font-mono"
          />
          <Button size="sm" type="submit">
            Go
          </Button>
        </form>
      </div>
      <div
        ref={scroller}
        tabIndex={0}
        role="region"
        aria-label={`${label}, scrollable`}
        className="h-72 overflow-auto rounded border border-paper-300 bg-paper-50"
      >
        <table
          aria-label={label}
          aria-rowcount={n + 1}
          className="w-full border-collapse font-mono text-[12px]"
        >
          <thead className="sticky top-0 bg-paper-100 font-sans">
            <tr>
              <th
                scope="col"
                className="border-b border-paper-300 px-3 py-1 text-right text-xs font-semibold text-ink-700"
              >
                n
              </th>
              <th
                scope="col"
                className="border-b border-paper-300 px-3 py-1 text-right text-xs font-semibold text-ink-700"
              >
                {table.complex ? "I (real)" : "Value"}
              </th>
              {table.complex && (
                <th
                  scope="col"
                  className="border-b border-paper-300 px-3 py-1 text-right text-xs font-semibold text-ink-700"
                >
                  Q (imaginary)
                </th>
              )}
              <th
                scope="col"
                className="border-b border-paper-300 px-3 py-1 text-right text-xs font-semibold text-ink-700"
              >
                |h|
              </th>
            </tr>
          </thead>
          <tbody>
            {top > 0 && <tr aria-hidden="true" style={{ height: top }} />}
            {items.map((row) => {
              const i = first + row.index;
              const re = samples.re[i]!;
              const im = samples.im[i]!;
              return (
                <tr
                  key={row.key}
                  aria-rowindex={i + 2}
                  style={{ height: ROW_PX }}
                  className="text-right text-ink-900 hover:bg-paper-100"
                >
                  <td className="px-3 text-ink-600">{i}</td>
                  <td className="px-3">{full(re)}</td>
                  {table.complex && <td className="px-3">{full(im)}</td>}
                  <td className="px-3 text-ink-700">{full(Math.hypot(re, im))}</td>
                </tr>
              );
            })}
            {bottom > 0 && <tr aria-hidden="true" style={{ height: bottom }} />}
          </tbody>
        </table>
      </div>
    </div>
  );
}

/** Every coefficient of a table at full float64 precision, virtualized (only visible rows exist in the DOM). */
export function CoefficientGrid({ revisionId, table }: { revisionId: number; table: CoefficientTable }) {
  const values = useTableValues(revisionId, table.id);
  if (values.isPending) return <Skeleton className="h-72 w-full" />;
  if (values.isError) return <ErrorState error={values.error} onRetry={() => void values.refetch()} />;
  return <Grid table={table} samples={values.data} />;
}
