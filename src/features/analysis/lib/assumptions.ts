/** The report's assumptions in words (issue 5): what the figures presume, so a reviewer can judge them. */
import type { AnalysisReport } from "@shared/dsp/analysis";
import { formatEng } from "@/lib/format";

/** Sentences stating the assumptions behind the figures of `report`. */
export function assumptions(
  report: Pick<
    AnalysisReport,
    "kind" | "interpolation" | "sampleRateHz" | "doppler" | "definitions" | "tables"
  >,
): string[] {
  const out: string[] = [];
  const fs = formatEng(report.sampleRateHz, "Hz");
  if (report.kind === "waveform") {
    out.push(
      report.interpolation > 1
        ? `The compressed output is measured after interpolating by U = ${report.interpolation} (zero-padding its spectrum), so peaks between samples are not missed.`
        : "The compressed output is measured on the sample grid (U = 1, no interpolation); peaks between samples may be underestimated.",
      "Mismatch (SNR) loss assumes white noise at the receiver input and compares the receive filter with the ideal matched filter.",
      "The mainlobe runs from the peak out to the first local minimum on each side; every other sample is a sidelobe.",
      `The target sits at the matched delay; the sample rate is ${fs}.`,
    );
    out.push(
      report.doppler
        ? "The Doppler cut is taken at the Doppler shift set in the revision; its peak loss is relative to the zero-Doppler peak."
        : "No Doppler shift was set: the Doppler cut is not part of this report.",
    );
  } else {
    out.push(
      `The FIR response is evaluated on a uniform frequency grid at ${fs}; real taps are judged on |f|.`,
    );
  }
  out.push(
    "Fixed-point figures use the quantized tables' represented values divided by their gain (ĥ/g), so a scaling gain does not count as a loss.",
  );
  const acc = report.tables.find((t) => t.accumulator);
  if (acc?.accumulator)
    out.push(
      `Accumulator growth assumes a ${acc.accumulator.inputBits}-bit ADC input and the worst-case sum of |coefficients|.`,
    );
  return out;
}
