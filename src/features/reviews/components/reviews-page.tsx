import { Link } from "react-router-dom";
import { PageHeader } from "@/components/ui/page";
import { EmptyState, ErrorState, TableSkeleton } from "@/components/ui/states";
import { useReviewQueue } from "../api/get-queue";
import { QueueTable } from "./queue-table";

/** /reviews: the reviewer's queue, oldest submission first, failing limits visible in the list. */
export function ReviewsPage() {
  const queue = useReviewQueue();
  let body;
  if (queue.isPending) body = <TableSkeleton rows={4} label="Loading the review queue" />;
  else if (queue.isError) body = <ErrorState error={queue.error} onRetry={() => void queue.refetch()} />;
  else if (queue.data.length === 0)
    body = (
      <EmptyState title="Nothing waits for you">
        Revisions appear here when an author submits them for review in one of your projects.{" "}
        <Link to="/projects" className="text-signal-800 underline">
          Browse your projects
        </Link>
      </EmptyState>
    );
  else body = <QueueTable items={queue.data} nowMs={Date.now()} />;
  const n = queue.data?.length;
  return (
    <>
      <PageHeader
        title="Reviews"
        subtitle={
          n === undefined
            ? "Revisions waiting for a decision"
            : `${n} revision${n === 1 ? "" : "s"} waiting for a decision, oldest first`
        }
      />
      {body}
    </>
  );
}
