import { useState } from "react";
import type { ProjectMember } from "@shared/schemas/projects";
import { RoleBadges } from "@/components/role-badges";
import { Button } from "@/components/ui/button";
import { Dialog, DialogActions } from "@/components/ui/dialog";
import { EmptyState, ErrorState } from "@/components/ui/states";
import { Table, Td, Th, Tr } from "@/components/ui/table";
import { useUsers } from "@/features/admin-users/api/users";
import { useSetMembers } from "../api/manage-projects";

const SELECT =
  "h-8 min-w-64 rounded border border-paper-400 bg-white px-2 text-sm text-ink-900 focus:border-signal-600 focus:outline-none focus-visible:outline-2 focus-visible:outline-signal-500";

/** Admin: add an active user to the project (the list sent is the current members plus one). */
function AddMember({ projectId, members }: { projectId: number; members: ProjectMember[] }) {
  const users = useUsers();
  const set = useSetMembers(projectId);
  const [choice, setChoice] = useState("");
  const candidates = (users.data ?? []).filter((u) => u.active && !members.some((m) => m.id === u.id));
  if (users.isError) return <ErrorState error={users.error} onRetry={() => void users.refetch()} />;
  return (
    <form
      className="mb-3 flex flex-wrap items-end gap-2"
      onSubmit={(e) => {
        e.preventDefault();
        if (!choice) return;
        set.mutate([...members.map((m) => m.id), Number(choice)], { onSuccess: () => setChoice("") });
      }}
    >
      <div className="flex flex-col gap-1">
        <label htmlFor="add-member" className="text-xs font-medium text-ink-700">
          Add a member
        </label>
        <select
          id="add-member"
          className={SELECT}
          value={choice}
          disabled={users.isPending || candidates.length === 0}
          onChange={(e) => setChoice(e.target.value)}
        >
          <option value="">
            {users.isPending
              ? "Loading users…"
              : candidates.length === 0
                ? "Every active user is a member"
                : "Choose a user"}
          </option>
          {candidates.map((u) => (
            <option key={u.id} value={u.id}>
              {u.displayName} ({u.username}) · {u.roles.join(", ")}
            </option>
          ))}
        </select>
      </div>
      <Button type="submit" busy={set.isPending} disabled={!choice}>
        Add
      </Button>
      {set.isError && (
        <p role="alert" className="text-sm text-fail-700">
          {set.error.message}
        </p>
      )}
    </form>
  );
}

/** Admin: take a member off the project, after a confirmation naming them. */
function RemoveMember({
  projectId,
  members,
  member,
}: {
  projectId: number;
  members: ProjectMember[];
  member: ProjectMember;
}) {
  const [open, setOpen] = useState(false);
  const set = useSetMembers(projectId);
  return (
    <>
      <Button size="sm" variant="danger-quiet" onClick={() => setOpen(true)}>
        Remove
      </Button>
      <Dialog
        open={open}
        onClose={() => setOpen(false)}
        title={`Remove ${member.displayName} from the project?`}
        description="They lose access to its designs, reviews and releases at once; their past work and audit entries stay."
        footer={
          <DialogActions
            onCancel={() => setOpen(false)}
            label="Remove member"
            variant="danger"
            busy={set.isPending}
            onConfirm={() =>
              set.mutate(
                members.filter((m) => m.id !== member.id).map((m) => m.id),
                { onSuccess: () => setOpen(false) },
              )
            }
          />
        }
      >
        {set.isError && (
          <p role="alert" className="text-sm text-fail-700">
            {set.error.message}
          </p>
        )}
      </Dialog>
    </>
  );
}

/** The members table of a project; admins add and remove members here. */
export function MembersSection({
  projectId,
  members,
  manage,
}: {
  projectId: number;
  members: ProjectMember[];
  manage: boolean;
}) {
  return (
    <>
      {manage && <AddMember projectId={projectId} members={members} />}
      {members.length === 0 ? (
        <EmptyState title="No members">
          {manage ? "Add the people who work on this programme above." : "An admin can add members."}
        </EmptyState>
      ) : (
        <Table label="Members">
          <thead>
            <tr>
              <Th>Name</Th>
              <Th>User name</Th>
              <Th>Roles</Th>
              {manage && (
                <Th>
                  <span className="sr-only">Actions</span>
                </Th>
              )}
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
                {manage && (
                  <Td className="text-right">
                    <RemoveMember projectId={projectId} members={members} member={m} />
                  </Td>
                )}
              </Tr>
            ))}
          </tbody>
        </Table>
      )}
    </>
  );
}
