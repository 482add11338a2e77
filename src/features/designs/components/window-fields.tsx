import { useFormContext, useWatch } from "react-hook-form";
import { WINDOW_KINDS } from "@shared/dsp/windows";
import type { DesignFormValues } from "../lib/form-values";
import { NumberField, SelectField } from "./form-controls";

type WindowPath = "rxWindow" | "nlfm.window" | "fir.window";

/** Display names of the window kinds, in WINDOW_KINDS order. */
export const WINDOW_LABELS: Record<(typeof WINDOW_KINDS)[number], string> = {
  rectangular: "Rectangular",
  hann: "Hann",
  hamming: "Hamming",
  blackman: "Blackman",
  "blackman-harris": "Blackman-Harris (4-term)",
  kaiser: "Kaiser (β)",
  chebyshev: "Dolph-Chebyshev (attenuation)",
  taylor: "Taylor (n̄, sidelobe level)",
};

/** A window choice and the parameters of the chosen kind. */
export function WindowFields({ path, label }: { path: WindowPath; label: string }) {
  const { control } = useFormContext<DesignFormValues>();
  const kind = useWatch({ control, name: `${path}.kind` });
  return (
    <>
      <SelectField
        name={`${path}.kind`}
        label={label}
        options={WINDOW_KINDS.map((k) => [k, WINDOW_LABELS[k]] as const)}
      />
      {kind === "kaiser" && (
        <NumberField name={`${path}.beta`} label="Kaiser β" hint="0–100; β = πα in Harris's notation" />
      )}
      {kind === "chebyshev" && (
        <NumberField
          name={`${path}.attenuationDb`}
          label="Sidelobe attenuation"
          unit="dB"
          hint="13–300 dB below the peak"
        />
      )}
      {kind === "taylor" && (
        <>
          <NumberField name={`${path}.nbar`} label="Taylor n̄" step="1" hint="near-in sidelobes held level" />
          <NumberField
            name={`${path}.sidelobeDb`}
            label="Sidelobe level"
            unit="dB"
            hint="negative, e.g. −35"
          />
        </>
      )}
    </>
  );
}
