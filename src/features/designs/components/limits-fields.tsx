import type { DesignKind } from "@shared/schemas/designs";
import type { LimitFields } from "../lib/form-values";
import { FieldGroup, NumberField } from "./form-controls";

const LIMITS: ReadonlyArray<{
  key: keyof LimitFields;
  label: string;
  kinds: readonly DesignKind[];
  hint: string;
}> = [
  { key: "pslDbMax", label: "PSL at most", kinds: ["waveform"], hint: "e.g. −35" },
  { key: "islrDbMax", label: "ISLR at most", kinds: ["waveform"], hint: "e.g. −25" },
  { key: "mismatchLossDbMax", label: "Mismatch loss at most", kinds: ["waveform"], hint: "e.g. 1.5" },
  {
    key: "peakLossDbMax",
    label: "Peak loss at most",
    kinds: ["waveform", "filter"],
    hint: "fixed vs float, e.g. 0.1",
  },
  {
    key: "coefficientSqnrDbMin",
    label: "Coefficient SQNR at least",
    kinds: ["waveform", "filter"],
    hint: "e.g. 70",
  },
  {
    key: "stopbandAttenuationDbMin",
    label: "Stopband attenuation at least",
    kinds: ["filter"],
    hint: "e.g. 60",
  },
  {
    key: "passbandRippleDbMax",
    label: "Passband ripple at most",
    kinds: ["filter"],
    hint: "peak to peak, e.g. 0.1",
  },
];

/** The acceptance limits that apply to this kind of design; an empty box is not checked. */
export function LimitsFields({ kind }: { kind: DesignKind }) {
  return (
    <FieldGroup
      legend="Acceptance limits"
      columns={4}
      note="Leave a box empty to not check that figure. QA judges the report against these."
    >
      {LIMITS.filter((l) => l.kinds.includes(kind)).map((l) => (
        <NumberField key={l.key} name={`limits.${l.key}`} label={l.label} unit="dB" hint={l.hint} />
      ))}
    </FieldGroup>
  );
}
