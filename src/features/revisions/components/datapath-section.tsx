import { useForm } from "react-hook-form";
import { DATAPATH_DEFAULTS, DatapathSpecSchema, type DatapathSpec } from "@shared/schemas/analysis";
import type { RevisionContent } from "@shared/schemas/designs";
import { Button } from "@/components/ui/button";
import { Table, Td, Tr } from "@/components/ui/table";
import { cn } from "@/lib/cn";
import { useUpdateRevision } from "../api/update-revision";
import { placeServerIssues } from "../lib/server-issues";

const ROUNDING: Record<DatapathSpec["outputRounding"], string> = {
  "nearest-away": "nearest, ties away",
  "nearest-even": "nearest, ties even",
  "nearest-up": "nearest, ties up (add ½ LSB, floor)",
  floor: "floor (truncate)",
  ceiling: "ceiling (toward +∞)",
  "toward-zero": "toward zero",
};
const OVERFLOW: Record<DatapathSpec["outputOverflow"], string> = { saturate: "saturate", wrap: "wrap" };

const control =
  "h-7 rounded border border-paper-400 bg-white px-1.5 text-[13px] text-ink-900 focus-visible:outline-2 focus-visible:outline-signal-500";

/** Text fields of the form: empty optional numbers mean "derive it". */
interface FormValues {
  inputBits: string;
  accumulatorBits: string;
  outputBits: string;
  outputShift: string;
  outputRounding: DatapathSpec["outputRounding"];
  outputOverflow: DatapathSpec["outputOverflow"];
}

const NUMBER_FIELDS = ["inputBits", "accumulatorBits", "outputBits", "outputShift"] as const;

function current(content: RevisionContent): { inputBits: number; datapath: DatapathSpec } {
  return { inputBits: content.inputBits, datapath: content.datapath ?? { ...DATAPATH_DEFAULTS } };
}

function toForm(content: RevisionContent): FormValues {
  const { inputBits, datapath: d } = current(content);
  return {
    inputBits: String(inputBits),
    accumulatorBits: d.accumulatorBits === undefined ? "" : String(d.accumulatorBits),
    outputBits: String(d.outputBits),
    outputShift: d.outputShift === undefined ? "" : String(d.outputShift),
    outputRounding: d.outputRounding,
    outputOverflow: d.outputOverflow,
  };
}

const LABELS: Record<(typeof NUMBER_FIELDS)[number], [string, string]> = {
  inputBits: ["Input (ADC) width", "bits, signed"],
  accumulatorBits: ["Accumulator width", "bits; empty = the worst-case rule"],
  outputBits: ["Output width", "bits, signed"],
  outputShift: ["Output shift", "bits right; empty = accumulator − output"],
};

interface SectionProps {
  revisionId: number;
  content: RevisionContent;
  editable: boolean;
}

/** The receive/FIR datapath: a form on an editable draft, a table otherwise. */
export function DatapathSection({ revisionId, content, editable }: SectionProps) {
  const { inputBits, datapath: d } = current(content);
  if (!editable)
    return (
      <Table label="Datapath">
        <tbody>
          <Tr>
            <Td>{LABELS.inputBits[0]}</Td>
            <Td numeric>{inputBits} bits</Td>
          </Tr>
          <Tr>
            <Td>{LABELS.accumulatorBits[0]}</Td>
            <Td numeric>
              {d.accumulatorBits === undefined ? "worst-case rule" : `${d.accumulatorBits} bits`}
            </Td>
          </Tr>
          <Tr>
            <Td>{LABELS.outputBits[0]}</Td>
            <Td numeric>{d.outputBits} bits</Td>
          </Tr>
          <Tr>
            <Td>{LABELS.outputShift[0]}</Td>
            <Td numeric>{d.outputShift === undefined ? "derived" : `${d.outputShift} bits`}</Td>
          </Tr>
          <Tr>
            <Td>Output rounding / overflow</Td>
            <Td numeric>
              {ROUNDING[d.outputRounding]} / {OVERFLOW[d.outputOverflow]}
            </Td>
          </Tr>
        </tbody>
      </Table>
    );
  return <Editor revisionId={revisionId} content={content} />;
}

function Editor({ revisionId, content }: Omit<SectionProps, "editable">) {
  const update = useUpdateRevision(revisionId);
  const form = useForm<FormValues>({ defaultValues: toForm(content) });
  const { register, handleSubmit, formState, setError, reset } = form;
  const onSubmit = handleSubmit(async (v) => {
    const num = (s: string) => (s.trim() === "" ? undefined : Number(s));
    const inputBits = num(v.inputBits);
    if (inputBits === undefined || !Number.isInteger(inputBits) || inputBits < 2 || inputBits > 32) {
      setError("inputBits", { type: "client", message: "an integer from 2 to 32" });
      return;
    }
    const parsed = DatapathSpecSchema.safeParse({
      accumulatorBits: num(v.accumulatorBits),
      outputBits: num(v.outputBits),
      outputShift: num(v.outputShift),
      outputRounding: v.outputRounding,
      outputOverflow: v.outputOverflow,
    });
    if (!parsed.success) {
      for (const issue of parsed.error.issues)
        setError(String(issue.path[0]) as keyof FormValues, { type: "client", message: issue.message });
      return;
    }
    try {
      const detail = await update.mutateAsync({ ...content, inputBits, datapath: parsed.data });
      reset(toForm(detail.content));
    } catch (err) {
      const rest = placeServerIssues(err, ["datapath", "inputBits"], (field, message) =>
        setError(field.replace(/^datapath\./, "") as keyof FormValues, { type: "server", message }),
      );
      if (rest.length) setError("root.server", { type: "server", message: rest.join("; ") });
    }
  });
  return (
    <form onSubmit={onSubmit} aria-label="Datapath" className="flex flex-col gap-2">
      <Table label="Datapath">
        <tbody>
          {NUMBER_FIELDS.map((key) => {
            const error = formState.errors[key]?.message;
            const id = `dp-${key}`;
            return (
              <Tr key={key}>
                <Td>
                  <label htmlFor={id}>{LABELS[key][0]}</label>
                </Td>
                <Td numeric>
                  <input
                    id={id}
                    inputMode="numeric"
                    aria-invalid={error ? true : undefined}
                    aria-describedby={error ? `${id}-error` : undefined}
                    className={cn(control, "w-16 text-right font-mono", error && "border-fail-600")}
                    {...register(key)}
                  />
                  {error && (
                    <span id={`${id}-error`} role="alert" className="ml-2 text-xs text-fail-700">
                      {error}
                    </span>
                  )}
                </Td>
                <Td className="text-xs text-ink-700">{LABELS[key][1]}</Td>
              </Tr>
            );
          })}
          <Tr>
            <Td>
              <label htmlFor="dp-rounding">Output rounding</label>
            </Td>
            <Td numeric>
              <select id="dp-rounding" className={control} {...register("outputRounding")}>
                {Object.entries(ROUNDING).map(([v, text]) => (
                  <option key={v} value={v}>
                    {text}
                  </option>
                ))}
              </select>
            </Td>
            <Td className="text-xs text-ink-700">default: nearest, ties even</Td>
          </Tr>
          <Tr>
            <Td>
              <label htmlFor="dp-overflow">Output overflow</label>
            </Td>
            <Td numeric>
              <select id="dp-overflow" className={control} {...register("outputOverflow")}>
                {Object.entries(OVERFLOW).map(([v, text]) => (
                  <option key={v} value={v}>
                    {text}
                  </option>
                ))}
              </select>
            </Td>
            <Td className="text-xs text-ink-700">
              default: saturate (a wrap can put full-scale glitches out)
            </Td>
          </Tr>
        </tbody>
      </Table>
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
          Save datapath
        </Button>
      </div>
    </form>
  );
}
