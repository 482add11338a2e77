import { Link } from "react-router-dom";
import type { Role } from "@shared/schemas/auth";
import { Badge } from "@/components/ui/badge";
import { EmptyState, ErrorState, TableSkeleton } from "@/components/ui/states";
import { Table, Td, Th, Tr } from "@/components/ui/table";
import { useMe } from "@/features/auth/api/get-me";
import { WithdrawAction } from "@/features/releases/components/withdraw-dialog";
import { formatCount, formatDateTime } from "@/lib/format";
import { hasAnyRole } from "@/lib/roles";
import { useDesignReleases } from "../api/get-design-releases";
import { HashText } from "./hash-text";

// Who may withdraw, as in the server's life-cycle table (membership is the server's to check).
const MAY_WITHDRAW: readonly Role[] = ["author", "admin"];

/** A design's releases, newest first, withdrawn ones flagged with their reason; withdraw for authors and admins. */
export function DesignReleases({ designId }: { designId: number }) {
  const releases = useDesignReleases(designId);
  const me = useMe();
  const canWithdraw = hasAnyRole(me.data?.roles ?? [], MAY_WITHDRAW);
  if (releases.isPending) return <TableSkeleton rows={2} label="Loading releases" />;
  if (releases.isError) return <ErrorState error={releases.error} onRetry={() => void releases.refetch()} />;
  if (releases.data.length === 0)
    return (
      <EmptyState title="No releases yet">
        Once a reviewer approves a revision, its author can release it as a version from the revision page.
      </EmptyState>
    );
  return (
    <Table label="Releases">
      <thead>
        <tr>
          <Th>Version</Th>
          <Th>Revision</Th>
          <Th>Released by</Th>
          <Th>Released</Th>
          <Th numeric>Bundle</Th>
          <Th>Bundle SHA-256</Th>
          <Th>Status</Th>
          {canWithdraw && (
            <Th>
              <span className="sr-only">Actions</span>
            </Th>
          )}
        </tr>
      </thead>
      <tbody>
        {releases.data.map((r) => (
          <Tr key={r.id}>
            <Td>
              <Link
                to={`/releases/${r.id}`}
                className="font-mono font-medium text-signal-800 hover:underline"
              >
                {r.version}
              </Link>
            </Td>
            <Td>
              <Link to={`/revisions/${r.revisionId}`} className="font-mono text-signal-800 hover:underline">
                r{r.revisionNumber}
              </Link>
            </Td>
            <Td>{r.releasedBy.displayName}</Td>
            <Td className="font-mono text-[13px]">{formatDateTime(r.releasedAt)}</Td>
            <Td numeric>{r.bundleSize === null ? "—" : `${formatCount(r.bundleSize)} B`}</Td>
            <Td>
              {r.bundleSha256 ? (
                <HashText value={r.bundleSha256} label={`bundle SHA-256 of ${r.version}`} />
              ) : (
                "—"
              )}
            </Td>
            <Td>
              {r.withdrawn ? (
                <span className="flex flex-col gap-0.5">
                  <span>
                    <Badge tone="fail">withdrawn</Badge>{" "}
                    <span className="font-mono text-xs">{formatDateTime(r.withdrawn.at)}</span>
                  </span>
                  <span className="text-xs break-words text-ink-700">{r.withdrawn.reason}</span>
                </span>
              ) : (
                <Badge tone="pass">active</Badge>
              )}
            </Td>
            {canWithdraw && <Td>{!r.withdrawn && <WithdrawAction release={r} />}</Td>}
          </Tr>
        ))}
      </tbody>
    </Table>
  );
}
