import { useState } from "react";
import { WithdrawReleaseSchema, type Release } from "@shared/schemas/releases";
import { Button } from "@/components/ui/button";
import { Dialog, DialogActions } from "@/components/ui/dialog";
import { Field } from "@/components/ui/field";
import { useToast } from "@/components/ui/toast";
import { TextArea } from "@/components/ui/text-area";
import { fieldErrors } from "@/lib/api-client";
import { useWithdrawRelease } from "../api/withdraw-release";

/** Withdraw a release: a reason is required; the release stays downloadable, flagged with that reason. */
export function WithdrawDialog({
  open,
  onClose,
  release,
}: {
  open: boolean;
  onClose: () => void;
  release: Release;
}) {
  const [reason, setReason] = useState("");
  const [tried, setTried] = useState(false);
  const withdraw = useWithdrawRelease(release.id);
  const toast = useToast();
  const parsed = WithdrawReleaseSchema.safeParse({ reason });
  const error =
    (tried && !parsed.success ? parsed.error.issues[0]?.message : undefined) ??
    fieldErrors(withdraw.error).reason;
  const close = () => {
    setTried(false);
    withdraw.reset();
    onClose();
  };
  return (
    <Dialog
      open={open}
      onClose={close}
      title={`Withdraw ${release.version}?`}
      description={`${release.designName} · released ${release.releasedAt.slice(0, 10)} by ${release.releasedBy.displayName}`}
      footer={
        <DialogActions
          onCancel={close}
          label={`Withdraw ${release.version}`}
          variant="danger"
          busy={withdraw.isPending}
          formId="withdraw-form"
        />
      }
    >
      <form
        id="withdraw-form"
        noValidate
        className="flex flex-col gap-3 text-sm text-ink-800"
        onSubmit={(e) => {
          e.preventDefault();
          setTried(true);
          if (!parsed.success) return;
          withdraw.mutate(parsed.data, {
            onSuccess: () => {
              toast(`${release.version} withdrawn`, "neutral");
              setReason("");
              close();
            },
          });
        }}
      >
        <p>
          The release stays visible and downloadable, flagged as withdrawn with your reason, so builds that
          use it can still be traced. Its version <span className="font-mono">{release.version}</span> is
          never used again. A withdrawal cannot be undone.
        </p>
        <Field
          label="Reason (required)"
          hint="Shown to everyone who opens or downloads this release."
          error={error}
        >
          {({ id, describedBy, invalid }) => (
            <TextArea
              id={id}
              rows={3}
              value={reason}
              aria-describedby={describedBy}
              invalid={invalid}
              onChange={(e) => setReason(e.target.value)}
            />
          )}
        </Field>
        {withdraw.isError && !fieldErrors(withdraw.error).reason && (
          <p role="alert" className="text-fail-700">
            {withdraw.error.message}
          </p>
        )}
      </form>
    </Dialog>
  );
}

/** A "Withdraw…" button with its dialog; renders nothing for a release already withdrawn. */
export function WithdrawAction({ release, size = "sm" }: { release: Release; size?: "sm" | "md" }) {
  const [open, setOpen] = useState(false);
  if (release.withdrawn) return null;
  return (
    <>
      <Button size={size} variant={size === "sm" ? "danger-quiet" : "danger"} onClick={() => setOpen(true)}>
        Withdraw…
      </Button>
      <WithdrawDialog open={open} onClose={() => setOpen(false)} release={release} />
    </>
  );
}
