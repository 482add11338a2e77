import { zodResolver } from "@hookform/resolvers/zod";
import { useForm } from "react-hook-form";
import { z } from "zod";
import { RoleSchema } from "@shared/schemas/auth";
import type { User } from "@shared/schemas/users";
import { Dialog, DialogActions } from "@/components/ui/dialog";
import { useToast } from "@/components/ui/toast";
import { ApiError } from "@/lib/api-client";
import { useUpdateUser } from "../api/users";
import { RoleCheckboxes } from "./role-checkboxes";

const RolesFormSchema = z.object({ roles: z.array(RoleSchema).min(1, "choose at least one role") });
type RolesForm = z.infer<typeof RolesFormSchema>;

/** Sets a user's roles. */
export function EditRolesDialog({ user, onClose }: { user: User; onClose: () => void }) {
  const toast = useToast();
  const update = useUpdateUser();
  const form = useForm<RolesForm>({
    resolver: zodResolver(RolesFormSchema),
    defaultValues: { roles: user.roles },
  });
  return (
    <Dialog
      open
      onClose={onClose}
      title={`Roles of ${user.displayName}`}
      description="Changes apply from their next request."
      footer={
        <DialogActions
          onCancel={onClose}
          label="Save roles"
          busy={update.isPending}
          formId="edit-roles-form"
        />
      }
    >
      <form
        id="edit-roles-form"
        noValidate
        className="flex flex-col gap-3"
        onSubmit={form.handleSubmit(({ roles }) =>
          update.mutate(
            { id: user.id, patch: { roles } },
            {
              onSuccess: () => {
                toast(`Roles of ${user.displayName} saved`, "pass");
                onClose();
              },
            },
          ),
        )}
      >
        <RoleCheckboxes registration={form.register("roles")} error={form.formState.errors.roles?.message} />
        {update.error instanceof ApiError && (
          <p role="alert" className="text-sm text-fail-700">
            {update.error.message}
          </p>
        )}
      </form>
    </Dialog>
  );
}
