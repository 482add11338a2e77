import { useState } from "react";
import type { User } from "@shared/schemas/users";
import { RoleBadges } from "@/components/role-badges";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { PageHeader } from "@/components/ui/page";
import { EmptyState, ErrorState, TableSkeleton } from "@/components/ui/states";
import { Table, Td, Th, Tr } from "@/components/ui/table";
import { formatDateTime } from "@/lib/format";
import { useUsers } from "../api/users";
import { CreateUserDialog } from "./create-user-dialog";
import { EditRolesDialog } from "./edit-roles-dialog";
import { SetActiveDialog } from "./set-active-dialog";

type Pending = { kind: "roles" | "active"; user: User } | null;

/** /admin/users: every account, its roles and state; create, edit roles, deactivate. */
export function UsersPage({ currentUserId }: { currentUserId: number }) {
  const users = useUsers();
  const [creating, setCreating] = useState(false);
  const [pending, setPending] = useState<Pending>(null);
  return (
    <>
      <PageHeader
        title="Users"
        subtitle={
          users.data
            ? `${users.data.length} accounts, ${users.data.filter((u) => u.active).length} active`
            : "Accounts and roles"
        }
        action={
          <Button variant="primary" onClick={() => setCreating(true)}>
            New user
          </Button>
        }
      />
      {users.isPending ? (
        <TableSkeleton label="Loading users" rows={5} />
      ) : users.isError ? (
        <ErrorState error={users.error} onRetry={() => void users.refetch()} />
      ) : users.data.length === 0 ? (
        <EmptyState title="No users yet">Create the first account with “New user”.</EmptyState>
      ) : (
        <Table label="Users">
          <thead>
            <tr>
              <Th>Name</Th>
              <Th>User name</Th>
              <Th>E-mail</Th>
              <Th>Roles</Th>
              <Th>State</Th>
              <Th numeric>Last sign-in</Th>
              <Th>
                <span className="sr-only">Actions</span>
              </Th>
            </tr>
          </thead>
          <tbody>
            {users.data.map((u) => {
              const self = u.id === currentUserId;
              return (
                <Tr key={u.id} className={u.active ? undefined : "text-ink-600"}>
                  <Td className="font-medium whitespace-nowrap">
                    {u.displayName}
                    {self && <span className="ml-1.5 text-xs font-normal text-ink-600">(you)</span>}
                  </Td>
                  <Td className="font-mono text-[13px]">{u.username}</Td>
                  <Td className="font-mono text-[13px] text-ink-700">{u.email}</Td>
                  <Td>
                    <RoleBadges roles={u.roles} />
                  </Td>
                  <Td>
                    {u.active ? (
                      u.mustChangePassword ? (
                        <Badge tone="warn">temporary password</Badge>
                      ) : (
                        <Badge tone="pass">active</Badge>
                      )
                    ) : (
                      <Badge tone="fail">deactivated</Badge>
                    )}
                  </Td>
                  <Td numeric className="text-ink-700">
                    {formatDateTime(u.lastSignInAt)}
                  </Td>
                  <Td className="text-right whitespace-nowrap">
                    <span className="inline-flex gap-1">
                      <Button
                        size="sm"
                        variant="ghost"
                        onClick={() => setPending({ kind: "roles", user: u })}
                        aria-label={`Edit roles of ${u.username}`}
                      >
                        Roles
                      </Button>
                      <Button
                        size="sm"
                        variant="ghost"
                        disabled={self}
                        title={self ? "You cannot deactivate yourself" : undefined}
                        onClick={() => setPending({ kind: "active", user: u })}
                        aria-label={`${u.active ? "Deactivate" : "Reactivate"} ${u.username}`}
                      >
                        {u.active ? "Deactivate" : "Reactivate"}
                      </Button>
                    </span>
                  </Td>
                </Tr>
              );
            })}
          </tbody>
        </Table>
      )}
      <CreateUserDialog open={creating} onClose={() => setCreating(false)} />
      {pending?.kind === "roles" && <EditRolesDialog user={pending.user} onClose={() => setPending(null)} />}
      {pending?.kind === "active" && <SetActiveDialog user={pending.user} onClose={() => setPending(null)} />}
    </>
  );
}
