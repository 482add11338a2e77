import { zodResolver } from "@hookform/resolvers/zod";
import { useEffect } from "react";
import { useForm } from "react-hook-form";
import { z } from "zod";
import { FixedPointSpecSchema } from "@shared/schemas/analysis";
import type { RevisionContent } from "@shared/schemas/designs";
import { Button } from "@/components/ui/button";
import { Table, Td, Th, Tr } from "@/components/ui/table";
import { cn } from "@/lib/cn";
import { friendlyResolver } from "@/lib/friendly-message";
import { parseNumberText } from "@/lib/parse-number";
import { WrapCaution } from "@/components/wrap-caution";
import { useUpdateRevision } from "../api/update-revision";
import { lsb, qFormat, qRange } from "../lib/q-format";
import { placeServerIssues } from "../lib/server-issues";

type Spec = z.infer<typeof FixedPointSpecSchema>;

/** The form edits `content.fixedPoint`, validated by the same schema the server applies. */
const FormSchema = z.object({ fixedPoint: z.record(z.string(), FixedPointSpecSchema) });
type FormIn = z.input<typeof FormSchema>;
type FormOut = z.output<typeof FormSchema>;

const SCALING: Record<Spec["scaling"], string> = {
  "as-given": "as given (F)",
  normalize: "normalize (power of 2)",
  "full-scale": "full scale",
};
const ROUNDING: Record<Spec["rounding"], string> = {
  "nearest-away": "nearest, ties away",
  "nearest-even": "nearest, ties even",
  "nearest-up": "nearest, ties up",
  floor: "floor (truncate)",
  ceiling: "ceiling (toward +∞)",
  "toward-zero": "toward zero",
};
const OVERFLOW: Record<Spec["overflow"], string> = { saturate: "saturate", wrap: "wrap" };

const control =
  "h-7 rounded border border-paper-400 bg-white px-1.5 text-[13px] text-ink-900 focus-visible:outline-2 focus-visible:outline-signal-500";

function Derived({ spec }: { spec: Pick<Spec, "wordLength" | "fractionLength" | "signed"> }) {
  const { wordLength: w, fractionLength: f, signed } = spec;
  if (!Number.isInteger(w) || !Number.isInteger(f)) return <span className="text-ink-500">—</span>;
  const [lo, hi] = qRange(w, f, signed);
  return (
    <span className="font-mono text-[13px]" title={`LSB 2^-${f} = ${lsb(f)}; range ${lo} … ${hi}`}>
      {qFormat(w, f, signed)}
    </span>
  );
}

function ReadOnly({ specs }: { specs: Array<[string, Spec]> }) {
  return (
    <Table label="Fixed-point spec">
      <thead>
        <tr>
          <Th>Table</Th>
          <Th numeric>W (bits)</Th>
          <Th numeric>F (bits)</Th>
          <Th>Q format</Th>
          <Th numeric>LSB</Th>
          <Th>Signed</Th>
          <Th>Scaling</Th>
          <Th>Rounding</Th>
          <Th>Overflow</Th>
        </tr>
      </thead>
      <tbody>
        {specs.map(([role, s]) => (
          <Tr key={role}>
            <Td className="font-mono">{role}</Td>
            <Td numeric>{s.wordLength}</Td>
            <Td numeric>{s.fractionLength}</Td>
            <Td>
              <Derived spec={s} />
            </Td>
            <Td numeric>{lsb(s.fractionLength).toExponential(3)}</Td>
            <Td>{s.signed ? "two's complement" : "unsigned"}</Td>
            <Td>{SCALING[s.scaling]}</Td>
            <Td>{ROUNDING[s.rounding]}</Td>
            <Td>{OVERFLOW[s.overflow]}</Td>
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
  const form = useForm<FormIn, unknown, FormOut>({
    resolver: friendlyResolver(zodResolver(FormSchema)),
    mode: "onChange",
    defaultValues: { fixedPoint: content.fixedPoint as Record<string, Spec> },
  });
  const { register, handleSubmit, formState, setError, watch, reset } = form;
  const roles = Object.keys(content.fixedPoint);
  const values = watch("fixedPoint");
  const fieldError = (role: string, key: keyof Spec) => formState.errors.fixedPoint?.[role]?.[key]?.message;
  useEffect(() => onDirtyChange?.(formState.isDirty), [formState.isDirty, onDirtyChange]);
  const onSubmit = handleSubmit(async ({ fixedPoint }) => {
    try {
      const detail = await update.mutateAsync({ ...content, fixedPoint } as RevisionContent);
      reset({ fixedPoint: detail.content.fixedPoint as Record<string, Spec> });
    } catch (err) {
      const rest = placeServerIssues(err, ["fixedPoint"], (field, message) =>
        setError(field as `fixedPoint.${string}`, { type: "server", message }),
      );
      if (rest.length) setError("root.server", { type: "server", message: rest.join("; ") });
    }
  });
  const num = (role: string, key: "wordLength" | "fractionLength", label: string) => {
    const error = fieldError(role, key);
    const id = `fp-${role}-${key}`;
    return (
      <div className="flex flex-col items-end gap-0.5">
        <input
          id={id}
          type="text"
          inputMode="numeric"
          autoComplete="off"
          aria-label={`${role} ${label}`}
          aria-invalid={error ? true : undefined}
          aria-describedby={error ? `${id}-error` : undefined}
          className={cn(control, "w-16 text-right font-mono", error && "border-fail-600")}
          {...register(`fixedPoint.${role}.${key}`, { setValueAs: parseNumberText })}
        />
        {error && (
          <span id={`${id}-error`} role="alert" className="max-w-40 text-right text-xs text-fail-700">
            {error}
          </span>
        )}
      </div>
    );
  };
  const select = <K extends "scaling" | "rounding" | "overflow">(
    role: string,
    key: K,
    label: string,
    options: Record<string, string>,
  ) => (
    <select aria-label={`${role} ${label}`} className={control} {...register(`fixedPoint.${role}.${key}`)}>
      {Object.entries(options).map(([v, text]) => (
        <option key={v} value={v}>
          {text}
        </option>
      ))}
    </select>
  );
  return (
    <form onSubmit={onSubmit} aria-label="Fixed-point spec" className="flex flex-col gap-2">
      <Table label="Fixed-point spec">
        <thead>
          <tr>
            <Th>Table</Th>
            <Th numeric>W (bits)</Th>
            <Th numeric>F (bits)</Th>
            <Th>Q format</Th>
            <Th>Signed</Th>
            <Th>Scaling</Th>
            <Th>Rounding</Th>
            <Th>Overflow</Th>
          </tr>
        </thead>
        <tbody>
          {roles.map((role) => (
            <Tr key={role}>
              <Td className="font-mono">{role}</Td>
              <Td numeric>{num(role, "wordLength", "word length W (bits)")}</Td>
              <Td numeric>{num(role, "fractionLength", "fraction length F (bits)")}</Td>
              <Td>
                <Derived
                  spec={{
                    wordLength: values?.[role]?.wordLength ?? NaN,
                    fractionLength: values?.[role]?.fractionLength ?? NaN,
                    signed: values?.[role]?.signed ?? true,
                  }}
                />
              </Td>
              <Td>
                <label className="inline-flex items-center gap-1.5 text-[13px]">
                  <input
                    type="checkbox"
                    className="accent-signal-700"
                    {...register(`fixedPoint.${role}.signed`)}
                  />
                  <span>signed</span>
                  <span className="sr-only">({role})</span>
                </label>
              </Td>
              <Td>{select(role, "scaling", "scaling", SCALING)}</Td>
              <Td>{select(role, "rounding", "rounding", ROUNDING)}</Td>
              <Td>{select(role, "overflow", "overflow", OVERFLOW)}</Td>
            </Tr>
          ))}
        </tbody>
      </Table>
      {values?.tx?.overflow === "wrap" && <WrapCaution />}
      <div className="flex items-center justify-end gap-2">
        {formState.errors.root?.server && (
          <p role="alert" className="mr-auto text-sm text-fail-700">
            {formState.errors.root.server.message}
          </p>
        )}
        <Button disabled={!formState.isDirty || update.isPending} onClick={() => reset()}>
          Discard
        </Button>
        <Button type="submit" busy={update.isPending} disabled={!formState.isDirty}>
          Save fixed-point spec
        </Button>
      </div>
    </form>
  );
}

/** Word length, fraction length and modes per table: a form on an editable draft, a table otherwise. */
export function FixedPointSection({ editable, ...props }: SectionProps) {
  const specs = Object.entries(props.content.fixedPoint) as Array<[string, Spec]>;
  if (editable) return <Editor {...props} />;
  const wrapTx = specs.some(([role, s]) => role === "tx" && s.overflow === "wrap");
  return (
    <div className="flex flex-col gap-2">
      <ReadOnly specs={specs} />
      {wrapTx && <WrapCaution />}
    </div>
  );
}
