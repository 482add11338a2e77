import { Link } from "react-router-dom";
import { Badge } from "@/components/ui/badge";
import { PageHeader } from "@/components/ui/page";
import { EmptyState, ErrorState, TableSkeleton } from "@/components/ui/states";
import { Table, Td, Th, Tr } from "@/components/ui/table";
import { formatDateTime } from "@/lib/format";
import { useTemplates } from "../api/templates";

/** /templates: built-in and custom export templates; admins create and edit custom ones. */
export function TemplatesPage({ canEdit }: { canEdit: boolean }) {
  const templates = useTemplates();
  const custom = templates.data?.filter((t) => !t.builtin).length ?? 0;
  return (
    <>
      <PageHeader
        title="Export templates"
        subtitle={
          templates.data
            ? `${templates.data.length - custom} built-in, ${custom} custom — how each coefficient table becomes a file in a bundle`
            : "How each coefficient table becomes a file in a bundle"
        }
        action={
          canEdit && (
            <Link
              to="/templates/new"
              className="inline-flex h-8 items-center rounded border border-signal-800 bg-signal-700 px-3 text-sm font-medium text-white hover:bg-signal-800"
            >
              New template
            </Link>
          )
        }
      />
      {templates.isPending ? (
        <TableSkeleton label="Loading templates" rows={6} />
      ) : templates.isError ? (
        <ErrorState error={templates.error} onRetry={() => void templates.refetch()} />
      ) : templates.data.length === 0 ? (
        <EmptyState title="No templates">
          The built-in templates are missing from this installation.
        </EmptyState>
      ) : (
        <Table label="Export templates">
          <thead>
            <tr>
              <Th>Name</Th>
              <Th>Kind</Th>
              <Th>File</Th>
              <Th numeric>Version</Th>
              <Th numeric>Last change</Th>
            </tr>
          </thead>
          <tbody>
            {templates.data.map((t) => (
              <Tr key={t.id}>
                <Td className="font-medium">
                  <Link
                    to={`/templates/${encodeURIComponent(t.id)}`}
                    className="text-signal-800 hover:underline"
                  >
                    {t.name}
                  </Link>
                  <div className="text-xs font-normal text-ink-600">{t.description}</div>
                </Td>
                <Td>{t.builtin ? <Badge>built-in</Badge> : <Badge tone="copper">custom</Badge>}</Td>
                <Td className="font-mono text-[13px]">.{t.extension}</Td>
                <Td numeric className="font-mono">
                  v{t.version}
                </Td>
                <Td numeric className="text-ink-700">
                  {t.updatedAt
                    ? `${formatDateTime(t.updatedAt)}${t.updatedBy ? ` · ${t.updatedBy}` : ""}`
                    : "—"}
                </Td>
              </Tr>
            ))}
          </tbody>
        </Table>
      )}
    </>
  );
}
