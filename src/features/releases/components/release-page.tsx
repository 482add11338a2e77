import { Link, useOutletContext, useParams } from "react-router-dom";
import type { SessionUser } from "@shared/schemas/auth";
import type { Release } from "@shared/schemas/releases";
import { PageHeader, Section } from "@/components/ui/page";
import { ErrorState, Skeleton } from "@/components/ui/states";
import { HashText } from "@/features/reviews/components/hash-text";
import { formatCount, formatDateTime, formatEng } from "@/lib/format";
import { hasAnyRole } from "@/lib/roles";
import { useReleaseSummary } from "@/features/verifications/api/get-release-summary";
import {
  ApprovedBy,
  ReleaseVerificationSections,
} from "@/features/verifications/components/release-verification";
import { useRelease } from "../api/get-release";
import { BuildCommands } from "./build-commands";
import { TransmitReleaseCaution } from "./release-dialog";
import { ReleaseDiffSection } from "./release-diff";
import { ReleaseFiles } from "./release-files";
import { ReleaseStatusBadge } from "./release-status";
import { WithdrawAction } from "./withdraw-dialog";

const DOWNLOAD =
  "inline-flex h-8 items-center gap-1.5 rounded border border-signal-800 bg-signal-700 px-3 text-sm font-medium text-white hover:bg-signal-800 focus-visible:outline-2 focus-visible:outline-signal-500";

function WithdrawnBanner({ withdrawn }: { withdrawn: NonNullable<Release["withdrawn"]> }) {
  return (
    <aside
      aria-label="Withdrawn"
      className="mb-4 rounded border border-fail-100 bg-fail-50 px-4 py-3 text-sm text-fail-800"
    >
      <p className="font-semibold">
        Withdrawn {formatDateTime(withdrawn.at)} by {withdrawn.by.displayName}. Do not start new work from
        this release.
      </p>
      <p className="mt-1 whitespace-pre-wrap">Reason: {withdrawn.reason}</p>
      <p className="mt-1 text-fail-700">It stays downloadable so existing builds can be traced.</p>
    </aside>
  );
}

function Facts({ release }: { release: Release }) {
  return (
    <dl className="grid max-w-4xl grid-cols-[max-content_1fr] gap-x-6 gap-y-1.5 rounded border border-paper-300 bg-paper-50 px-4 py-3 text-sm">
      <dt className="text-ink-600">Design</dt>
      <dd>
        <Link
          to={`/designs/${release.designId}`}
          className="text-signal-800 underline-offset-2 hover:underline"
        >
          {release.designName}
        </Link>{" "}
        <span className="text-ink-600">({release.designKind})</span>
      </dd>
      <dt className="text-ink-600">Project</dt>
      <dd className="font-mono text-[13px]">{release.projectSlug}</dd>
      <dt className="text-ink-600">Revision</dt>
      <dd>
        <Link
          to={`/revisions/${release.revisionId}`}
          className="font-mono text-signal-800 underline-offset-2 hover:underline"
        >
          r{release.revisionNumber}
        </Link>
      </dd>
      <dt className="text-ink-600">Content hash</dt>
      <dd>
        <HashText value={release.contentHash} label="content hash" />
      </dd>
      <dt className="text-ink-600">Released</dt>
      <dd>
        <span className="font-mono text-[13px]">{formatDateTime(release.releasedAt)}</span> by{" "}
        {release.releasedBy.displayName}
      </dd>
      <dt className="text-ink-600">Approval</dt>
      <dd>
        <ApprovedBy releaseId={release.id} />
      </dd>
      <dt className="text-ink-600">Bundle size</dt>
      <dd className="font-mono text-[13px]">
        {release.bundleSize === null
          ? "—"
          : `${formatEng(release.bundleSize, "B")} (${formatCount(release.bundleSize)} bytes)`}
      </dd>
      <dt className="text-ink-600">Bundle SHA-256</dt>
      <dd className="font-mono text-[13px] break-all" data-testid="bundle-sha256">
        {release.bundleSha256 ?? "—"}
      </dd>
    </dl>
  );
}

/**
 * `/releases/:id`: what firmware pulls and proves — header, cautions, notes, tables, vector sets, upload and
 * runs, files, download, commands, diff.
 */
export function ReleasePage() {
  const id = Number(useParams().id);
  const user = useOutletContext<SessionUser>();
  const release = useRelease(id);
  const summary = useReleaseSummary(id);
  if (release.isPending)
    return (
      <div role="status" aria-label="Loading release" className="flex flex-col gap-3">
        <Skeleton className="h-7 w-1/3" />
        <Skeleton className="h-32 w-full" />
      </div>
    );
  if (release.isError) return <ErrorState error={release.error} onRetry={() => void release.refetch()} />;
  const r = release.data;
  return (
    <div>
      <PageHeader
        title={
          <span className="inline-flex items-center gap-2">
            {r.designName} <span className="font-mono">{r.version}</span> <ReleaseStatusBadge release={r} />
          </span>
        }
        subtitle={
          <>
            <span className="font-mono">{r.projectSlug}</span> · r{r.revisionNumber} · content{" "}
            <span className="font-mono" title={r.contentHash}>
              {r.contentHash.slice(0, 12)}…
            </span>
          </>
        }
        action={
          <>
            {hasAnyRole(user.roles, ["author", "admin"]) && <WithdrawAction release={r} size="md" />}
            {r.bundleSha256 && (
              <a href={`/api/releases/${r.id}/bundle`} download className={DOWNLOAD}>
                Download bundle
              </a>
            )}
          </>
        }
      />
      {r.withdrawn && <WithdrawnBanner withdrawn={r.withdrawn} />}
      {r.transmit && (
        <div className="mb-4 max-w-4xl">
          <TransmitReleaseCaution />
        </div>
      )}
      <Section title="Release">
        <Facts release={r} />
      </Section>
      <Section title="Release notes">
        <div className="max-w-4xl rounded border border-paper-300 bg-paper-50 px-4 py-3 text-sm whitespace-pre-wrap">
          {r.notes}
        </div>
      </Section>
      <ReleaseVerificationSections release={r} canUpload={hasAnyRole(user.roles, ["firmware", "admin"])} />
      {/* The summary adds manifest.json and SHA256SUMS, which the manifest cannot list. */}
      <ReleaseFiles files={summary.data?.files ?? r.files} />
      <BuildCommands release={r} />
      <ReleaseDiffSection release={r} />
    </div>
  );
}
