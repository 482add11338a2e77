import { Link, useParams } from "react-router-dom";
import { PageHeader, Section } from "@/components/ui/page";
import { PageLoading, PageNotFound } from "@/components/ui/page-states";
import { ErrorState } from "@/components/ui/states";
import { DesignsTable, NewDesignLink } from "@/features/designs/components/designs-table";
import { useMe } from "@/features/auth/api/get-me";
import { ApiError } from "@/lib/api-client";
import { formatDate } from "@/lib/format";
import { useProject } from "../api/get-project";
import { MembersSection } from "./members-section";

/** /projects/:id: header, the designs table and members. */
export function ProjectPage() {
  const { id } = useParams();
  const projectId = Number(id);
  const valid = Number.isInteger(projectId) && projectId > 0;
  const query = useProject(valid ? projectId : -1);
  // Creating needs the author role (the server also requires membership, which seeing the page implies).
  const roles = useMe().data?.roles ?? [];
  const canCreate = roles.includes("author");
  const isAdmin = roles.includes("admin");
  if (!valid || (query.error instanceof ApiError && query.error.status === 404)) {
    return (
      <PageNotFound title="Project not found" message="This project does not exist or you are not a member" />
    );
  }
  if (query.isPending) return <PageLoading label="Loading project" />;
  if (query.isError) return <ErrorState error={query.error} onRetry={() => void query.refetch()} />;
  const { project, members } = query.data;
  return (
    <>
      <nav aria-label="Breadcrumb" className="mb-1 text-xs text-ink-600">
        <Link to="/projects" className="hover:underline">
          Projects
        </Link>{" "}
        / <span className="font-mono">{project.slug}</span>
      </nav>
      <PageHeader
        title={project.name}
        action={canCreate ? <NewDesignLink projectId={project.id} /> : undefined}
        subtitle={
          <>
            <p className="max-w-3xl">{project.description || "No description."}</p>
            <p className="mt-1 text-xs">
              Slug <span className="font-mono">{project.slug}</span> · created{" "}
              <span className="font-mono">{formatDate(project.createdAt)}</span> · {project.memberCount}{" "}
              {project.memberCount === 1 ? "member" : "members"}
            </p>
          </>
        }
      />
      <Section title="Designs">
        <DesignsTable projectId={project.id} canCreate={canCreate} />
      </Section>
      <Section title={`Members (${members.length})`}>
        <MembersSection projectId={project.id} members={members} manage={isAdmin} />
      </Section>
    </>
  );
}
