import { Link } from "react-router-dom";
import { PageHeader } from "@/components/ui/page";
import { EmptyState } from "@/components/ui/states";

/** Any path that matches no place. */
export function NotFoundRoute() {
  return (
    <>
      <PageHeader title="Page not found" subtitle={<span className="font-mono">404</span>} />
      <EmptyState title="There is nothing at this address">
        Check the link, or go to{" "}
        <Link to="/" className="text-signal-800 underline">
          Home
        </Link>{" "}
        or{" "}
        <Link to="/projects" className="text-signal-800 underline">
          Projects
        </Link>
        .
      </EmptyState>
    </>
  );
}

/** A place the user's roles do not open. */
export function ForbiddenRoute() {
  return (
    <>
      <PageHeader title="Not available to you" subtitle={<span className="font-mono">403</span>} />
      <EmptyState title="Your roles do not include this page">Ask an admin if you need access.</EmptyState>
    </>
  );
}
