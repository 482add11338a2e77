import { useState } from "react";
import { Link, useParams } from "react-router-dom";
import type { CoefficientTable, RevisionDetail } from "@shared/schemas/designs";
import { Badge } from "@/components/ui/badge";
import { CopyButton } from "@/components/ui/copy-button";
import { PageHeader, Section } from "@/components/ui/page";
import { PageLoading, PageNotFound } from "@/components/ui/page-states";
import { EmptyState, ErrorState } from "@/components/ui/states";
import { AnalysisSection } from "@/features/analysis/components/analysis-section";
import { ReviewSection } from "@/features/reviews/components/review-section";
import { ApiError } from "@/lib/api-client";
import { formatCount, formatDateTime, formatEng } from "@/lib/format";
import { useRevision } from "../api/get-revision";
import { describeSource, isFm } from "../lib/describe-source";
import { REVISION_STATE_VIEW } from "../lib/states";
import { CoefficientGrid } from "./coefficient-grid";
import { DatapathSection } from "./datapath-section";
import { FixedPointSection } from "./fixed-point-section";
import { LimitsSection } from "./limits-section";
import { DecisionHistory, LastDecision, NextAction } from "./next-step";
import { TablePlots } from "./table-plots";

/** A hash as its first 12 hex digits plus a button that copies all of it. */
function Hash({ value, label }: { value: string; label: string }) {
  return (
    <span className="inline-flex items-center gap-1.5">
      <span className="font-mono text-[13px]" title={value}>
        {value.slice(0, 12)}…
      </span>
      <CopyButton value={value} label={`Copy ${label}`} />
    </span>
  );
}

function Source({ table, detail }: { table: CoefficientTable; detail: RevisionDetail }) {
  const src = table.source;
  if (src.kind === "upload") {
    const upload = detail.uploads.find((u) => u.id === src.uploadId);
    const name = upload?.fileName ?? (typeof src.fileName === "string" ? src.fileName : "?");
    const sha = upload?.sha256 ?? (typeof src.sha256 === "string" ? src.sha256 : "");
    return (
      <span className="inline-flex flex-wrap items-center gap-2">
        Uploaded file <span className="font-mono text-[13px]">{name}</span>
        {sha && (
          <>
            SHA-256 <Hash value={sha} label={`SHA-256 of ${name}`} />
          </>
        )}
      </span>
    );
  }
  return <>{describeSource(src)}</>;
}

function TableBlock({ table, detail }: { table: CoefficientTable; detail: RevisionDetail }) {
  const txKind = detail.content.kind === "waveform" ? detail.content.tx.kind : undefined;
  const fileBase = `${detail.project.slug}-design${detail.design.id}-r${detail.revision.number}-${table.role}`;
  return (
    <article
      aria-labelledby={`table-${table.id}`}
      className="mb-5 rounded border border-paper-300 bg-white/60 p-3"
    >
      <header className="mb-2 flex flex-wrap items-baseline gap-x-4 gap-y-1">
        <h3 id={`table-${table.id}`} className="font-mono text-sm font-semibold text-ink-900">
          {table.role}
        </h3>
        <dl className="flex flex-wrap gap-x-4 gap-y-1 text-xs text-ink-700">
          <div className="flex gap-1">
            <dt>Length</dt>
            <dd className="font-mono">{formatCount(table.length)}</dd>
          </div>
          <div className="flex gap-1">
            <dt>Values</dt>
            <dd>{table.complex ? "complex (I, Q)" : "real"}</dd>
          </div>
          <div className="flex gap-1">
            <dt>Sample rate</dt>
            <dd className="font-mono">{formatEng(table.sampleRateHz, "Hz")}</dd>
          </div>
          <div className="flex gap-1">
            <dt>Duration</dt>
            <dd className="font-mono">{formatEng(table.length / table.sampleRateHz, "s")}</dd>
          </div>
          <div className="flex items-center gap-1">
            <dt>Values SHA-256</dt>
            <dd>
              <Hash value={table.valuesSha256} label={`SHA-256 of ${table.role} values`} />
            </dd>
          </div>
        </dl>
      </header>
      <p className="mb-3 text-sm text-ink-800">
        <Source table={table} detail={detail} />
      </p>
      <TablePlots
        revisionId={detail.revision.id}
        table={table}
        fm={isFm(table.source, txKind)}
        fileBase={fileBase}
      />
      <details className="mt-3">
        <summary className="cursor-pointer text-sm font-medium text-signal-800">
          Coefficients ({formatCount(table.length)} rows)
        </summary>
        <div className="mt-2">
          <CoefficientGrid revisionId={detail.revision.id} table={table} />
        </div>
      </details>
    </article>
  );
}

function Revision({ detail }: { detail: RevisionDetail }) {
  const { revision, design, project, content, tables } = detail;
  const state = REVISION_STATE_VIEW[revision.state];
  // An unsaved form blocks submitting: what is submitted must be what was saved.
  const [dirty, setDirty] = useState({ fixedPoint: false, limits: false });
  const blocked = dirty.fixedPoint || dirty.limits;
  return (
    <>
      <nav aria-label="Breadcrumb" className="mb-1 text-xs text-ink-600">
        <Link to="/projects" className="hover:underline">
          Projects
        </Link>{" "}
        /{" "}
        <Link to={`/projects/${project.id}`} className="font-mono hover:underline">
          {project.slug}
        </Link>{" "}
        /{" "}
        <Link to={`/designs/${design.id}`} className="hover:underline">
          {design.name}
        </Link>{" "}
        / <span className="font-mono">r{revision.number}</span>
      </nav>
      <PageHeader
        title={
          <span className="flex items-center gap-2">
            {design.name} <span className="font-mono text-ink-600">r{revision.number}</span>{" "}
            <Badge tone={state.tone}>{state.label}</Badge>
          </span>
        }
        subtitle={
          revision.contentHash ? (
            <span className="inline-flex items-center gap-2">
              Content hash <Hash value={revision.contentHash} label="content hash" /> · read-only
            </span>
          ) : (
            <>Draft: content can change until it is submitted for review</>
          )
        }
        action={<NextAction detail={detail} blocked={blocked} />}
      />
      <LastDecision revisionId={revision.id} />
      <Section title={`Coefficient tables (${tables.length})`}>
        {tables.length === 0 ? (
          <EmptyState title="No tables">This revision has no coefficient tables yet.</EmptyState>
        ) : (
          tables.map((t) => <TableBlock key={t.id} table={t} detail={detail} />)
        )}
      </Section>
      <Section title="Fixed-point spec">
        <FixedPointSection
          key={JSON.stringify(content.fixedPoint)}
          revisionId={revision.id}
          content={content}
          editable={detail.canEdit}
          onDirtyChange={(d) => setDirty((s) => (s.fixedPoint === d ? s : { ...s, fixedPoint: d }))}
        />
      </Section>
      <Section title="Datapath (receive / FIR)">
        <DatapathSection revisionId={revision.id} content={content} editable={detail.canEdit} />
      </Section>
      <Section title="Acceptance limits">
        <LimitsSection
          key={JSON.stringify(content.limits)}
          revisionId={revision.id}
          content={content}
          editable={detail.canEdit}
          onDirtyChange={(d) => setDirty((s) => (s.limits === d ? s : { ...s, limits: d }))}
        />
      </Section>
      <AnalysisSection revisionId={revision.id} />
      <div id="review">
        <ReviewSection revisionId={revision.id} />
      </div>
      <Section title="History">
        <ol className="flex flex-col gap-1 rounded border border-paper-300 bg-paper-50 px-4 py-3 text-sm text-ink-800">
          <li>
            <span className="font-mono">{formatDateTime(revision.createdAt)}</span> · r{revision.number}{" "}
            created by {revision.createdBy.displayName}
          </li>
          {revision.submittedAt && (
            <li>
              <span className="font-mono">{formatDateTime(revision.submittedAt)}</span> · submitted for
              review; content hash fixed
            </li>
          )}
          <DecisionHistory revisionId={revision.id} />
        </ol>
      </Section>
    </>
  );
}

/** /revisions/:id: tables with plots and values, fixed-point spec, limits, analysis and history. */
export function RevisionPage() {
  const { id } = useParams();
  const revisionId = Number(id);
  const valid = Number.isInteger(revisionId) && revisionId > 0;
  const query = useRevision(valid ? revisionId : -1);
  if (!valid || (query.error instanceof ApiError && query.error.status === 404)) {
    return (
      <PageNotFound
        title="Revision not found"
        message="This revision does not exist or you are not a member of its project"
      />
    );
  }
  if (query.isPending) return <PageLoading label="Loading revision" rows={4} />;
  if (query.isError) return <ErrorState error={query.error} onRetry={() => void query.refetch()} />;
  return <Revision detail={query.data} />;
}
