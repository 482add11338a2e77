import type { ReactNode } from "react";
import { Link } from "react-router-dom";
import type { Role } from "@shared/schemas/auth";
import type { Home, Project } from "@shared/schemas/projects";
import { RoleBadges } from "@/components/role-badges";
import { Badge } from "@/components/ui/badge";
import { PageHeader, Section } from "@/components/ui/page";
import { EmptyState, ErrorState, Skeleton, TableSkeleton } from "@/components/ui/states";
import { formatCount, formatDuration } from "@/lib/format";
import { ROLE_LABELS } from "@/lib/roles";
import { useHome } from "../api/get-home";
import { WorkSections } from "./work-sections";

// What each role gets done here (DESIGN.md, "Who uses it"), so the home page says why you are here.
const ROLE_DUTIES: Record<Role, string> = {
  admin: "Manage users, roles and project membership.",
  author:
    "Define waveforms and filters, choose word lengths, submit them for review and release approved revisions.",
  reviewer: "Check fixed-point reports against the acceptance limits and approve or request changes.",
  firmware:
    "Find released versions for your build, download bundles and upload simulation output for bit-exact checks.",
};

function Stat({ label, children }: { label: string; children: ReactNode }) {
  return (
    <div className="flex min-w-32 flex-col gap-0.5 px-4 py-2.5">
      <dt className="text-xs text-ink-600">{label}</dt>
      <dd className="font-mono text-lg font-medium text-ink-900">{children}</dd>
    </div>
  );
}

function StatStrip({ home }: { home: Home }) {
  const { stats, health } = home;
  return (
    <dl
      aria-label="Summary"
      className="mb-6 flex w-fit max-w-full flex-wrap divide-x divide-paper-300 rounded border border-paper-300 bg-paper-50"
    >
      <Stat label="My projects">{formatCount(stats.projectCount)}</Stat>
      {stats.userCount !== undefined && <Stat label="Users">{formatCount(stats.userCount)}</Stat>}
      {stats.activeSessions !== undefined && (
        <Stat label="Active sessions">{formatCount(stats.activeSessions)}</Stat>
      )}
      {health && (
        <Stat label="Database">
          <span className="inline-flex items-center gap-2">
            <Badge tone={health.database.ok ? "pass" : "fail"}>{health.database.ok ? "up" : "down"}</Badge>
            {health.database.latencyMs !== null && (
              <span className="text-sm">{health.database.latencyMs.toFixed(1)} ms</span>
            )}
          </span>
        </Stat>
      )}
    </dl>
  );
}

/** `/`: my roles, my projects and, for an admin, the users, sessions and server health. */
export function HomePage({
  renderProjects,
}: {
  renderProjects: (projects: readonly Project[]) => ReactNode;
}) {
  const home = useHome();
  if (home.isPending) {
    return (
      <div role="status" aria-label="Loading home">
        <Skeleton className="mb-2 h-6 w-64" />
        <Skeleton className="mb-6 h-14 w-full" />
        <TableSkeleton rows={3} />
      </div>
    );
  }
  if (home.isError) return <ErrorState error={home.error} onRetry={() => void home.refetch()} />;
  const { user, projects, health } = home.data;
  const isAdmin = user.roles.includes("admin");
  return (
    <>
      <PageHeader
        title={`Welcome, ${user.displayName}`}
        subtitle={
          <span className="inline-flex items-center gap-2">
            Signed in as <span className="font-mono">{user.username}</span> <RoleBadges roles={user.roles} />
          </span>
        }
        action={
          isAdmin ? (
            <Link
              to="/admin/users"
              className="inline-flex h-8 items-center rounded border border-signal-800 bg-signal-700 px-3 text-sm font-medium text-white hover:bg-signal-800"
            >
              Manage users
            </Link>
          ) : undefined
        }
      />
      <StatStrip home={home.data} />
      <WorkSections roles={user.roles} />
      <Section title="My roles">
        <ul className="divide-y divide-paper-200 rounded border border-paper-300 bg-paper-50">
          {user.roles.map((r) => (
            <li key={r} className="flex gap-4 px-3 py-2 text-sm">
              <span className="w-20 shrink-0 font-medium text-ink-900">{ROLE_LABELS[r]}</span>
              <span className="text-ink-700">{ROLE_DUTIES[r]}</span>
            </li>
          ))}
        </ul>
      </Section>
      <Section
        title={isAdmin ? "All projects" : "My projects"}
        action={
          projects.length > 0 ? (
            <Link to="/projects" className="text-xs text-signal-800 hover:underline">
              Open projects
            </Link>
          ) : undefined
        }
      >
        {projects.length === 0 ? (
          <EmptyState title="You are not a member of any project yet">
            {isAdmin ? "Create a project, then add its members." : "Ask an admin to add you to a project."}
          </EmptyState>
        ) : (
          renderProjects(projects)
        )}
      </Section>
      {health && (
        <Section title="Server">
          <dl className="grid grid-cols-[max-content_1fr] gap-x-6 gap-y-1 rounded border border-paper-300 bg-paper-50 px-4 py-3 text-sm">
            <dt className="text-ink-600">Status</dt>
            <dd>
              <Badge tone={health.status === "ok" ? "pass" : "warn"}>{health.status}</Badge>
            </dd>
            <dt className="text-ink-600">Version</dt>
            <dd className="font-mono">{health.version}</dd>
            <dt className="text-ink-600">Uptime</dt>
            <dd className="font-mono">{formatDuration(health.uptimeSeconds)}</dd>
            <dt className="text-ink-600">Database</dt>
            <dd className="font-mono">
              {health.database.ok
                ? "reachable"
                : `unreachable${health.database.error ? `: ${health.database.error}` : ""}`}
            </dd>
          </dl>
        </Section>
      )}
    </>
  );
}
