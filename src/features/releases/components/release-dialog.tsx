import { useState } from "react";
import { compareVersions, CreateReleaseSchema, VersionSchema } from "@shared/schemas/releases";
import { Button } from "@/components/ui/button";
import { Dialog, DialogActions } from "@/components/ui/dialog";
import { Field } from "@/components/ui/field";
import { Input } from "@/components/ui/input";
import { useToast } from "@/components/ui/toast";
import { shortHash } from "@/features/reviews/lib/figures";
import { TextArea } from "@/components/ui/text-area";
import { ApiError, fieldErrors } from "@/lib/api-client";
import { cn } from "@/lib/cn";
import { useCreateRelease } from "../api/create-release";
import { useNextVersions } from "../api/next-versions";

/** What is being released: an approved revision of a design. */
export interface ReleaseTarget {
  revisionId: number;
  revisionNumber: number;
  designId: number;
  designName: string;
  designKind: "waveform" | "filter";
  contentHash: string;
}

/** DESIGN.md "Cautions shown to users": shown before a transmit waveform is released. */
export function TransmitReleaseCaution() {
  return (
    <aside
      aria-label="Transmit caution"
      className="rounded border border-warn-100 bg-warn-50 px-3 py-2 text-sm text-warn-800"
    >
      <p className="font-medium">These coefficients drive a transmitter.</p>
      <p>
        Verify the release on a dummy load or in simulation before it reaches a power amplifier, follow local
        spectrum and RF-exposure rules, and your organisation&rsquo;s own sign-off practice.
      </p>
    </aside>
  );
}

type Step = "form" | "confirm";

const detailField = (details: unknown): unknown =>
  typeof details === "object" && details !== null ? (details as { field?: unknown }).field : undefined;

/** The version chips, custom version, notes, then a confirmation that a release cannot be changed or deleted. */
export function ReleaseDialog({
  open,
  onClose,
  target,
}: {
  open: boolean;
  onClose: () => void;
  target: ReleaseTarget;
}) {
  const next = useNextVersions(target.designId, open);
  const create = useCreateRelease(target.revisionId);
  const toast = useToast();
  const [version, setVersion] = useState("");
  const [notes, setNotes] = useState("");
  const [tried, setTried] = useState(false);
  const [step, setStep] = useState<Step>("form");

  const pick = (v: string) => {
    setVersion(v);
    // A refused version's message belongs to the old value only.
    if (create.isError) create.reset();
  };
  const close = () => {
    setStep("form");
    setTried(false);
    create.reset();
    onClose();
  };

  // Validated as typed (the same schema the server uses), but only shouted once something was typed or tried.
  const versionCheck = VersionSchema.safeParse(version);
  const highest = next.data?.highest ?? null;
  let versionError =
    version !== "" || tried
      ? versionCheck.success
        ? undefined
        : versionCheck.error.issues[0]?.message
      : undefined;
  if (!versionError && versionCheck.success && highest && compareVersions(versionCheck.data, highest) === 0)
    versionError = `${highest} is already used by this design (versions are never reused)`;
  const parsed = CreateReleaseSchema.safeParse({ version, notes });
  const server = fieldErrors(create.error);
  // The server names the refused field in the 409's details (`{ reason: "version_used", field: "version" }`).
  const used =
    create.error instanceof ApiError &&
    create.error.status === 409 &&
    detailField(create.error.details) === "version";
  if (!versionError && (server.version || used)) versionError = server.version ?? create.error?.message;
  const notesError =
    (tried && !parsed.success
      ? parsed.error.issues.find((i) => i.path[0] === "notes")?.message
      : undefined) ?? server.notes;

  const suggestions = next.data
    ? ([
        ["patch", next.data.patch],
        ["minor", next.data.minor],
        ["major", next.data.major],
      ] as const)
    : [];
  // Before the first release the server suggests 1.0.0 three times: show distinct values only.
  const distinct = suggestions.filter(([, v], i) => suggestions.findIndex(([, w]) => w === v) === i);

  const title =
    step === "form" ? `Release r${target.revisionNumber}` : `Release ${parsed.data?.version ?? version}?`;
  return (
    <Dialog
      open={open}
      onClose={close}
      title={title}
      description={
        <>
          {target.designName} · content hash{" "}
          <span className="font-mono">{shortHash(target.contentHash)}</span>
        </>
      }
      footer={
        step === "form" ? (
          <DialogActions onCancel={close} label="Continue…" busy={false} formId="release-form" />
        ) : (
          <>
            <Button onClick={() => setStep("form")}>Back</Button>
            <Button
              variant="primary"
              busy={create.isPending}
              onClick={() => {
                if (!parsed.success) return;
                create.mutate(parsed.data, {
                  // The revision turns `released` and this dialog's button goes away with it: close and say so.
                  onSuccess: (rel) => {
                    toast(
                      `${rel.version} released: bundle of ${rel.files.length} files built and stored`,
                      "pass",
                    );
                    close();
                  },
                  // A refused version belongs next to its field.
                  onError: () => setStep("form"),
                });
              }}
            >
              Release {parsed.data?.version ?? version}
            </Button>
          </>
        )
      }
    >
      {step === "form" ? (
        <form
          id="release-form"
          noValidate
          className="flex flex-col gap-3"
          onSubmit={(e) => {
            e.preventDefault();
            setTried(true);
            if (parsed.success && !versionError) setStep("confirm");
          }}
        >
          <div className="flex flex-col gap-1">
            <span id="version-chips" className="text-xs font-medium text-ink-700">
              Suggested versions
              {highest ? (
                <>
                  {" "}
                  (highest used: <span className="font-mono">{highest}</span>)
                </>
              ) : (
                " (first release)"
              )}
            </span>
            <div role="group" aria-labelledby="version-chips" className="flex flex-wrap gap-1.5">
              {next.isPending && <span className="text-xs text-ink-600">Loading…</span>}
              {next.isError && (
                <span role="alert" className="text-xs text-fail-700">
                  {next.error.message}
                </span>
              )}
              {distinct.map(([kind, v]) => (
                <button
                  key={kind}
                  type="button"
                  aria-pressed={version === v}
                  onClick={() => pick(v)}
                  className={cn(
                    "rounded-sm border px-2 py-0.5 font-mono text-xs",
                    version === v
                      ? "border-signal-800 bg-signal-700 text-white"
                      : "border-paper-400 bg-white text-ink-800 hover:bg-paper-200",
                  )}
                >
                  {v} <span className="font-sans">{highest ? kind : "first"}</span>
                </button>
              ))}
            </div>
          </div>
          <Field
            label="Version (MAJOR.MINOR.PATCH)"
            hint="A version is never reused, even after a withdrawal."
            error={versionError}
          >
            {({ id, describedBy, invalid }) => (
              <Input
                id={id}
                value={version}
                inputMode="decimal"
                autoComplete="off"
                spellCheck={false}
                className="font-mono"
                aria-describedby={describedBy}
                invalid={invalid}
                onChange={(e) => pick(e.target.value)}
              />
            )}
          </Field>
          <Field
            label="Release notes"
            hint="Plain text: what changed and why, for the firmware engineers."
            error={notesError}
          >
            {({ id, describedBy, invalid }) => (
              <TextArea
                id={id}
                rows={4}
                value={notes}
                aria-describedby={describedBy}
                invalid={invalid}
                onChange={(e) => setNotes(e.target.value)}
              />
            )}
          </Field>
          {target.designKind === "waveform" && <TransmitReleaseCaution />}
          {create.isError && !used && !server.version && !server.notes && (
            <p role="alert" className="text-sm text-fail-700">
              {create.error.message}
            </p>
          )}
        </form>
      ) : (
        <div className="flex flex-col gap-2 text-sm text-ink-800">
          <p className="font-medium">A release cannot be changed or deleted.</p>
          <ul className="list-disc pl-5">
            <li>
              Version <span className="font-mono">{parsed.data?.version}</span> of {target.designName} is made
              from r{target.revisionNumber}, content hash{" "}
              <span className="font-mono">{shortHash(target.contentHash)}</span>.
            </li>
            <li>Its bundle is built now, once, and served byte for byte on every download.</li>
            <li>
              If it turns out wrong it can only be withdrawn: it then stays downloadable, flagged, and its
              version is never used again.
            </li>
          </ul>
          {target.designKind === "waveform" && <TransmitReleaseCaution />}
        </div>
      )}
    </Dialog>
  );
}

/** The "Release…" button of an approved revision, with its dialog. */
export function ReleaseAction({ target }: { target: ReleaseTarget }) {
  const [open, setOpen] = useState(false);
  return (
    <>
      <Button variant="primary" onClick={() => setOpen(true)}>
        Release…
      </Button>
      <ReleaseDialog open={open} onClose={() => setOpen(false)} target={target} />
    </>
  );
}
