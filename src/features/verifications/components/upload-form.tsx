import { useRef, useState, type FormEvent } from "react";
import {
  CreateVerificationFieldsSchema,
  MAX_LATENCY_SEARCH,
  type VectorSet,
} from "@shared/schemas/verifications";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { Input } from "@/components/ui/input";
import { useToast } from "@/components/ui/toast";
import { ApiError, fieldErrors } from "@/lib/api-client";
import { useCreateVerification } from "../api/create-verification";

const SELECT =
  "h-8 w-full rounded border border-paper-400 bg-white px-2 text-sm text-ink-900 focus:border-signal-600 focus:outline-none focus-visible:outline-2 focus-visible:outline-signal-500";

/**
 * "Upload simulation output": file, vector set, optional latency, simulator and RTL revision. Native
 * controls throughout (Tab order, Enter submits); the server's refusal shows under the file with its line
 * and column, and nothing typed is lost.
 */
export function UploadRunForm({
  releaseId,
  sets,
  withdrawn,
}: {
  releaseId: number;
  sets: readonly VectorSet[];
  withdrawn: boolean;
}) {
  const create = useCreateVerification(releaseId);
  const toast = useToast();
  const fileRef = useRef<HTMLInputElement>(null);
  const [file, setFile] = useState<File | null>(null);
  const [vectorSet, setVectorSet] = useState(sets[0]?.name ?? "scenario");
  const [latency, setLatency] = useState("");
  const [simulator, setSimulator] = useState("");
  const [rtlRevision, setRtlRevision] = useState("");
  const [tried, setTried] = useState(false);

  const local = CreateVerificationFieldsSchema.safeParse({ vectorSet, latency, simulator, rtlRevision });
  const localErrors: Record<string, string> = {};
  if (!local.success) for (const i of local.error.issues) localErrors[String(i.path[0])] ??= i.message;
  const server = create.error ? fieldErrors(create.error) : {};
  const fileError =
    (tried && !file ? "choose the simulation output file" : undefined) ??
    (create.error instanceof ApiError && (server.file || create.error.status === 413)
      ? create.error.message
      : undefined);
  const general =
    create.error instanceof ApiError && !server.file && create.error.status !== 413 && !server.vectorSet
      ? create.error.message
      : undefined;

  const submit = (e: FormEvent) => {
    e.preventDefault();
    setTried(true);
    if (!file || !local.success) return;
    create.mutate(
      { file, vectorSet, latency, simulator, rtlRevision },
      {
        onSuccess: (v) => {
          toast(
            v.verdict === "pass"
              ? `PASS: ${v.vectorSet} is bit-exact (${v.compared} samples)`
              : `FAIL: ${v.mismatches} of ${v.compared} samples of ${v.vectorSet} differ`,
            v.verdict === "pass" ? "pass" : "fail",
          );
          setFile(null);
          setTried(false);
          if (fileRef.current) fileRef.current.value = "";
        },
      },
    );
  };

  return (
    <form
      aria-label="Upload simulation output"
      onSubmit={submit}
      noValidate
      className="flex flex-col gap-3 rounded border border-paper-300 bg-paper-50 px-4 py-3"
    >
      {withdrawn && (
        <p className="text-xs text-fail-700">
          This release is withdrawn: runs are still recorded, flagged as made against a withdrawn release.
        </p>
      )}
      <div className="grid grid-cols-1 gap-3 md:grid-cols-[minmax(16rem,2fr)_minmax(10rem,1fr)_8rem_minmax(10rem,1fr)_minmax(10rem,1fr)]">
        <Field
          label="Simulation output"
          hint="I Q decimal lines (# comments allowed) or $readmemh hex words (.hex, .mem)."
          error={fileError}
        >
          {({ id, describedBy, invalid }) => (
            <input
              ref={fileRef}
              id={id}
              type="file"
              aria-describedby={describedBy}
              aria-invalid={invalid || undefined}
              onChange={(e) => {
                setFile(e.target.files?.[0] ?? null);
                create.reset();
              }}
              className="block w-full text-sm text-ink-800 file:mr-2 file:h-8 file:rounded file:border file:border-paper-400 file:bg-white file:px-2.5 file:text-sm file:text-ink-800 hover:file:bg-paper-200 focus-visible:outline-2 focus-visible:outline-signal-500"
            />
          )}
        </Field>
        <Field label="Vector set" error={server.vectorSet}>
          {({ id, describedBy }) => (
            <select
              id={id}
              aria-describedby={describedBy}
              className={SELECT}
              value={vectorSet}
              onChange={(e) => setVectorSet(e.target.value)}
            >
              {sets.map((s) => (
                <option key={s.name} value={s.name}>
                  {s.name}
                </option>
              ))}
            </select>
          )}
        </Field>
        <Field
          label="Latency (samples)"
          hint={`Blank: searched, 0–${MAX_LATENCY_SEARCH}.`}
          error={(tried || latency !== "" ? localErrors.latency : undefined) ?? server.latency}
        >
          {({ id, describedBy, invalid }) => (
            <Input
              id={id}
              inputMode="numeric"
              aria-describedby={describedBy}
              invalid={invalid}
              className="font-mono"
              value={latency}
              onChange={(e) => setLatency(e.target.value)}
              placeholder="search"
            />
          )}
        </Field>
        <Field label="Simulator (optional)" error={localErrors.simulator ?? server.simulator}>
          {({ id, describedBy, invalid }) => (
            <Input
              id={id}
              aria-describedby={describedBy}
              invalid={invalid}
              value={simulator}
              onChange={(e) => setSimulator(e.target.value)}
              placeholder="e.g. Icarus Verilog 12"
            />
          )}
        </Field>
        <Field label="RTL revision (optional)" error={localErrors.rtlRevision ?? server.rtlRevision}>
          {({ id, describedBy, invalid }) => (
            <Input
              id={id}
              aria-describedby={describedBy}
              invalid={invalid}
              className="font-mono"
              value={rtlRevision}
              onChange={(e) => setRtlRevision(e.target.value)}
              placeholder="e.g. git 4f2a9c1"
            />
          )}
        </Field>
      </div>
      {general && (
        <p role="alert" className="text-sm text-fail-700">
          {general}
        </p>
      )}
      <div className="flex items-center gap-3">
        <Button type="submit" variant="primary" busy={create.isPending}>
          Upload and compare
        </Button>
        <span className="text-xs text-ink-600">
          Compared bit-exactly with the set's expected output from the stored bundle. A run cannot be changed
          or deleted.
        </span>
      </div>
    </form>
  );
}
