import {
  createColumnHelper,
  flexRender,
  getCoreRowModel,
  getFilteredRowModel,
  getSortedRowModel,
  useReactTable,
  type SortingState,
} from "@tanstack/react-table";
import { useEffect, useMemo, useRef, useState } from "react";
import { Link, useNavigationType, useSearchParams } from "react-router-dom";
import {
  DESIGN_KINDS,
  REVISION_STATES,
  type DesignSummary,
  type RevisionState,
} from "@shared/schemas/designs";
import { Badge } from "@/components/ui/badge";
import { Input } from "@/components/ui/input";
import { EmptyState, ErrorState, TableSkeleton } from "@/components/ui/states";
import { Table, Td, Th, Tr } from "@/components/ui/table";
import { cn } from "@/lib/cn";
import { formatDateTime } from "@/lib/format";
import { useDesigns } from "../api/list-designs";
import {
  readListState,
  relativeTime,
  STATE_LABELS,
  writeListState,
  type ListState,
  type SortColumn,
} from "../lib/list-state";

/** Classes of a link that looks like the primary button (links navigate; buttons act). */
export const PRIMARY_LINK =
  "inline-flex h-8 items-center justify-center gap-1.5 rounded border border-signal-800 bg-signal-700 px-3 text-sm font-medium whitespace-nowrap text-white hover:bg-signal-800 focus-visible:outline-2 focus-visible:outline-signal-500";

const STATE_TONES: Record<RevisionState, "neutral" | "signal" | "copper" | "pass" | "warn"> = {
  draft: "neutral",
  in_review: "signal",
  approved: "pass",
  changes_requested: "warn",
  released: "copper",
};

/** A revision state as a coloured label. */
export function StateBadge({ state }: { state: RevisionState }) {
  return <Badge tone={STATE_TONES[state]}>{STATE_LABELS[state]}</Badge>;
}

/** The "New design" link for a project (authors only; the caller decides). */
export function NewDesignLink({ projectId }: { projectId: number }) {
  return (
    <Link to={`/projects/${projectId}/designs/new`} className={PRIMARY_LINK}>
      New design
    </Link>
  );
}

const col = createColumnHelper<DesignSummary>();
// Sort keys are plain values so TanStack sorts them without custom comparators; "—" rows sort last.
const columns = [
  col.accessor("name", {
    id: "name",
    header: "Name",
    cell: (c) => (
      <Link to={`/designs/${c.row.original.id}`} className="font-medium text-signal-800 hover:underline">
        {c.getValue()}
      </Link>
    ),
  }),
  col.accessor("kind", {
    id: "kind",
    header: "Kind",
    cell: (c) => <span className="capitalize">{c.getValue()}</span>,
    filterFn: "equals",
  }),
  col.accessor((d) => d.latestRevision?.number ?? -1, {
    id: "revision",
    header: "Latest revision",
    cell: (c) => (
      <span className="font-mono text-[13px]">
        {c.row.original.latestRevision ? `r${c.row.original.latestRevision.number}` : "—"}
      </span>
    ),
    meta: { numeric: true },
  }),
  col.accessor((d) => d.latestRevision?.state ?? "", {
    id: "state",
    header: "State",
    cell: (c) =>
      c.row.original.latestRevision ? <StateBadge state={c.row.original.latestRevision.state} /> : "—",
    filterFn: "equals",
    sortingFn: (a, b) =>
      REVISION_STATES.indexOf(a.original.latestRevision?.state ?? "draft") -
      REVISION_STATES.indexOf(b.original.latestRevision?.state ?? "draft"),
  }),
  col.accessor((d) => d.latestRelease?.version ?? "", {
    id: "version",
    header: "Latest version",
    cell: (c) => {
      const r = c.row.original.latestRelease;
      if (!r) return <span className="text-ink-600">—</span>;
      return (
        <span className="font-mono text-[13px]">
          {r.version}
          {r.withdrawn && (
            <Badge tone="fail" className="ml-1.5">
              withdrawn
            </Badge>
          )}
        </span>
      );
    },
    sortingFn: "alphanumeric",
  }),
  col.accessor((d) => d.owner.displayName, { id: "owner", header: "Owner" }),
  col.accessor("updatedAt", {
    id: "updated",
    header: "Updated",
    cell: (c) => (
      <time
        dateTime={c.getValue()}
        title={formatDateTime(c.getValue())}
        className="font-mono text-[13px] text-ink-700"
      >
        {relativeTime(c.getValue())}
      </time>
    ),
  }),
];

const SELECT =
  "h-8 rounded border border-paper-400 bg-white px-2 text-sm text-ink-900 focus:border-signal-600 focus:outline-none focus-visible:outline-2 focus-visible:outline-signal-500";

function Toolbar({
  view,
  setView,
  shown,
  total,
}: {
  view: ListState;
  setView: (v: ListState) => void;
  shown: number;
  total: number;
}) {
  return (
    <div className="mb-3 flex flex-wrap items-center gap-3">
      <label htmlFor="design-search" className="sr-only">
        Search designs
      </label>
      <Input
        id="design-search"
        type="search"
        data-page-search
        placeholder="Search by name, owner or description  ( / )"
        className="max-w-xs"
        value={view.q}
        onChange={(e) => setView({ ...view, q: e.target.value })}
      />
      <label className="flex items-center gap-1.5 text-xs text-ink-700">
        Kind
        <select
          className={SELECT}
          value={view.kind}
          onChange={(e) => setView({ ...view, kind: e.target.value as ListState["kind"] })}
        >
          <option value="">All</option>
          {DESIGN_KINDS.map((k) => (
            <option key={k} value={k}>
              {k === "waveform" ? "Waveform" : "Filter"}
            </option>
          ))}
        </select>
      </label>
      <label className="flex items-center gap-1.5 text-xs text-ink-700">
        State
        <select
          className={SELECT}
          value={view.state}
          onChange={(e) => setView({ ...view, state: e.target.value as ListState["state"] })}
        >
          <option value="">All</option>
          {REVISION_STATES.map((s) => (
            <option key={s} value={s}>
              {STATE_LABELS[s]}
            </option>
          ))}
        </select>
      </label>
      {shown !== total && (
        <span className="text-xs text-ink-600" aria-live="polite">
          {shown} of {total}
        </span>
      )}
    </div>
  );
}

/** The designs of a project: sortable, filterable, searchable (`/`), the view kept in the URL. */
export function DesignsTable({ projectId, canCreate }: { projectId: number; canCreate: boolean }) {
  const designs = useDesigns(projectId);
  const [params, setParams] = useSearchParams();
  const urlView = readListState(params);
  // The search box keeps its own text: URL writes are router transitions, and a value read back from the
  // URL drops keystrokes under fast typing. Back/forward and links (not REPLACE) still set it.
  const [q, setQ] = useState(urlView.q);
  const navigationType = useNavigationType();
  const lastUrlQ = useRef(urlView.q);
  useEffect(() => {
    // Only a real URL change (not the mount, where an early keystroke would be wiped) and not our own writes.
    if (urlView.q === lastUrlQ.current) return;
    lastUrlQ.current = urlView.q;
    if (navigationType !== "REPLACE") setQ(urlView.q);
  }, [urlView.q, navigationType]);
  const view = { ...urlView, q };
  const setView = (v: ListState) => {
    setQ(v.q);
    setParams(writeListState(params, v), { replace: true });
  };
  // State handed to TanStack must keep its identity between renders: a fresh array re-sorts every render, and
  // each re-sort queues a page-index reset that renders again — a loop that starves route transitions.
  const sorting: SortingState = useMemo(
    () => [{ id: urlView.sort.id, desc: urlView.sort.desc }],
    [urlView.sort.id, urlView.sort.desc],
  );
  const columnFilters = useMemo(
    () => [
      ...(view.kind ? [{ id: "kind", value: view.kind }] : []),
      ...(view.state ? [{ id: "state", value: view.state }] : []),
    ],
    [view.kind, view.state],
  );
  const data = useMemo(() => designs.data ?? [], [designs.data]);
  const table = useReactTable({
    data,
    columns,
    state: { sorting, columnFilters, globalFilter: view.q },
    onSortingChange: (updater) => {
      const next = typeof updater === "function" ? updater(sorting) : updater;
      const first = next[0];
      setView({
        ...view,
        sort: first
          ? { id: first.id as SortColumn, desc: first.desc }
          : { id: view.sort.id, desc: !view.sort.desc },
      });
    },
    enableSortingRemoval: false,
    autoResetPageIndex: false,
    globalFilterFn: (row, _id, needle: string) => {
      const n = needle.trim().toLowerCase();
      const d = row.original;
      return !n || [d.name, d.description, d.owner.displayName].some((s) => s.toLowerCase().includes(n));
    },
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
  });

  if (designs.isPending) return <TableSkeleton rows={4} label="Loading designs" />;
  if (designs.isError)
    return (
      <ErrorState
        error={designs.error}
        onRetry={() => void designs.refetch()}
        title="The designs could not be loaded"
      />
    );
  if (data.length === 0)
    return (
      <EmptyState
        title="No designs yet — start one from a generator or an upload"
        action={canCreate ? <NewDesignLink projectId={projectId} /> : undefined}
      >
        {canCreate
          ? "A design is one waveform (transmit table plus matched receive filter) or one FIR filter."
          : "Authors of this project create designs; they will be listed here."}
      </EmptyState>
    );
  const rows = table.getRowModel().rows;
  return (
    <>
      <Toolbar view={view} setView={setView} shown={rows.length} total={data.length} />
      {rows.length === 0 ? (
        <EmptyState title="No design matches this search or filter">
          <button
            type="button"
            className="text-signal-800 underline"
            onClick={() => setView({ ...view, q: "", kind: "", state: "" })}
          >
            Clear the search and filters
          </button>{" "}
          to see all {data.length}.
        </EmptyState>
      ) : (
        <Table label="Designs">
          <thead>
            {table.getHeaderGroups().map((hg) => (
              <tr key={hg.id}>
                {hg.headers.map((h) => {
                  const sorted = h.column.getIsSorted();
                  const numeric = (h.column.columnDef.meta as { numeric?: boolean } | undefined)?.numeric;
                  return (
                    <Th
                      key={h.id}
                      numeric={numeric}
                      aria-sort={sorted === "asc" ? "ascending" : sorted === "desc" ? "descending" : "none"}
                    >
                      <button
                        type="button"
                        onClick={h.column.getToggleSortingHandler()}
                        className={cn(
                          "inline-flex items-center gap-1 hover:text-ink-900",
                          numeric && "flex-row-reverse",
                        )}
                      >
                        {flexRender(h.column.columnDef.header, h.getContext())}
                        <span aria-hidden="true" className="w-2 text-ink-500">
                          {sorted === "asc" ? "▲" : sorted === "desc" ? "▼" : ""}
                        </span>
                      </button>
                    </Th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody>
            {rows.map((r) => (
              <Tr key={r.id}>
                {r.getVisibleCells().map((c) => (
                  <Td
                    key={c.id}
                    numeric={(c.column.columnDef.meta as { numeric?: boolean } | undefined)?.numeric}
                  >
                    {flexRender(c.column.columnDef.cell, c.getContext())}
                  </Td>
                ))}
              </Tr>
            ))}
          </tbody>
        </Table>
      )}
    </>
  );
}
