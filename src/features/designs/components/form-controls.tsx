/**
 * Inputs of the new-design form, bound to it through react-hook-form's context: a labelled number with its unit,
 * a select, and a radio group. Each shows the message of its own field (client schema or server answer).
 */
import { useEffect, useState, type ReactNode } from "react";
import { get, useController, useFormContext, type FieldPath } from "react-hook-form";
import { Field } from "@/components/ui/field";
import { Input } from "@/components/ui/input";
import { cn } from "@/lib/cn";
import { notANumberMessage, parseNumberText } from "@/lib/parse-number";
import type { DesignFormValues } from "../lib/form-values";

type Name = FieldPath<DesignFormValues>;

/** The message react-hook-form holds for one field. */
export function useFieldError(name: Name): string | undefined {
  const { formState } = useFormContext<DesignFormValues>();
  return (get(formState.errors, name) as { message?: string } | undefined)?.message;
}

export const SELECT_CLASS =
  "h-8 w-full rounded border bg-white px-2 text-sm text-ink-900 focus:border-signal-600 focus:outline-none focus-visible:outline-2 focus-visible:outline-signal-500";

const numberText = (v: unknown): string =>
  typeof v === "number" ? (Number.isNaN(v) ? "" : String(v)) : typeof v === "string" ? v : "";

/**
 * A number field with its unit after the label, e.g. "Bandwidth (MHz)". Empty reads as NaN = not given.
 * A text box read strictly (src/lib/parse-number.ts): "1O" or "50 us" is refused by name, not read as 1 or 50.
 * The box keeps the text as typed ("1." while typing 1.5) and the form holds its parsed value.
 */
export function NumberField({
  name,
  label,
  unit,
  hint,
  step = "any",
}: {
  name: Name;
  label: string;
  unit?: string;
  hint?: ReactNode;
  step?: string;
}) {
  const { control } = useFormContext<DesignFormValues>();
  const { field } = useController({ control, name });
  const error = useFieldError(name);
  const [text, setText] = useState(() => numberText(field.value));
  // A value set from outside (reset, "use this W") replaces the text; the user's own typing does not.
  useEffect(() => {
    const held = field.value as unknown;
    const mine = parseNumberText(text);
    const same =
      typeof held === "number" && typeof mine === "number"
        ? Object.is(held, mine) || held === mine
        : held === mine;
    if (!same) setText(numberText(held));
    // eslint-disable-next-line react-hooks/exhaustive-deps -- only an outside change of the value matters
  }, [field.value]);
  const held = field.value as unknown;
  const message = error && typeof held === "string" ? notANumberMessage(held, unit) : error;
  return (
    <Field label={unit ? `${label} (${unit})` : label} hint={hint} error={message}>
      {({ id, describedBy, invalid }) => (
        <Input
          id={id}
          ref={field.ref}
          name={field.name}
          type="text"
          inputMode={step === "1" ? "numeric" : "decimal"}
          autoComplete="off"
          spellCheck={false}
          aria-describedby={describedBy}
          invalid={invalid}
          className="text-right font-mono"
          value={text}
          onChange={(e) => {
            setText(e.target.value);
            field.onChange(parseNumberText(e.target.value));
          }}
          onBlur={field.onBlur}
        />
      )}
    </Field>
  );
}

/** A native select; `numeric` stores the option as a number. */
export function SelectField({
  name,
  label,
  options,
  numeric = false,
}: {
  name: Name;
  label: string;
  options: ReadonlyArray<readonly [string | number, string]>;
  numeric?: boolean;
}) {
  const { register } = useFormContext<DesignFormValues>();
  const error = useFieldError(name);
  return (
    <Field label={label} error={error}>
      {({ id, describedBy, invalid }) => (
        <select
          id={id}
          aria-describedby={describedBy}
          aria-invalid={invalid || undefined}
          className={cn(SELECT_CLASS, invalid ? "border-fail-600" : "border-paper-400")}
          {...register(name, numeric ? { valueAsNumber: true } : {})}
        >
          {options.map(([value, text]) => (
            <option key={value} value={value}>
              {text}
            </option>
          ))}
        </select>
      )}
    </Field>
  );
}

/** Mutually exclusive choices shown side by side (few options, each worth reading). */
export function RadioGroup({
  name,
  legend,
  options,
}: {
  name: Name;
  legend: string;
  options: ReadonlyArray<readonly [string, string]>;
}) {
  const { register } = useFormContext<DesignFormValues>();
  return (
    <fieldset className="flex flex-col gap-1">
      <legend className="mb-1 text-xs font-medium text-ink-700">{legend}</legend>
      <div className="flex flex-wrap gap-1">
        {options.map(([value, text]) => (
          <label
            key={value}
            className="flex cursor-pointer items-center gap-1.5 rounded border border-paper-400 bg-white px-2.5 py-1 text-sm text-ink-800 has-[:checked]:border-signal-600 has-[:checked]:bg-signal-50 has-[:focus-visible]:outline-2 has-[:focus-visible]:outline-signal-500"
          >
            <input type="radio" value={value} className="accent-signal-700" {...register(name)} />
            {text}
          </label>
        ))}
      </div>
    </fieldset>
  );
}

/** A titled group of fields on a grid. */
export function FieldGroup({
  legend,
  children,
  columns = 3,
  note,
}: {
  legend: string;
  children: ReactNode;
  columns?: 2 | 3 | 4;
  note?: ReactNode;
}) {
  return (
    <fieldset className="rounded border border-paper-300 bg-paper-50 px-4 pt-2 pb-4">
      <legend className="px-1 text-sm font-semibold text-ink-800">{legend}</legend>
      {note && <p className="mb-2 text-xs text-ink-600">{note}</p>}
      <div
        className={cn(
          "grid gap-3",
          columns === 2 ? "sm:grid-cols-2" : columns === 3 ? "sm:grid-cols-3" : "sm:grid-cols-4",
        )}
      >
        {children}
      </div>
    </fieldset>
  );
}
