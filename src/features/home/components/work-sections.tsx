import { Link } from "react-router-dom";
import type { Role } from "@shared/schemas/auth";
import type { HomeWork } from "@shared/schemas/reviews";
import { Badge } from "@/components/ui/badge";
import { Section } from "@/components/ui/page";
import { EmptyState, ErrorState, TableSkeleton } from "@/components/ui/states";
import { Table, Td, Th, Tr } from "@/components/ui/table";
import { useReviewQueue } from "@/features/reviews/api/get-queue";
import { QueueTable } from "@/features/reviews/components/queue-table";
import { formatDateTime } from "@/lib/format";
import { useHomeWork } from "../api/get-home-work";

type HomeRevision = NonNullable<HomeWork["myDrafts"]>[number];
type HomeRelease = NonNullable<HomeWork["lastReleases"]>[number];

// The home page previews the queue; the full list is on /reviews.
const QUEUE_PREVIEW = 5;

function RevisionList({
  items,
  label,
  empty,
}: {
  items: readonly HomeRevision[];
  label: string;
  empty: string;
}) {
  if (items.length === 0) return <EmptyState title={empty} />;
  return (
    <ul aria-label={label} className="divide-y divide-paper-200 rounded border border-paper-300 bg-paper-50">
      {items.map((r) => (
        <li key={r.revisionId} className="px-3 py-1.5 text-sm">
          <Link to={`/revisions/${r.revisionId}`} className="text-signal-800 hover:underline">
            {r.designName} <span className="font-mono">r{r.revisionNumber}</span>
          </Link>
        </li>
      ))}
    </ul>
  );
}

function ReleaseTable({
  items,
  label,
  empty,
}: {
  items: readonly HomeRelease[];
  label: string;
  empty: string;
}) {
  if (items.length === 0) return <EmptyState title={empty} />;
  return (
    <Table label={label}>
      <thead>
        <tr>
          <Th>Version</Th>
          <Th>Design</Th>
          <Th>Project</Th>
          <Th>Released</Th>
        </tr>
      </thead>
      <tbody>
        {items.map((r) => (
          <Tr key={r.id}>
            <Td>
              <Link
                to={`/releases/${r.id}`}
                className="font-mono font-medium text-signal-800 hover:underline"
              >
                {r.version}
              </Link>{" "}
              {r.withdrawn && <Badge tone="fail">withdrawn</Badge>}
            </Td>
            <Td>{r.designName}</Td>
            <Td className="font-mono text-[13px]">{r.projectSlug}</Td>
            <Td className="font-mono text-[13px]">{formatDateTime(r.releasedAt)}</Td>
          </Tr>
        ))}
      </tbody>
    </Table>
  );
}

/** Firmware's to-do: active releases where some vector set has no passing run yet. */
function UnverifiedTable({ items }: { items: readonly HomeRelease[] }) {
  if (items.length === 0)
    return (
      <EmptyState title="Every active release has a passing run for each vector set">
        New releases appear here until your simulation output passes.
      </EmptyState>
    );
  return (
    <Table label="Waiting for verification">
      <thead>
        <tr>
          <Th>Version</Th>
          <Th>Design</Th>
          <Th>Project</Th>
          <Th>Released</Th>
          <Th>Newest run</Th>
          <Th numeric>Sets passed</Th>
        </tr>
      </thead>
      <tbody>
        {items.map((r) => (
          <Tr key={r.id}>
            <Td>
              <Link
                to={`/releases/${r.id}`}
                className="font-mono font-medium text-signal-800 hover:underline"
              >
                {r.version}
              </Link>
            </Td>
            <Td>{r.designName}</Td>
            <Td className="font-mono text-[13px]">{r.projectSlug}</Td>
            <Td className="font-mono text-[13px]">{formatDateTime(r.releasedAt)}</Td>
            <Td>
              {r.verification?.latest ? (
                <Badge tone={r.verification.latest === "pass" ? "pass" : "fail"}>
                  {r.verification.latest === "pass" ? "PASS" : "FAIL"}
                </Badge>
              ) : (
                <span className="text-xs text-ink-600">no run yet</span>
              )}
            </Td>
            <Td numeric>{r.verification ? `${r.verification.passedSets}/${r.verification.sets}` : "—"}</Td>
          </Tr>
        ))}
      </tbody>
    </Table>
  );
}

function ReviewerQueue({ count }: { count: number }) {
  const queue = useReviewQueue();
  const link = (
    <Link to="/reviews" className="text-xs text-signal-800 hover:underline">
      Open the review queue
    </Link>
  );
  let body;
  if (queue.isPending) body = <TableSkeleton rows={2} label="Loading the review queue" />;
  else if (queue.isError) body = <ErrorState error={queue.error} onRetry={() => void queue.refetch()} />;
  else if (queue.data.length === 0) body = <EmptyState title="Nothing waits for you" />;
  else
    body = (
      <QueueTable
        items={queue.data.slice(0, QUEUE_PREVIEW)}
        nowMs={Date.now()}
        label="Waiting for my review"
      />
    );
  return (
    <Section title={`Waiting for my review (${count})`} action={link}>
      {body}
    </Section>
  );
}

/** The home page's review and release lists for the roles the user holds (issue 6). */
export function WorkSections({ roles }: { roles: readonly Role[] }) {
  const work = useHomeWork();
  if (work.isPending) return <TableSkeleton rows={3} label="Loading my work" />;
  if (work.isError) return <ErrorState error={work.error} onRetry={() => void work.refetch()} />;
  const w = work.data;
  return (
    <>
      {roles.includes("author") && (
        <>
          <Section title="My drafts">
            <RevisionList
              items={w.myDrafts ?? []}
              label="My drafts"
              empty="No open drafts: start a revision from a design page"
            />
          </Section>
          <Section title="Changes requested">
            <RevisionList
              items={w.changesRequested ?? []}
              label="Changes requested"
              empty="No revision of yours waits for changes"
            />
          </Section>
          <Section title="Last releases">
            <ReleaseTable
              items={w.lastReleases ?? []}
              label="Last releases"
              empty="No releases in your projects yet"
            />
          </Section>
        </>
      )}
      {roles.includes("reviewer") && <ReviewerQueue count={w.queueCount ?? 0} />}
      {roles.includes("firmware") && (
        <Section title="Waiting for verification">
          <UnverifiedTable items={w.unverifiedReleases ?? []} />
        </Section>
      )}
      {roles.includes("firmware") && (
        <Section title="Newest releases">
          <ReleaseTable
            items={w.newestReleases ?? []}
            label="Newest releases"
            empty="No releases in your projects yet"
          />
        </Section>
      )}
    </>
  );
}
