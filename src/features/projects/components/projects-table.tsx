import { Link } from "react-router-dom";
import type { Project } from "@shared/schemas/projects";
import { Table, Td, Th, Tr } from "@/components/ui/table";
import { formatDate } from "@/lib/format";

/** Projects as a compact table: name (linked), slug, member count, created. */
export function ProjectsTable({
  projects,
  label = "Projects",
}: {
  projects: readonly Project[];
  label?: string;
}) {
  return (
    <Table label={label}>
      <thead>
        <tr>
          <Th>Name</Th>
          <Th>Slug</Th>
          <Th numeric>Members</Th>
          <Th numeric>Created</Th>
        </tr>
      </thead>
      <tbody>
        {projects.map((p) => (
          <Tr key={p.id}>
            <Td>
              <Link to={`/projects/${p.id}`} className="font-medium text-signal-800 hover:underline">
                {p.name}
              </Link>
            </Td>
            <Td className="font-mono text-[13px] text-ink-700">{p.slug}</Td>
            <Td numeric>{p.memberCount}</Td>
            <Td numeric className="text-ink-700">
              {formatDate(p.createdAt)}
            </Td>
          </Tr>
        ))}
      </tbody>
    </Table>
  );
}
