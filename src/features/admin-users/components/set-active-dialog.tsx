import type { User } from "@shared/schemas/users";
import { Dialog, DialogActions } from "@/components/ui/dialog";
import { useToast } from "@/components/ui/toast";
import { ApiError } from "@/lib/api-client";
import { useUpdateUser } from "../api/users";

/** Confirms deactivation (which ends the user's sessions at once) or reactivation. */
export function SetActiveDialog({ user, onClose }: { user: User; onClose: () => void }) {
  const toast = useToast();
  const update = useUpdateUser();
  const deactivate = user.active;
  const run = () =>
    update.mutate(
      { id: user.id, patch: { active: !deactivate } },
      {
        onSuccess: () => {
          toast(deactivate ? `${user.displayName} deactivated` : `${user.displayName} reactivated`, "pass");
          onClose();
        },
      },
    );
  return (
    <Dialog
      open
      onClose={onClose}
      title={deactivate ? `Deactivate ${user.displayName}?` : `Reactivate ${user.displayName}?`}
      footer={
        <DialogActions
          onCancel={onClose}
          label={deactivate ? "Deactivate" : "Reactivate"}
          variant={deactivate ? "danger" : "primary"}
          busy={update.isPending}
          onConfirm={run}
        />
      }
    >
      <div className="flex flex-col gap-2 text-sm text-ink-800">
        {deactivate ? (
          <>
            <p>
              <strong>Their sessions end now</strong>: any open browser tab of{" "}
              <span className="font-mono">{user.username}</span> is signed out on its next request, and they
              can no longer sign in.
            </p>
            <p className="text-ink-600">
              Their work, reviews and releases stay. You can reactivate the account later.
            </p>
          </>
        ) : (
          <p>
            <span className="font-mono">{user.username}</span> will be able to sign in again with their
            current password.
          </p>
        )}
        {update.error instanceof ApiError && (
          <p role="alert" className="text-fail-700">
            {update.error.message}
          </p>
        )}
      </div>
    </Dialog>
  );
}
