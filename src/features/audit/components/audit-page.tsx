import { useSearchParams } from "react-router-dom";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { Input } from "@/components/ui/input";
import { PageHeader } from "@/components/ui/page";
import { EmptyState, ErrorState, TableSkeleton } from "@/components/ui/states";
import { Table, Td, Th, Tr } from "@/components/ui/table";
import { formatDateTime } from "@/lib/format";
import { auditCsvHref, useAuditOptions, useAuditPage } from "../api/get-audit";
import { readAuditUrl, toApiFilter, writeAuditUrl, type AuditUrlState } from "../lib/filters";

const SELECT =
  "h-8 w-full rounded border border-paper-400 bg-white px-2 text-sm text-ink-900 focus:border-signal-600 focus:outline-none focus-visible:outline-2 focus-visible:outline-signal-500";

/** `/admin/audit`: the append-only trail, filtered by project, user, action and days; filters live in the URL. */
export function AuditPage() {
  const [params, setParams] = useSearchParams();
  const state = readAuditUrl(params);
  const filter = toApiFilter(state);
  const before = /^\d+$/.test(state.before) ? Number(state.before) : undefined;
  const page = useAuditPage(filter, before);
  const options = useAuditOptions();

  // Any filter change starts again at the newest row.
  const set = (patch: Partial<AuditUrlState>) => setParams(writeAuditUrl({ ...state, before: "", ...patch }));
  const filtered = state.projectId || state.userId || state.action || state.from || state.to;

  return (
    <div>
      <PageHeader
        title="Audit trail"
        subtitle="Every sign-in, change and download, as it happened. Rows are never changed or removed."
        action={
          <a
            href={auditCsvHref(filter)}
            download
            className="inline-flex h-8 items-center rounded border border-signal-800 bg-signal-700 px-3 text-sm font-medium text-white hover:bg-signal-800 focus-visible:outline-2 focus-visible:outline-signal-500"
          >
            Export CSV
          </a>
        }
      />
      <form
        aria-label="Filters"
        className="mb-4 grid grid-cols-2 gap-3 md:grid-cols-6"
        onSubmit={(e) => e.preventDefault()}
      >
        <Field label="Project">
          {({ id }) => (
            <select
              id={id}
              className={SELECT}
              value={state.projectId}
              onChange={(e) => set({ projectId: e.target.value })}
            >
              <option value="">Any project</option>
              {options.data?.projects.map((p) => (
                <option key={p.id} value={String(p.id)}>
                  {p.name}
                </option>
              ))}
            </select>
          )}
        </Field>
        <Field label="User">
          {({ id }) => (
            <select
              id={id}
              className={SELECT}
              value={state.userId}
              onChange={(e) => set({ userId: e.target.value })}
            >
              <option value="">Anyone</option>
              {options.data?.users.map((u) => (
                <option key={u.id} value={String(u.id)}>
                  {u.username}
                </option>
              ))}
            </select>
          )}
        </Field>
        <Field label="Action">
          {({ id }) => (
            <select
              id={id}
              className={SELECT}
              value={state.action}
              onChange={(e) => set({ action: e.target.value })}
            >
              <option value="">Any action</option>
              {areas(options.data?.actions ?? []).map((a) => (
                <option key={a} value={a}>
                  {a.endsWith(".") ? `${a}* (all)` : a}
                </option>
              ))}
            </select>
          )}
        </Field>
        <Field label="From (day)">
          {({ id }) => (
            <Input id={id} type="date" value={state.from} onChange={(e) => set({ from: e.target.value })} />
          )}
        </Field>
        <Field label="To (day, inclusive)">
          {({ id }) => (
            <Input id={id} type="date" value={state.to} onChange={(e) => set({ to: e.target.value })} />
          )}
        </Field>
        <div className="flex items-end">
          <Button
            type="button"
            variant="ghost"
            disabled={!filtered}
            onClick={() => setParams(new URLSearchParams())}
          >
            Clear filters
          </Button>
        </div>
      </form>

      {page.isPending ? (
        <TableSkeleton rows={8} label="Loading the audit trail" />
      ) : page.isError ? (
        <ErrorState error={page.error} onRetry={() => void page.refetch()} />
      ) : page.data.events.length === 0 ? (
        <EmptyState title={filtered ? "No events match these filters" : "No events yet"}>
          {filtered
            ? "Widen the time range or clear a filter."
            : "Sign-ins and changes appear here as they happen."}
        </EmptyState>
      ) : (
        <>
          <Table label="Audit events">
            <thead>
              <tr>
                <Th numeric>#</Th>
                <Th>When</Th>
                <Th>Who</Th>
                <Th>Action</Th>
                <Th>Project</Th>
                <Th>What happened</Th>
                <Th>Address</Th>
              </tr>
            </thead>
            <tbody>
              {page.data.events.map((e) => (
                <Tr key={e.id}>
                  <Td numeric>{e.id}</Td>
                  <Td className="whitespace-nowrap font-mono text-[13px]">
                    <time dateTime={e.at}>{formatDateTime(e.at)}</time>
                  </Td>
                  <Td>{e.actorUsername ?? (e.actorKind === "system" ? "system" : "—")}</Td>
                  <Td className="font-mono text-[13px]">{e.action}</Td>
                  <Td>{e.projectSlug ?? "—"}</Td>
                  <Td className="max-w-md break-words">{e.summary}</Td>
                  <Td className="font-mono text-[13px]">{e.ip ?? "—"}</Td>
                </Tr>
              ))}
            </tbody>
          </Table>
          <nav aria-label="Pages" className="mt-3 flex items-center justify-end gap-2">
            <Button size="sm" disabled={before === undefined} onClick={() => set({ before: "" })}>
              Newest
            </Button>
            <Button
              size="sm"
              disabled={page.data.nextBefore === null}
              onClick={() =>
                setParams(writeAuditUrl({ ...state, before: String(page.data.nextBefore ?? "") }))
              }
            >
              Older
            </Button>
          </nav>
        </>
      )}
    </div>
  );
}

/** Known actions plus one "area." entry per area (auth., user., …) for whole-area filtering. */
function areas(actions: readonly string[]): string[] {
  const prefixes = new Set(actions.map((a) => `${a.split(".")[0]}.`));
  return [...new Set([...prefixes, ...actions])].sort();
}
