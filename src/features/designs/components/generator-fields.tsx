import { useFormContext, useWatch } from "react-hook-form";
import { BARKER_CODES } from "@shared/dsp/phase-codes";
import type { DesignFormValues } from "../lib/form-values";
import { FieldGroup, NumberField, RadioGroup, SelectField } from "./form-controls";
import { WindowFields } from "./window-fields";

function LfmFields() {
  const { control } = useFormContext<DesignFormValues>();
  const output = useWatch({ control, name: "lfm.output" });
  return (
    <FieldGroup legend="Linear FM chirp">
      <NumberField name="lfm.bandwidthMHz" label="Bandwidth B" unit="MHz" />
      <NumberField name="lfm.pulseWidthUs" label="Pulse width T" unit="µs" />
      <NumberField name="lfm.sampleRateMHz" label="Sample rate fs" unit="MHz" />
      <RadioGroup
        name="lfm.direction"
        legend="Sweep"
        options={[
          ["up", "Up (−B/2 → +B/2)"],
          ["down", "Down"],
        ]}
      />
      <RadioGroup
        name="lfm.output"
        legend="Output"
        options={[
          ["complex", "Complex baseband"],
          ["real", "Real at an IF"],
        ]}
      />
      {output === "real" && (
        <NumberField
          name="lfm.intermediateFrequencyMHz"
          label="Intermediate frequency"
          unit="MHz"
          hint="≥ B/2; fs ≥ 2(IF + B/2)"
        />
      )}
    </FieldGroup>
  );
}

function NlfmFields() {
  return (
    <FieldGroup
      legend="Nonlinear FM (stationary phase)"
      note="The instantaneous frequency is shaped so the spectrum follows the chosen window."
    >
      <NumberField name="nlfm.bandwidthMHz" label="Bandwidth B" unit="MHz" />
      <NumberField name="nlfm.pulseWidthUs" label="Pulse width T" unit="µs" />
      <NumberField name="nlfm.sampleRateMHz" label="Sample rate fs" unit="MHz" />
      <WindowFields path="nlfm.window" label="Spectral window" />
    </FieldGroup>
  );
}

const CODES = [
  ["barker", "Barker"],
  ["frank", "Frank"],
  ["p1", "P1"],
  ["p2", "P2"],
  ["p3", "P3"],
  ["p4", "P4"],
] as const;

function PhaseCodeFields() {
  const { control } = useFormContext<DesignFormValues>();
  const [code, basis] = useWatch({ control, name: ["phaseCode.code", "phaseCode.rateBasis"] });
  return (
    <FieldGroup legend="Phase code">
      <SelectField name="phaseCode.code" label="Code" options={CODES} />
      {code === "barker" && (
        <SelectField
          name="phaseCode.barkerLength"
          label="Barker length"
          numeric
          options={Object.keys(BARKER_CODES).map((n) => [Number(n), `${n} chips`] as const)}
        />
      )}
      {(code === "frank" || code === "p1" || code === "p2") && (
        <NumberField
          name="phaseCode.order"
          label="Order M"
          step="1"
          hint={`M² chips${code === "p2" ? "; M even" : ""}`}
        />
      )}
      {(code === "p3" || code === "p4") && (
        <NumberField name="phaseCode.length" label="Length" unit="chips" step="1" />
      )}
      <NumberField name="phaseCode.samplesPerChip" label="Samples per chip" step="1" />
      <RadioGroup
        name="phaseCode.rateBasis"
        legend="Rate given as"
        options={[
          ["chip", "Chip rate"],
          ["sample", "Sample rate"],
        ]}
      />
      <NumberField
        name="phaseCode.rateMHz"
        label={basis === "chip" ? "Chip rate" : "Sample rate fs"}
        unit="MHz"
      />
    </FieldGroup>
  );
}

/** The waveform generator's parameters (LFM, NLFM or phase code). */
export function WaveformGeneratorFields() {
  const { control } = useFormContext<DesignFormValues>();
  const generator = useWatch({ control, name: "generator" });
  return (
    <div className="flex flex-col gap-3">
      <RadioGroup
        name="generator"
        legend="Generator"
        options={[
          ["lfm", "Linear FM"],
          ["nlfm", "Nonlinear FM"],
          ["phase-code", "Phase code"],
        ]}
      />
      {generator === "lfm" ? <LfmFields /> : generator === "nlfm" ? <NlfmFields /> : <PhaseCodeFields />}
    </div>
  );
}

/** Windowed-sinc FIR design: band, rates, transition, attenuation, and optionally a window and tap count. */
export function FirDesignFields() {
  const { control, register } = useFormContext<DesignFormValues>();
  const [band, custom] = useWatch({ control, name: ["fir.band", "fir.customWindow"] });
  return (
    <FieldGroup
      legend="FIR (windowed sinc)"
      note="Cutoffs are the centres of the transition bands (≈ −6 dB)."
    >
      <RadioGroup
        name="fir.band"
        legend="Band"
        options={[
          ["lowpass", "Low-pass"],
          ["bandpass", "Band-pass"],
        ]}
      />
      <NumberField name="fir.sampleRateMHz" label="Sample rate fs" unit="MHz" />
      {band === "lowpass" ? (
        <NumberField name="fir.cutoffMHz" label="Cutoff" unit="MHz" />
      ) : (
        <>
          <NumberField name="fir.lowCutoffMHz" label="Low cutoff" unit="MHz" />
          <NumberField name="fir.highCutoffMHz" label="High cutoff" unit="MHz" />
        </>
      )}
      <NumberField name="fir.transitionMHz" label="Transition width" unit="MHz" />
      <NumberField name="fir.stopbandAttenuationDb" label="Stopband attenuation" unit="dB" hint="10–200" />
      <label className="mt-5 flex items-center gap-2 text-sm text-ink-800">
        <input type="checkbox" className="accent-signal-700" {...register("fir.customWindow")} />
        Choose the window (default: Kaiser, β from the attenuation)
      </label>
      {custom && <WindowFields path="fir.window" label="Window" />}
      <NumberField name="fir.taps" label="Taps" step="1" hint="empty: from the order formula" />
    </FieldGroup>
  );
}
