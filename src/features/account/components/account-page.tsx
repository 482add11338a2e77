import { zodResolver } from "@hookform/resolvers/zod";
import type { ReactNode } from "react";
import { useForm } from "react-hook-form";
import { ChangePasswordSchema, type ChangePasswordInput, type SessionUser } from "@shared/schemas/auth";
import { RoleBadges } from "@/components/role-badges";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { Input } from "@/components/ui/input";
import { PageHeader, Section } from "@/components/ui/page";
import { useToast } from "@/components/ui/toast";
import { ApiError, fieldErrors } from "@/lib/api-client";
import { useChangePassword } from "../api/change-password";

function ChangePasswordForm() {
  const toast = useToast();
  const change = useChangePassword();
  const form = useForm<ChangePasswordInput>({
    resolver: zodResolver(ChangePasswordSchema),
    mode: "onTouched",
    defaultValues: { currentPassword: "", newPassword: "" },
  });
  const { errors } = form.formState;
  const server = fieldErrors(change.error);
  const general =
    change.error instanceof ApiError && Object.keys(server).length === 0 ? change.error.message : undefined;
  return (
    <form
      noValidate
      className="flex max-w-sm flex-col gap-4"
      onSubmit={form.handleSubmit((values) =>
        change.mutate(values, {
          onSuccess: () => {
            form.reset();
            toast("Password changed", "pass");
          },
        }),
      )}
    >
      <Field label="Current password" error={errors.currentPassword?.message ?? server.currentPassword}>
        {({ id, describedBy, invalid }) => (
          <Input
            id={id}
            type="password"
            autoComplete="current-password"
            aria-describedby={describedBy}
            invalid={invalid}
            {...form.register("currentPassword")}
          />
        )}
      </Field>
      <Field
        label="New password"
        hint="At least 10 characters."
        error={errors.newPassword?.message ?? server.newPassword}
      >
        {({ id, describedBy, invalid }) => (
          <Input
            id={id}
            type="password"
            autoComplete="new-password"
            aria-describedby={describedBy}
            invalid={invalid}
            {...form.register("newPassword")}
          />
        )}
      </Field>
      {general && (
        <p role="alert" className="text-sm text-fail-700">
          {general}
        </p>
      )}
      <div>
        <Button type="submit" variant="primary" busy={change.isPending}>
          Change password
        </Button>
      </div>
    </form>
  );
}

/** /account: who I am, a change-password form, and my API tokens (composed in by the route). */
export function AccountPage({ user, tokens }: { user: SessionUser; tokens?: ReactNode }) {
  return (
    <>
      <PageHeader title="Account" subtitle="Your sign-in details" />
      <Section title="Profile">
        <dl className="grid max-w-xl grid-cols-[max-content_1fr] gap-x-6 gap-y-1.5 rounded border border-paper-300 bg-paper-50 px-4 py-3 text-sm">
          <dt className="text-ink-600">Name</dt>
          <dd>{user.displayName}</dd>
          <dt className="text-ink-600">User name</dt>
          <dd className="font-mono">{user.username}</dd>
          <dt className="text-ink-600">E-mail</dt>
          <dd className="font-mono">{user.email}</dd>
          <dt className="text-ink-600">Roles</dt>
          <dd>
            <RoleBadges roles={user.roles} />
          </dd>
        </dl>
      </Section>
      <Section title="Change password">
        <ChangePasswordForm />
      </Section>
      {tokens}
    </>
  );
}
