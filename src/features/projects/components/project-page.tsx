import { Link, useParams } from "react-router-dom";
import { RoleBadges } from "@/components/role-badges";
import { PageHeader, Section } from "@/components/ui/page";
import { PageLoading, PageNotFound } from "@/components/ui/page-states";
import { EmptyState, ErrorState } from "@/components/ui/states";
import { Table, Td, Th, Tr } from "@/components/ui/table";
import { DesignsTable, NewDesignLink } from "@/features/designs/components/designs-table";
import { useMe } from "@/features/auth/api/get-me";
import { ApiError } from "@/lib/api-client";
import { formatDate } from "@/lib/format";
import { useProject } from "../api/get-project";

/** /projects/:id: header, the designs table and members. */
export function ProjectPage() {
  const { id } = useParams();
  const projectId = Number(id);
  const valid = Number.isInteger(projectId) && projectId > 0;
  const query = useProject(valid ? projectId : -1);
  // Creating needs the author role (the server also requires membership, which seeing the page implies).
  const canCreate = useMe().data?.roles.includes("author") ?? false;
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
              members
            </p>
          </>
        }
      />
      <Section title="Designs">
        <DesignsTable projectId={project.id} canCreate={canCreate} />
      </Section>
      <Section title={`Members (${members.length})`}>
        {members.length === 0 ? (
          <EmptyState title="No members">An admin can add members from the admin pages.</EmptyState>
        ) : (
          <Table label="Members">
            <thead>
              <tr>
                <Th>Name</Th>
                <Th>User name</Th>
                <Th>Roles</Th>
              </tr>
            </thead>
            <tbody>
              {members.map((m) => (
                <Tr key={m.id}>
                  <Td className="font-medium">{m.displayName}</Td>
                  <Td className="font-mono text-[13px] text-ink-700">{m.username}</Td>
                  <Td>
                    <RoleBadges roles={m.roles} />
                  </Td>
                </Tr>
              ))}
            </tbody>
          </Table>
        )}
      </Section>
    </>
  );
}
