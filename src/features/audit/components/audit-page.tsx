import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { Input } from "@/components/ui/input";
import { PageHeader } from "@/components/ui/page";
import { EmptyState, ErrorState, TableSkeleton } from "@/components/ui/states";
import { Table, Td, Th, Tr } from "@/components/ui/table";
import { formatDateTime } from "@/lib/format";
import { useUrlParams } from "@/lib/use-url-params";
import { auditCsvHref, useAuditOptions, useAuditPage } from "../api/get-audit";
import { readAuditUrl, toApiFilter, writeAuditUrl, type AuditUrlState } from "../lib/filters";

const SELECT =
  "h-8 w-full rounded border border-paper-400 bg-white px-2 text-sm text-ink-900 focus:border-signal-600 focus:outline-none focus-visible:outline-2 focus-visible:outline-signal-500";

/** `/admin/audit`: the append-only trail, filtered by project, user, action and days; filters live in the URL. */
export function AuditPage() {
  const [params, writeParams] = useUrlParams();
  const state = readAuditUrl(params);
  const filter = toApiFilter(state);
  const before = /^\d+$/.test(state.before) ? Number(state.before) : undefined;
  const page = useAuditPage(filter, before);
  const options = useAuditOptions();

  // Any filter change starts again at the newest row.
  const set = (patch: Partial<AuditUrlState>) =>
    writeParams((current) => writeAuditUrl({ ...readAuditUrl(current), before: "", ...patch }), {
      replace: false,
    });
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
        <FilterSelect
          label="Project"
          anyLabel="Any project"
          value={state.projectId}
          onChange={(v) => set({ projectId: v })}
          options={options.data?.projects.map((p) => ({ value: String(p.id), label: p.name })) ?? []}
        />
        <FilterSelect
          label="User"
          anyLabel="Anyone"
          value={state.userId}
          onChange={(v) => set({ userId: v })}
          options={options.data?.users.map((u) => ({ value: String(u.id), label: u.username })) ?? []}
        />
        <FilterSelect
          label="Action"
          anyLabel="Any action"
          value={state.action}
          onChange={(v) => set({ action: v })}
          options={areas([...(options.data?.actions ?? []), ...(state.action ? [state.action] : [])]).map(
            (a) => ({
              value: a,
              label: a.endsWith(".") ? `${a}* (all)` : a,
            }),
          )}
        />
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
            onClick={() => writeParams(() => new URLSearchParams(), { replace: false })}
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
        <div
          data-testid="audit-results"
          aria-busy={page.isPlaceholderData}
          className={page.isPlaceholderData ? "opacity-60" : undefined}
        >
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
                writeParams(
                  (current) =>
                    writeAuditUrl({ ...readAuditUrl(current), before: String(page.data.nextBefore ?? "") }),
                  { replace: false },
                )
              }
            >
              Older
            </Button>
          </nav>
        </div>
      )}
    </div>
  );
}

/** A labelled select whose first choice ("any") clears the filter. */
function FilterSelect(props: {
  label: string;
  anyLabel: string;
  value: string;
  onChange: (value: string) => void;
  options: readonly { value: string; label: string }[];
}) {
  return (
    <Field label={props.label}>
      {({ id }) => (
        <select
          id={id}
          className={SELECT}
          value={props.value}
          onChange={(e) => props.onChange(e.target.value)}
        >
          <option value="">{props.anyLabel}</option>
          {props.options.map((o) => (
            <option key={o.value} value={o.value}>
              {o.label}
            </option>
          ))}
        </select>
      )}
    </Field>
  );
}

/** Known actions plus one "area." entry per area (auth., user., …) for whole-area filtering. */
function areas(actions: readonly string[]): string[] {
  const prefixes = new Set(actions.map((a) => `${a.split(".")[0]}.`));
  return [...new Set([...prefixes, ...actions])].sort();
}
