import { useState } from "react";
import { useQuery } from "@tanstack/react-query";
import { FormProvider, get, useForm, useFormContext, useWatch, type FieldPath } from "react-hook-form";
import { Link, useNavigate, useParams } from "react-router-dom";
import type { Upload } from "@shared/schemas/designs";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { Input } from "@/components/ui/input";
import { PageHeader } from "@/components/ui/page";
import { PageNotFound } from "@/components/ui/page-states";
import { EmptyState } from "@/components/ui/states";
import { useMe } from "@/features/auth/api/get-me";
import { projectQueryOptions } from "@/features/projects/api/get-project";
import { ApiError } from "@/lib/api-client";
import { useCreateDesign } from "../api/create-design";
import { defaultFormValues, type DesignFormValues } from "../lib/form-values";
import { createDesignResolver, fieldMessages, type IssueLike } from "../lib/issues";
import { toCreateInput } from "../lib/to-create-input";
import { DerivedFigures } from "./derived-figures";
import { FixedPointFields } from "./fixed-point-fields";
import { FieldGroup, NumberField, RadioGroup, useFieldError } from "./form-controls";
import { FirDesignFields, WaveformGeneratorFields } from "./generator-fields";
import { LimitsFields } from "./limits-fields";
import { UploadField } from "./upload-field";
import { WindowFields } from "./window-fields";

/** Issues named by an error answer: a validation list, or a single `{ path }` (409 name taken). */
function serverIssues(err: ApiError): IssueLike[] {
  if (Array.isArray(err.details)) return err.details as IssueLike[];
  const d = err.details as { path?: unknown } | undefined;
  if (d && Array.isArray(d.path)) return [{ path: d.path as Array<string | number>, message: err.message }];
  return [];
}

function NameAndDescription() {
  const form = useFormContext<DesignFormValues>();
  const nameError = useFieldError("name");
  const descriptionError = useFieldError("description");
  return (
    <div className="grid gap-3">
      <Field
        label="Name"
        error={nameError}
        hint="Unique in the project, e.g. “Long-pulse LFM, 10 MHz / 50 µs”"
      >
        {({ id, describedBy, invalid }) => (
          <Input
            id={id}
            autoComplete="off"
            aria-describedby={describedBy}
            invalid={invalid}
            {...form.register("name")}
          />
        )}
      </Field>
      <Field label="Description" error={descriptionError}>
        {({ id, describedBy, invalid }) => (
          <textarea
            id={id}
            rows={2}
            aria-describedby={describedBy}
            aria-invalid={invalid || undefined}
            className="w-full rounded border border-paper-400 bg-white px-2.5 py-1.5 text-sm text-ink-900 focus:border-signal-600 focus:outline-none focus-visible:outline-2 focus-visible:outline-signal-500"
            {...form.register("description")}
          />
        )}
      </Field>
    </div>
  );
}

function UploadSettings({ kind }: { kind: DesignFormValues["kind"] }) {
  return (
    <FieldGroup
      legend={kind === "waveform" ? "Uploaded transmit samples" : "Uploaded FIR taps"}
      columns={kind === "filter" ? 4 : 3}
    >
      <NumberField name="upload.sampleRateMHz" label="Sample rate fs" unit="MHz" />
      {kind === "filter" && (
        <>
          <NumberField name="upload.passLowMHz" label="Passband from" unit="MHz" />
          <NumberField name="upload.passHighMHz" label="Passband to" unit="MHz" />
          <NumberField name="upload.stopLowMHz" label="Stopband from" unit="MHz" />
          <NumberField name="upload.stopHighMHz" label="Stopband to" unit="MHz" />
        </>
      )}
    </FieldGroup>
  );
}

function DesignForm({ projectId }: { projectId: number }) {
  const navigate = useNavigate();
  const create = useCreateDesign(projectId);
  const [upload, setUpload] = useState<Upload | null>(null);
  const form = useForm<DesignFormValues>({
    resolver: createDesignResolver,
    mode: "onTouched",
    defaultValues: defaultFormValues(),
  });
  const [kind, source] = useWatch({ control: form.control, name: ["kind", "source"] });
  const uploadError = form.formState.errors.upload?.uploadId?.message;
  const [general, setGeneral] = useState<string | null>(null);

  const onSubmit = form.handleSubmit((values) => {
    setGeneral(null);
    create.mutate(toCreateInput(values), {
      onSuccess: (r) => navigate(`/revisions/${r.revision.id}`),
      onError: (err) => {
        const messages = err instanceof ApiError ? fieldMessages(values, serverIssues(err)) : {};
        const unplaced: string[] = [];
        let placed = 0;
        for (const [path, message] of Object.entries(messages)) {
          // Only an input shows a message: a path naming a group (or nothing) goes to the general alert.
          const value = get(values, path) as unknown;
          if (path === "root" || value === undefined || (typeof value === "object" && value !== null)) {
            unplaced.push(message);
            continue;
          }
          form.setError(
            path as FieldPath<DesignFormValues>,
            { type: "server", message },
            { shouldFocus: placed === 0 },
          );
          placed++;
        }
        // Whatever names no field is shown above the button; the form keeps every value typed.
        if (unplaced.length > 0 || placed === 0)
          setGeneral(unplaced.length > 0 ? unplaced.join("; ") : err.message);
      },
    });
  });

  return (
    <FormProvider {...form}>
      <form
        id="new-design-form"
        noValidate
        onSubmit={onSubmit}
        className="grid gap-5 lg:grid-cols-[minmax(0,1fr)_18rem]"
      >
        <div className="flex min-w-0 flex-col gap-4">
          <NameAndDescription />
          <div className="flex flex-wrap gap-6">
            <RadioGroup
              name="kind"
              legend="Kind"
              options={[
                ["waveform", "Waveform (tx + matched rx)"],
                ["filter", "Filter (FIR)"],
              ]}
            />
            <RadioGroup
              name="source"
              legend="Source"
              options={[
                ["generator", "Generator"],
                ["upload", "Upload a file"],
              ]}
            />
          </div>
          {source === "upload" ? (
            <>
              <UploadField
                projectId={projectId}
                upload={upload}
                error={uploadError}
                onUploaded={(u) => {
                  setUpload(u);
                  form.setValue("upload.uploadId", u ? u.id : NaN, {
                    shouldValidate: form.formState.isSubmitted,
                  });
                }}
              />
              <UploadSettings kind={kind} />
            </>
          ) : kind === "waveform" ? (
            <WaveformGeneratorFields />
          ) : (
            <FirDesignFields />
          )}
          {kind === "waveform" && (
            <FieldGroup
              legend="Receive filter"
              note="h[n] = w[n]·conj(s[N−1−n]): the matched filter of tx, weighted by this window."
            >
              <WindowFields path="rxWindow" label="Receive window" />
            </FieldGroup>
          )}
          {kind === "waveform" ? (
            <>
              <FixedPointFields role="tx" />
              <FixedPointFields role="rx" />
            </>
          ) : (
            <FixedPointFields role="fir" />
          )}
          <LimitsFields kind={kind} />
          {general && (
            <p
              role="alert"
              className="rounded border border-fail-100 bg-fail-50 px-3 py-2 text-sm text-fail-800"
            >
              {general}
            </p>
          )}
          <div className="flex items-center justify-end gap-3 border-t border-paper-300 pt-3">
            <Link to={`/projects/${projectId}`} className="text-sm text-ink-700 hover:underline">
              Cancel
            </Link>
            <Button type="submit" variant="primary" busy={create.isPending}>
              Create design
            </Button>
          </div>
        </div>
        <aside className="lg:sticky lg:top-4 lg:self-start">
          <DerivedFigures control={form.control} />
        </aside>
      </form>
    </FormProvider>
  );
}

/** /projects/:id/designs/new: a design from a generator or an uploaded file; lands on r1 when created. */
export function NewDesignPage() {
  const { id } = useParams();
  const projectId = Number(id);
  const me = useMe();
  const valid = Number.isInteger(projectId) && projectId > 0;
  const isAuthor = me.data?.roles.includes("author") ?? false;
  const project = useQuery({ ...projectQueryOptions(projectId), enabled: valid });
  if (project.error instanceof ApiError && project.error.status === 404)
    return (
      <PageNotFound title="Project not found" message="This project does not exist or you are not a member" />
    );
  return (
    <>
      <nav aria-label="Breadcrumb" className="mb-1 text-xs text-ink-600">
        <Link to="/projects" className="hover:underline">
          Projects
        </Link>{" "}
        /{" "}
        <Link to={`/projects/${projectId}`} className="hover:underline">
          {project.data?.project.name ?? "Project"}
        </Link>{" "}
        / New design
      </nav>
      <PageHeader
        title="New design"
        subtitle="A waveform (transmit table and its matched receive filter) or a FIR filter, from a generator or a file"
      />
      {!valid ? (
        <EmptyState title="This project does not exist" />
      ) : me.isPending ? null : !isAuthor ? (
        <EmptyState title="Only authors create designs">
          Ask an admin for the author role if you define waveforms or filters.
        </EmptyState>
      ) : (
        <DesignForm projectId={projectId} />
      )}
    </>
  );
}
