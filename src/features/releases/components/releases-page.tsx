import { Link } from "react-router-dom";
import type { Release } from "@shared/schemas/releases";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { PageHeader } from "@/components/ui/page";
import { EmptyState, ErrorState, TableSkeleton } from "@/components/ui/states";
import { Table, Td, Th, Tr } from "@/components/ui/table";
import { formatDateTime, formatEng } from "@/lib/format";
import { useUrlParams } from "@/lib/use-url-params";
import { useReleases } from "../api/get-releases";
import { readReleaseUrl, toReleaseQuery, writeReleaseUrl, type ReleaseUrlState } from "../lib/filters";
import { ReleaseStatusBadge } from "./release-status";
import { VerificationCell } from "@/features/verifications/components/verdict-badge";

const SELECT =
  "h-8 w-full rounded border border-paper-400 bg-white px-2 text-sm text-ink-900 focus:border-signal-600 focus:outline-none focus-visible:outline-2 focus-visible:outline-signal-500";

function FilterSelect({
  label,
  value,
  onChange,
  options,
}: {
  label: string;
  value: string;
  onChange: (v: string) => void;
  options: { value: string; label: string }[];
}) {
  return (
    <Field label={label}>
      {({ id }) => (
        <select id={id} className={SELECT} value={value} onChange={(e) => onChange(e.target.value)}>
          {options.map((o) => (
            <option key={o.value} value={o.value}>
              {o.label}
            </option>
          ))}
        </select>
      )}
    </Field>
  );
}

/** Distinct projects and designs of the unfiltered list, for the filter options. */
function optionsOf(all: readonly Release[], project: string) {
  const projects = new Map<string, string>();
  const designs = new Map<number, string>();
  for (const r of all) {
    projects.set(r.projectSlug, r.projectSlug);
    if (!project || r.projectSlug === project) designs.set(r.designId, r.designName);
  }
  const byLabel = (a: { label: string }, b: { label: string }) => a.label.localeCompare(b.label);
  return {
    projects: [...projects].map(([value, label]) => ({ value, label })).sort(byLabel),
    designs: [...designs].map(([id, label]) => ({ value: String(id), label })).sort(byLabel),
  };
}

/** `/releases`: every release in my projects, filtered by project, design and status (kept in the URL). */
export function ReleasesPage() {
  const [params, writeParams] = useUrlParams();
  const state = readReleaseUrl(params);
  const list = useReleases(toReleaseQuery(state));
  const all = useReleases({});
  const options = optionsOf(all.data ?? [], state.project);
  // A new project filter clears a design that belongs to another project.
  // Built from the latest URL, not this render's: two quick changes must not undo each other.
  const set = (patch: Partial<ReleaseUrlState>) =>
    writeParams((current) =>
      writeReleaseUrl({
        ...readReleaseUrl(current),
        ...(patch.project !== undefined ? { design: "" } : {}),
        ...patch,
      }),
    );
  const filtered = Boolean(state.project || state.design || state.status);

  return (
    <div>
      <PageHeader
        title="Releases"
        subtitle="Released versions in your projects, newest first. Open one for its files, checksums and download."
      />
      <form
        aria-label="Filters"
        className="mb-4 grid grid-cols-2 gap-3 md:grid-cols-4"
        onSubmit={(e) => e.preventDefault()}
      >
        <FilterSelect
          label="Project"
          value={state.project}
          onChange={(v) => set({ project: v })}
          options={[{ value: "", label: "Any project" }, ...options.projects]}
        />
        <FilterSelect
          label="Design"
          value={state.design}
          onChange={(v) => set({ design: v })}
          options={[{ value: "", label: "Any design" }, ...options.designs]}
        />
        <FilterSelect
          label="Status"
          value={state.status}
          onChange={(v) => set({ status: v })}
          options={[
            { value: "", label: "Active and withdrawn" },
            { value: "active", label: "Active" },
            { value: "withdrawn", label: "Withdrawn" },
          ]}
        />
        {filtered && (
          <div className="flex items-end">
            <Button onClick={() => writeParams(() => new URLSearchParams())}>Clear filters</Button>
          </div>
        )}
      </form>
      {list.isPending ? (
        <TableSkeleton label="Loading releases" rows={5} />
      ) : list.isError ? (
        <ErrorState error={list.error} onRetry={() => void list.refetch()} />
      ) : list.data.length === 0 ? (
        <EmptyState title={filtered ? "No release matches these filters" : "No releases yet"}>
          {filtered
            ? "Clear a filter to see more."
            : "A release appears here once an author releases an approved revision in one of your projects."}
        </EmptyState>
      ) : (
        <Table label="Releases">
          <thead>
            <tr>
              <Th>Version</Th>
              <Th>Design</Th>
              <Th>Project</Th>
              <Th>Status</Th>
              <Th>Released</Th>
              <Th>By</Th>
              <Th numeric>Bundle</Th>
              <Th>Verification</Th>
            </tr>
          </thead>
          <tbody>
            {list.data.map((r) => (
              <Tr key={r.id}>
                <Td>
                  <Link
                    to={`/releases/${r.id}`}
                    className="font-mono font-medium text-signal-800 underline-offset-2 hover:underline"
                  >
                    {r.version}
                  </Link>
                </Td>
                <Td>{r.designName}</Td>
                <Td className="font-mono text-[13px]">{r.projectSlug}</Td>
                <Td>
                  <ReleaseStatusBadge release={r} />
                </Td>
                <Td className="font-mono text-[13px] whitespace-nowrap">{formatDateTime(r.releasedAt)}</Td>
                <Td>{r.releasedBy.displayName}</Td>
                <Td numeric>{r.bundleSize === null ? "—" : formatEng(r.bundleSize, "B")}</Td>
                <Td>
                  <VerificationCell verification={r.verification} />
                </Td>
              </Tr>
            ))}
          </tbody>
        </Table>
      )}
    </div>
  );
}
