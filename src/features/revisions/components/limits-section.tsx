import { zodResolver } from "@hookform/resolvers/zod";
import { useEffect } from "react";
import { useForm } from "react-hook-form";
import { z } from "zod";
import { AcceptanceLimitsSchema } from "@shared/schemas/analysis";
import type { RevisionContent } from "@shared/schemas/designs";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { Input } from "@/components/ui/input";
import { Table, Td, Th, Tr } from "@/components/ui/table";
import { formatDb } from "@/lib/format";
import { friendlyResolver } from "@/lib/friendly-message";
import { parseNumberText } from "@/lib/parse-number";
import { useUpdateRevision } from "../api/update-revision";
import { placeServerIssues } from "../lib/server-issues";

type Limits = z.infer<typeof AcceptanceLimitsSchema>;
type LimitKey = keyof Limits;

const FormSchema = z.object({ limits: AcceptanceLimitsSchema });
type FormIn = z.input<typeof FormSchema>;
type FormOut = z.output<typeof FormSchema>;

/** Each limit as a sentence fragment: the metric and whether the value is an upper or lower bound. */
const LIMITS: Record<
  LimitKey,
  { label: string; bound: "≤" | "≥"; kinds: ReadonlyArray<RevisionContent["kind"]> }
> = {
  pslDbMax: { label: "Peak sidelobe level (PSL)", bound: "≤", kinds: ["waveform"] },
  islrDbMax: { label: "Integrated sidelobe ratio (ISLR)", bound: "≤", kinds: ["waveform"] },
  mismatchLossDbMax: { label: "Mismatch (SNR) loss", bound: "≤", kinds: ["waveform"] },
  peakLossDbMax: { label: "Peak loss, fixed vs float", bound: "≤", kinds: ["waveform"] },
  coefficientSqnrDbMin: { label: "Coefficient SQNR", bound: "≥", kinds: ["waveform", "filter"] },
  stopbandAttenuationDbMin: { label: "Stopband attenuation", bound: "≥", kinds: ["filter"] },
  passbandRippleDbMax: { label: "Passband ripple (peak-to-peak)", bound: "≤", kinds: ["filter"] },
};

const keysFor = (kind: RevisionContent["kind"]) =>
  (Object.keys(LIMITS) as LimitKey[]).filter((k) => LIMITS[k].kinds.includes(kind));

/** An empty box means "not checked": the schema wants the key absent, not NaN. */
const optionalNumber = (v: unknown) => {
  const n = parseNumberText(v);
  return typeof n === "number" && Number.isNaN(n) ? undefined : n;
};

function ReadOnly({ content }: { content: RevisionContent }) {
  return (
    <Table label="Acceptance limits">
      <thead>
        <tr>
          <Th>Metric</Th>
          <Th>Bound</Th>
          <Th numeric>Limit</Th>
        </tr>
      </thead>
      <tbody>
        {keysFor(content.kind).map((k) => (
          <Tr key={k}>
            <Td>{LIMITS[k].label}</Td>
            <Td className="font-mono">{LIMITS[k].bound}</Td>
            <Td numeric>
              {content.limits[k] === undefined ? (
                <span className="font-sans text-ink-600">not checked</span>
              ) : (
                formatDb(content.limits[k])
              )}
            </Td>
          </Tr>
        ))}
      </tbody>
    </Table>
  );
}

interface SectionProps {
  revisionId: number;
  content: RevisionContent;
  editable: boolean;
  /** Told when the form gains or loses unsaved edits. */
  onDirtyChange?: (dirty: boolean) => void;
}

function Editor({ revisionId, content, onDirtyChange }: Omit<SectionProps, "editable">) {
  const update = useUpdateRevision(revisionId);
  const { register, handleSubmit, formState, setError, reset, watch } = useForm<FormIn, unknown, FormOut>({
    resolver: friendlyResolver(zodResolver(FormSchema)),
    mode: "onChange",
    defaultValues: { limits: content.limits },
  });
  // RHF counts an empty optional box as a change from an absent key; compare the numbers themselves instead.
  const current = watch("limits");
  const dirty = keysFor(content.kind).some((k) => {
    const v = current?.[k] as unknown;
    const now =
      v === "" || v === undefined || (typeof v === "number" && Number.isNaN(v)) ? undefined : Number(v);
    return now !== content.limits[k];
  });
  useEffect(() => onDirtyChange?.(dirty), [dirty, onDirtyChange]);
  const onSubmit = handleSubmit(async ({ limits }) => {
    try {
      // Limits of the other kind are kept as they were: this form only shows the ones that apply.
      const detail = await update.mutateAsync({
        ...content,
        limits: { ...content.limits, ...limits },
      } as RevisionContent);
      reset({ limits: detail.content.limits });
    } catch (err) {
      const rest = placeServerIssues(err, ["limits"], (field, message) =>
        setError(field as `limits.${LimitKey}`, { type: "server", message }),
      );
      if (rest.length) setError("root.server", { type: "server", message: rest.join("; ") });
    }
  });
  return (
    <form
      onSubmit={onSubmit}
      aria-label="Acceptance limits"
      className="flex flex-col gap-3 rounded border border-paper-300 bg-paper-50 p-3"
    >
      <p className="text-xs text-ink-600">Leave a box empty to not check that metric. All values in dB.</p>
      <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
        {keysFor(content.kind).map((k) => (
          <Field
            key={k}
            label={`${LIMITS[k].label} ${LIMITS[k].bound} (dB)`}
            error={formState.errors.limits?.[k]?.message}
          >
            {({ id, describedBy, invalid }) => (
              <Input
                id={id}
                type="text"
                inputMode="decimal"
                autoComplete="off"
                aria-describedby={describedBy}
                invalid={invalid}
                className="text-right font-mono"
                {...register(`limits.${k}`, { setValueAs: optionalNumber })}
              />
            )}
          </Field>
        ))}
      </div>
      <div className="flex items-center justify-end gap-2">
        {formState.errors.root?.server && (
          <p role="alert" className="mr-auto text-sm text-fail-700">
            {formState.errors.root.server.message}
          </p>
        )}
        <Button disabled={!dirty || update.isPending} onClick={() => reset()}>
          Discard
        </Button>
        <Button type="submit" busy={update.isPending} disabled={!dirty}>
          Save limits
        </Button>
      </div>
    </form>
  );
}

/** The acceptance limits the analysis will judge against: a form on an editable draft, a table otherwise. */
export function LimitsSection({ editable, ...props }: SectionProps) {
  return editable ? <Editor {...props} /> : <ReadOnly content={props.content} />;
}
