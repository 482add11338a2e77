import { Link } from "react-router-dom";
import type { QueueItem } from "@shared/schemas/reviews";
import { Badge } from "@/components/ui/badge";
import { Table, Td, Th, Tr } from "@/components/ui/table";
import { LimitChipView } from "@/features/analysis/components/limit-chips";
import { formatDateTime, formatDuration } from "@/lib/format";
import { chipOf } from "../lib/figures";

/** The verdict of a queued revision: its failing limits as chips, or the pass in words. */
function Verdict({ item }: { item: QueueItem }) {
  if (item.pass === null) return <span className="text-xs text-ink-600">no report</span>;
  if (item.limitCount === 0) return <Badge tone="warn">Not judged: no limits set</Badge>;
  if (item.failing.length === 0) return <Badge tone="pass">All limits pass</Badge>;
  return (
    <ul
      aria-label={`Failing limits of ${item.designName} r${item.revisionNumber}`}
      className="flex flex-wrap gap-1"
    >
      {item.failing.map((f) => (
        <LimitChipView key={f.name} chip={chipOf(f)} />
      ))}
    </ul>
  );
}

/** Revisions waiting for review, in the order given (the server sends the oldest submission first). */
export function QueueTable({
  items,
  nowMs,
  label = "Review queue",
}: {
  items: readonly QueueItem[];
  nowMs: number;
  label?: string;
}) {
  return (
    <Table label={label}>
      <thead>
        <tr>
          <Th>Design</Th>
          <Th>Project</Th>
          <Th>Submitted by</Th>
          <Th>Submitted</Th>
          <Th numeric>Waiting</Th>
          <Th>Limits</Th>
        </tr>
      </thead>
      <tbody>
        {items.map((i) => (
          <Tr key={i.revisionId}>
            <Td>
              <Link to={`/revisions/${i.revisionId}`} className="font-medium text-signal-800 hover:underline">
                {i.designName} <span className="font-mono">r{i.revisionNumber}</span>
              </Link>{" "}
              <Badge tone={i.designKind === "waveform" ? "signal" : "copper"}>{i.designKind}</Badge>
              {!i.canDecide && (
                <Badge tone="neutral" className="ml-1">
                  your submission
                </Badge>
              )}
            </Td>
            <Td className="font-mono text-[13px]">{i.projectSlug}</Td>
            <Td>{i.submittedBy.displayName}</Td>
            <Td className="font-mono text-[13px]">{formatDateTime(i.submittedAt)}</Td>
            <Td numeric>{formatDuration((nowMs - Date.parse(i.submittedAt)) / 1000)}</Td>
            <Td>
              <Verdict item={i} />
            </Td>
          </Tr>
        ))}
      </tbody>
    </Table>
  );
}
