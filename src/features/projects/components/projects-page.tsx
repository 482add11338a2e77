import { useEffect, useRef, useState } from "react";
import { useNavigationType, useSearchParams } from "react-router-dom";
import { Button } from "@/components/ui/button";
import { Input } from "@/components/ui/input";
import { PageHeader } from "@/components/ui/page";
import { EmptyState, ErrorState, TableSkeleton } from "@/components/ui/states";
import { useProjects } from "../api/get-projects";
import { useMe } from "@/features/auth/api/get-me";
import { CreateProjectDialog } from "./create-project-dialog";
import { ProjectsTable } from "./projects-table";

/** /projects: every visible project, filtered by `?q=` so a filtered view can be linked. */
export function ProjectsPage() {
  const projects = useProjects();
  const isAdmin = useMe().data?.roles.includes("admin") ?? false;
  const [creating, setCreating] = useState(false);
  const [params, setParams] = useSearchParams();
  const urlQ = params.get("q") ?? "";
  // The field keeps its own state: the URL update is a router transition, and a controlled value read
  // back from it drops keystrokes when someone types fast.
  const [q, setQ] = useState(urlQ);
  const navigationType = useNavigationType();
  const lastUrlQ = useRef(urlQ);
  useEffect(() => {
    // Follow the URL only when it really changed (back/forward, a link) — not on mount, where a keystroke
    // typed before this effect runs would be wiped — and never for our own REPLACE writes.
    if (urlQ === lastUrlQ.current) return;
    lastUrlQ.current = urlQ;
    if (navigationType !== "REPLACE") setQ(urlQ);
  }, [urlQ, navigationType]);
  const needle = q.trim().toLowerCase();
  const rows = (projects.data ?? []).filter(
    (p) => !needle || p.name.toLowerCase().includes(needle) || p.slug.includes(needle),
  );
  return (
    <>
      <PageHeader
        title="Projects"
        subtitle={projects.data ? `${projects.data.length} visible to you` : "Programmes you are a member of"}
        action={
          isAdmin ? (
            <Button variant="primary" onClick={() => setCreating(true)}>
              New project
            </Button>
          ) : undefined
        }
      />
      {isAdmin && <CreateProjectDialog open={creating} onClose={() => setCreating(false)} />}
      <div className="mb-3 flex items-center gap-3">
        <label htmlFor="project-search" className="sr-only">
          Search projects
        </label>
        <Input
          id="project-search"
          type="search"
          data-page-search
          placeholder="Search by name or slug  ( / )"
          className="max-w-xs"
          value={q}
          onChange={(e) => {
            setQ(e.target.value);
            const next = new URLSearchParams(params);
            if (e.target.value) next.set("q", e.target.value);
            else next.delete("q");
            setParams(next, { replace: true });
          }}
        />
        {needle && projects.data && (
          <span className="text-xs text-ink-600">
            {rows.length} of {projects.data.length}
          </span>
        )}
      </div>
      {projects.isPending ? (
        <TableSkeleton label="Loading projects" />
      ) : projects.isError ? (
        <ErrorState error={projects.error} onRetry={() => void projects.refetch()} />
      ) : projects.data.length === 0 ? (
        <EmptyState title={isAdmin ? "No projects yet" : "You are not a member of any project yet"}>
          {isAdmin ? "Create the first one with New project." : "Ask an admin to add you to a project."}
        </EmptyState>
      ) : rows.length === 0 ? (
        <EmptyState title={`No project matches “${q}”`}>
          Clear the search to see all {projects.data.length}.
        </EmptyState>
      ) : (
        <ProjectsTable projects={rows} />
      )}
    </>
  );
}
