import { zodResolver } from "@hookform/resolvers/zod";
import { useForm } from "react-hook-form";
import { useNavigate } from "react-router-dom";
import type { z } from "zod";
import { CreateProjectSchema } from "@shared/schemas/projects";
import { Dialog, DialogActions } from "@/components/ui/dialog";
import { Field } from "@/components/ui/field";
import { Input } from "@/components/ui/input";
import { ApiError, fieldErrors } from "@/lib/api-client";
import { friendlyResolver } from "@/lib/friendly-message";
import { useCreateProject } from "../api/manage-projects";

type FormIn = z.input<typeof CreateProjectSchema>;
type FormOut = z.output<typeof CreateProjectSchema>;

/** A slug proposed from the name while the admin has not typed one: "Harbour Radar 2" → "harbour-radar-2". */
export function slugOf(name: string): string {
  return name
    .toLowerCase()
    .normalize("NFKD")
    .replace(/[\u0300-\u036f]/g, "")
    .replace(/[^a-z0-9]+/g, "-")
    .replace(/^-+|-+$/g, "")
    .slice(0, 60);
}

/** Admin: a new project (name, slug, description); lands on the project page to add members. */
export function CreateProjectDialog({ open, onClose }: { open: boolean; onClose: () => void }) {
  const create = useCreateProject();
  const navigate = useNavigate();
  const form = useForm<FormIn, unknown, FormOut>({
    resolver: friendlyResolver(zodResolver(CreateProjectSchema)),
    mode: "onTouched",
    defaultValues: { name: "", slug: "", description: "" },
  });
  const { errors, dirtyFields } = form.formState;
  const server = fieldErrors(create.error);
  const general =
    create.error instanceof ApiError && Object.keys(server).length === 0 ? create.error.message : undefined;
  const close = () => {
    form.reset();
    create.reset();
    onClose();
  };
  const name = form.register("name", {
    onChange: (e: { target: { value: string } }) => {
      if (!dirtyFields.slug) form.setValue("slug", slugOf(e.target.value));
    },
  });
  return (
    <Dialog
      open={open}
      onClose={close}
      title="New project"
      description="Members are added on the project page once it exists."
      footer={
        <DialogActions
          onCancel={close}
          label="Create project"
          busy={create.isPending}
          formId="create-project-form"
        />
      }
    >
      <form
        id="create-project-form"
        noValidate
        className="flex flex-col gap-3"
        onSubmit={form.handleSubmit((v) =>
          create.mutate(v, {
            onSuccess: (p) => {
              close();
              navigate(`/projects/${p.id}`);
            },
          }),
        )}
      >
        <Field label="Name" error={errors.name?.message ?? server.name}>
          {({ id, describedBy, invalid }) => (
            <Input id={id} autoComplete="off" aria-describedby={describedBy} invalid={invalid} {...name} />
          )}
        </Field>
        <Field
          label="Slug"
          hint="Lower-case letters, digits and dashes; used in file names and links"
          error={errors.slug?.message ?? server.slug}
        >
          {({ id, describedBy, invalid }) => (
            <Input
              id={id}
              autoComplete="off"
              aria-describedby={describedBy}
              invalid={invalid}
              className="font-mono"
              {...form.register("slug")}
            />
          )}
        </Field>
        <Field label="Description" error={errors.description?.message ?? server.description}>
          {({ id, describedBy, invalid }) => (
            <Input
              id={id}
              autoComplete="off"
              aria-describedby={describedBy}
              invalid={invalid}
              {...form.register("description")}
            />
          )}
        </Field>
        {general && (
          <p role="alert" className="text-sm text-fail-700">
            {general}
          </p>
        )}
      </form>
    </Dialog>
  );
}
