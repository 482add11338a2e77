import { zodResolver } from "@hookform/resolvers/zod";
import { useForm } from "react-hook-form";
import { CreateUserSchema, type CreateUserInput } from "@shared/schemas/users";
import { Button } from "@/components/ui/button";
import { CopyButton } from "@/components/ui/copy-button";
import { Dialog, DialogActions } from "@/components/ui/dialog";
import { Field } from "@/components/ui/field";
import { Input } from "@/components/ui/input";
import { ApiError, fieldErrors } from "@/lib/api-client";
import { useCreateUser } from "../api/users";
import { RoleCheckboxes } from "./role-checkboxes";

/** New user form; after creation the dialog shows the temporary password once, with a copy button. */
export function CreateUserDialog({ open, onClose }: { open: boolean; onClose: () => void }) {
  const create = useCreateUser();
  const form = useForm<CreateUserInput>({
    resolver: zodResolver(CreateUserSchema),
    mode: "onTouched",
    defaultValues: { username: "", displayName: "", email: "", roles: [] },
  });
  const { errors } = form.formState;
  const server = fieldErrors(create.error);
  const general =
    create.error instanceof ApiError && Object.keys(server).length === 0 ? create.error.message : undefined;
  const close = () => {
    form.reset();
    create.reset();
    onClose();
  };
  if (create.data) {
    const { user, temporaryPassword } = create.data;
    return (
      <Dialog
        open={open}
        onClose={close}
        title={`${user.displayName} can now sign in`}
        description="Hand over this temporary password now: it is shown only once. They will be asked to change it."
        footer={
          <Button variant="primary" onClick={close}>
            Done
          </Button>
        }
      >
        <dl className="grid grid-cols-[max-content_1fr] items-center gap-x-4 gap-y-2 text-sm">
          <dt className="text-ink-600">User name</dt>
          <dd className="font-mono">{user.username}</dd>
          <dt className="text-ink-600">Temporary password</dt>
          <dd className="flex items-center gap-2">
            <code
              data-testid="temporary-password"
              className="rounded bg-paper-200 px-2 py-1 font-mono text-ink-900"
            >
              {temporaryPassword}
            </code>
            <CopyButton value={temporaryPassword} label="Copy password" />
          </dd>
        </dl>
      </Dialog>
    );
  }
  return (
    <Dialog
      open={open}
      onClose={close}
      title="New user"
      description="A temporary password is generated for them."
      footer={
        <DialogActions
          onCancel={close}
          label="Create user"
          busy={create.isPending}
          formId="create-user-form"
        />
      }
    >
      <form
        id="create-user-form"
        noValidate
        className="flex flex-col gap-3"
        onSubmit={form.handleSubmit((v) => create.mutate(v))}
      >
        <Field label="User name" error={errors.username?.message ?? server.username}>
          {({ id, describedBy, invalid }) => (
            <Input
              id={id}
              autoComplete="off"
              aria-describedby={describedBy}
              invalid={invalid}
              {...form.register("username")}
            />
          )}
        </Field>
        <Field label="Full name" error={errors.displayName?.message ?? server.displayName}>
          {({ id, describedBy, invalid }) => (
            <Input
              id={id}
              autoComplete="off"
              aria-describedby={describedBy}
              invalid={invalid}
              {...form.register("displayName")}
            />
          )}
        </Field>
        <Field label="E-mail" error={errors.email?.message ?? server.email}>
          {({ id, describedBy, invalid }) => (
            <Input
              id={id}
              type="email"
              autoComplete="off"
              aria-describedby={describedBy}
              invalid={invalid}
              {...form.register("email")}
            />
          )}
        </Field>
        <RoleCheckboxes registration={form.register("roles")} error={errors.roles?.message ?? server.roles} />
        {general && (
          <p role="alert" className="text-sm text-fail-700">
            {general}
          </p>
        )}
      </form>
    </Dialog>
  );
}
