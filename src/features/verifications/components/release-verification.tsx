import { Link } from "react-router-dom";
import type { Release } from "@shared/schemas/releases";
import { Section } from "@/components/ui/page";
import { ErrorState, TableSkeleton } from "@/components/ui/states";
import { formatDateTime } from "@/lib/format";
import { useReleaseSummary } from "../api/get-release-summary";
import { useVerifications } from "../api/get-verifications";
import { latestPerSet } from "../lib/runs";
import { RunsTable } from "./runs-table";
import { TableSummaryTable } from "./table-summary";
import { UploadRunForm } from "./upload-form";
import { VectorSetsTable } from "./vector-sets";
import { VerdictBadge } from "./verdict-badge";

/** "Approved by Tomas Quill on 2026-12-04 09:12": the approvals the bundle's manifest records. */
export function ApprovedBy({ releaseId }: { releaseId: number }) {
  const summary = useReleaseSummary(releaseId);
  if (!summary.data) return <span className="text-ink-600">—</span>;
  if (summary.data.approvals.length === 0) return <span className="text-ink-600">no approval recorded</span>;
  return (
    <span>
      {summary.data.approvals.map((a, i) => (
        <span key={`${a.reviewer}-${a.at}`}>
          {i > 0 && "; "}
          Approved by {a.reviewer} on <span className="font-mono text-[13px]">{formatDateTime(a.at)}</span>
        </span>
      ))}
    </span>
  );
}

/** The release page's tables, vector sets, upload form and runs. */
export function ReleaseVerificationSections({
  release,
  canUpload,
}: {
  release: Release;
  canUpload: boolean;
}) {
  const summary = useReleaseSummary(release.id);
  const runs = useVerifications(release.id);
  if (summary.isPending)
    return (
      <Section title="Coefficient tables">
        <TableSkeleton rows={2} label="Loading the manifest summary" />
      </Section>
    );
  if (summary.isError)
    return (
      <Section title="Coefficient tables">
        <ErrorState error={summary.error} onRetry={() => void summary.refetch()} />
      </Section>
    );
  const s = summary.data;
  return (
    <>
      <Section title="Coefficient tables">
        <TableSummaryTable summary={s} />
        <p className="mt-1 text-xs text-ink-600">
          As the bundle's manifest (format {s.schemaVersion}) states them. Gain is the scale applied before
          rounding; overflows counts codes clipped or wrapped when the table was quantized.
        </p>
      </Section>
      <Section title="Vector sets">
        <VectorSetsTable sets={s.vectorSets} runs={runs.data ?? []} />
      </Section>
      <Section title="Verification">
        <div className="flex flex-col gap-3">
          {canUpload && s.vectorSets.length > 0 && (
            <UploadRunForm
              releaseId={release.id}
              sets={s.vectorSets}
              withdrawn={release.withdrawn !== null}
            />
          )}
          {runs.isPending ? (
            <TableSkeleton rows={2} label="Loading verification runs" />
          ) : runs.isError ? (
            <ErrorState error={runs.error} onRetry={() => void runs.refetch()} />
          ) : (
            <RunsTable releaseId={release.id} runs={runs.data} />
          )}
        </div>
      </Section>
    </>
  );
}

/** The review section's evidence: each vector set's newest run, beside the report. */
export function VerificationEvidence({ releaseId }: { releaseId: number }) {
  const summary = useReleaseSummary(releaseId);
  const runs = useVerifications(releaseId);
  if (!summary.data || !runs.data) return null;
  const latest = latestPerSet(runs.data);
  const passed = new Set(runs.data.filter((r) => r.verdict === "pass").map((r) => r.vectorSet));
  return (
    <div
      aria-label="Verification evidence"
      role="group"
      className="flex flex-col gap-1 rounded border border-paper-300 bg-paper-50 px-3 py-2 text-sm"
    >
      <p className="flex flex-wrap items-center justify-between gap-2 text-ink-800">
        <span className="font-medium">Firmware verification</span>
        <Link to={`/releases/${releaseId}`} className="text-xs text-signal-800 underline">
          All runs on the release page
        </Link>
      </p>
      <ul className="flex flex-col gap-0.5">
        {summary.data.vectorSets.map((set) => {
          const r = latest.get(set.name);
          return (
            <li key={set.name} className="flex flex-wrap items-center gap-2 text-xs text-ink-700">
              <span className="w-32 font-mono text-[13px] text-ink-900">{set.name}</span>
              {r ? (
                <>
                  <VerdictBadge verdict={r.verdict} />
                  <span className="font-mono">
                    {r.mismatches} of {r.compared} differ
                  </span>
                  <span>
                    by {r.by.displayName} · <span className="font-mono">{formatDateTime(r.at)}</span>
                    {r.simulator ? ` · ${r.simulator}` : ""}
                    {r.rtlRevision ? ` · RTL ${r.rtlRevision}` : ""}
                  </span>
                  {r.verdict === "fail" && passed.has(set.name) && (
                    <span className="text-ink-600">(newest run; an earlier run passed)</span>
                  )}
                </>
              ) : (
                <span className="text-ink-600">no run yet</span>
              )}
            </li>
          );
        })}
      </ul>
    </div>
  );
}
