import { Link, useParams } from "react-router-dom";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { CopyButton } from "@/components/ui/copy-button";
import { PageHeader, Section } from "@/components/ui/page";
import { PageLoading, PageNotFound } from "@/components/ui/page-states";
import { EmptyState, ErrorState } from "@/components/ui/states";
import { Table, Td, Th, Tr } from "@/components/ui/table";
import { DesignReleases } from "@/features/reviews/components/design-releases";
import { ApiError } from "@/lib/api-client";
import { formatDateTime } from "@/lib/format";
import { openDraftId, useDesign, useStartRevision } from "../api/get-design";
import { StateBadge } from "./designs-table";

/** DESIGN.md "Cautions shown to users", for designs whose tables drive a transmitter. */
function TransmitCaution() {
  return (
    <aside
      aria-label="Transmit caution"
      className="mb-5 rounded border border-warn-100 bg-warn-50 px-4 py-3 text-sm text-warn-800"
    >
      <p className="font-medium">This design drives a transmitter.</p>
      <p>
        A wrap-around overflow or a wrong scale can put full-scale glitches into a power amplifier. Verify
        every release on a dummy load or in simulation first, follow local spectrum and RF-exposure rules, and
        follow your organisation&rsquo;s own sign-off practice.
      </p>
    </aside>
  );
}

function StartRevision({ designId, next }: { designId: number; next: number }) {
  const start = useStartRevision(designId);
  const draft =
    start.error instanceof ApiError && start.error.status === 409
      ? openDraftId(start.error.details)
      : undefined;
  return (
    <div className="flex flex-col items-end gap-1">
      <Button variant="primary" busy={start.isPending} onClick={() => start.mutate()}>
        Start revision r{next}
      </Button>
      {start.isSuccess && (
        <Link to={`/revisions/${start.data.revision.id}`} className="text-xs text-signal-800 underline">
          Open r{start.data.revision.number}
        </Link>
      )}
      {start.isError && (
        <p role="alert" className="text-xs text-fail-700">
          {start.error.message}
          {draft !== undefined && (
            <>
              {" "}
              <Link to={`/revisions/${draft}`} className="underline">
                Open the draft
              </Link>
            </>
          )}
        </p>
      )}
    </div>
  );
}

/** /designs/:id: header, transmit caution for waveforms, the revision timeline and "start revision". */
export function DesignPage() {
  const { id } = useParams();
  const designId = Number(id);
  const valid = Number.isInteger(designId) && designId > 0;
  const query = useDesign(valid ? designId : -1);
  if (!valid || (query.error instanceof ApiError && query.error.status === 404)) {
    return (
      <PageNotFound
        title="Design not found"
        message="This design does not exist or you are not a member of its project"
      />
    );
  }
  if (query.isPending) return <PageLoading label="Loading design" />;
  if (query.isError) return <ErrorState error={query.error} onRetry={() => void query.refetch()} />;
  const { design, project, revisions, canEdit } = query.data;
  const newestFirst = [...revisions].sort((a, b) => b.number - a.number);
  const next = (newestFirst[0]?.number ?? 0) + 1;
  return (
    <>
      <nav aria-label="Breadcrumb" className="mb-1 text-xs text-ink-600">
        <Link to="/projects" className="hover:underline">
          Projects
        </Link>{" "}
        /{" "}
        <Link to={`/projects/${project.id}`} className="font-mono hover:underline">
          {project.slug}
        </Link>
      </nav>
      <PageHeader
        title={
          <span className="flex items-center gap-2">
            {design.name} <Badge tone={design.kind === "waveform" ? "signal" : "copper"}>{design.kind}</Badge>
          </span>
        }
        subtitle={
          <>
            In{" "}
            <Link to={`/projects/${project.id}`} className="text-signal-800 underline">
              {project.name}
            </Link>{" "}
            · owner {design.owner.displayName} · created{" "}
            <span className="font-mono">{formatDateTime(design.createdAt)}</span>
          </>
        }
        action={canEdit ? <StartRevision designId={design.id} next={next} /> : undefined}
      />
      {design.kind === "waveform" && <TransmitCaution />}
      <Section title="Description">
        <p className="max-w-3xl text-sm whitespace-pre-line text-ink-800">
          {design.description || "No description."}
        </p>
      </Section>
      <Section title={`Revisions (${revisions.length})`}>
        {revisions.length === 0 ? (
          <EmptyState title="No revisions">A design gets its r1 draft when it is created.</EmptyState>
        ) : (
          <Table label="Revisions">
            <thead>
              <tr>
                <Th>Revision</Th>
                <Th>State</Th>
                <Th>Created by</Th>
                <Th>Created</Th>
                <Th>Submitted</Th>
                <Th>Content hash</Th>
              </tr>
            </thead>
            <tbody>
              {newestFirst.map((r) => (
                <Tr key={r.id}>
                  <Td>
                    <Link
                      to={`/revisions/${r.id}`}
                      className="font-mono font-medium text-signal-800 hover:underline"
                    >
                      r{r.number}
                    </Link>
                  </Td>
                  <Td>
                    <StateBadge state={r.state} />
                  </Td>
                  <Td>{r.createdBy.displayName}</Td>
                  <Td className="font-mono text-[13px]">{formatDateTime(r.createdAt)}</Td>
                  <Td className="font-mono text-[13px]">{formatDateTime(r.submittedAt)}</Td>
                  <Td>
                    {r.contentHash ? (
                      <span className="inline-flex items-center gap-1.5">
                        <span className="font-mono text-[13px]" title={r.contentHash}>
                          {r.contentHash.slice(0, 12)}…
                        </span>
                        <CopyButton value={r.contentHash} label={`Copy content hash of r${r.number}`} />
                      </span>
                    ) : (
                      <span className="text-ink-600">not fixed (draft)</span>
                    )}
                  </Td>
                </Tr>
              ))}
            </tbody>
          </Table>
        )}
      </Section>
      <Section title="Releases">
        <DesignReleases designId={design.id} />
      </Section>
    </>
  );
}
