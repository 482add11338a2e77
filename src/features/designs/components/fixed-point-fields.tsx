import { useFormContext, useWatch } from "react-hook-form";
import { WrapCaution } from "@/components/wrap-caution";
import type { DesignFormValues } from "../lib/form-values";
import { qFormat } from "../lib/derived-figures";
import { FieldGroup, NumberField, SelectField } from "./form-controls";

type Role = keyof DesignFormValues["fixedPoint"];

const ROLE_NAMES: Record<Role, string> = {
  tx: "tx — transmit",
  rx: "rx — receive (matched filter)",
  fir: "fir — filter taps",
};

/** Word length, fraction length, sign, scaling, rounding and overflow of one table, with its Q format. */
export function FixedPointFields({ role }: { role: Role }) {
  const { control, register } = useFormContext<DesignFormValues>();
  const [w, f, signed, overflow] = useWatch({
    control,
    name: [
      `fixedPoint.${role}.wordLength`,
      `fixedPoint.${role}.fractionLength`,
      `fixedPoint.${role}.signed`,
      `fixedPoint.${role}.overflow`,
    ],
  });
  return (
    <FieldGroup
      legend={`Fixed point: ${ROLE_NAMES[role]}`}
      columns={3}
      note={
        <>
          Format{" "}
          <span className="font-mono text-ink-900" data-testid={`q-format-${role}`}>
            {qFormat(w, f, signed)}
          </span>
          {Number.isInteger(w) && ` · ${w}-bit ${signed ? "two's complement" : "unsigned"}`}
        </>
      }
    >
      <NumberField
        name={`fixedPoint.${role}.wordLength`}
        label="Word length W"
        unit="bits"
        step="1"
        hint="2–32"
      />
      <NumberField
        name={`fixedPoint.${role}.fractionLength`}
        label="Fraction length F"
        unit="bits"
        step="1"
        hint="used as given; scaling may override"
      />
      <label className="mt-5 flex items-center gap-2 text-sm text-ink-800">
        <input type="checkbox" className="accent-signal-700" {...register(`fixedPoint.${role}.signed`)} />
        Signed (two's complement)
      </label>
      <SelectField
        name={`fixedPoint.${role}.scaling`}
        label="Scaling"
        options={[
          ["full-scale", "Full scale"],
          ["normalize", "Normalize (2^k gain)"],
          ["as-given", "As given (F)"],
        ]}
      />
      <SelectField
        name={`fixedPoint.${role}.rounding`}
        label="Rounding"
        options={[
          ["nearest-even", "Nearest, ties to even"],
          ["nearest-away", "Nearest, ties away"],
          ["nearest-up", "Nearest, ties up (add ½ LSB, floor)"],
          ["floor", "Floor (truncate)"],
          ["ceiling", "Ceiling (toward +∞)"],
          ["toward-zero", "Toward zero"],
        ]}
      />
      <SelectField
        name={`fixedPoint.${role}.overflow`}
        label="Overflow"
        options={[
          ["saturate", "Saturate"],
          ["wrap", "Wrap (two's complement)"],
        ]}
      />
      {role === "tx" && overflow === "wrap" && <WrapCaution className="sm:col-span-3" />}
    </FieldGroup>
  );
}
