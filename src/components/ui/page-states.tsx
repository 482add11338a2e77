import { Link } from "react-router-dom";
import { PageHeader } from "./page";
import { EmptyState, Skeleton, TableSkeleton } from "./states";

/** A detail page while its data loads: title and subtitle bars over placeholder table rows, announced by `label`. */
export function PageLoading({ label, rows = 3 }: { label: string; rows?: number }) {
  return (
    <div role="status" aria-label={label}>
      <Skeleton className="mb-2 h-6 w-72" />
      <Skeleton className="mb-6 h-4 w-96" />
      <TableSkeleton rows={rows} />
    </div>
  );
}

/**
 * A detail page whose subject is missing or hidden from me (the server answers 404 for both, so the
 * message names both) with a way back; the title is the page's h1.
 */
export function PageNotFound({
  title,
  message,
  backTo = "/projects",
  backLabel = "Back to your projects",
}: {
  title: string;
  message: string;
  backTo?: string;
  backLabel?: string;
}) {
  return (
    <>
      <PageHeader title={title} />
      <EmptyState title={message}>
        <Link to={backTo} className="text-signal-800 underline">
          {backLabel}
        </Link>
      </EmptyState>
    </>
  );
}
