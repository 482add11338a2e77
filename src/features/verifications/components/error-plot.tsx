import type { Verification } from "@shared/schemas/verifications";
import { SignalPlot } from "@/components/plot";

/** |got − expected| in output LSBs along the expected output (the largest of I and Q per point). */
export function RunErrorPlot({ run }: { run: Verification }) {
  const { bucket, maxAbsLsb } = run.errorEnvelope;
  const x = Float64Array.from(maxAbsLsb, (_, i) => i * bucket);
  const y = Float64Array.from(maxAbsLsb);
  const top = Math.max(1, run.maxAbsErrorLsb);
  return (
    <SignalPlot
      title={`Error of run ${run.id} (${run.vectorSet})`}
      x={{ label: "Expected sample", unit: "", values: x }}
      series={[
        {
          label: bucket > 1 ? `|error|, largest per ${bucket} samples` : "|error|",
          unit: "LSB",
          tone: "copper",
          values: y,
        },
      ]}
      yAxis={{ label: "|error|", unit: "LSB", min: 0, max: top * 1.1 }}
      fileName={`verification-${run.id}-error`}
      height={180}
    />
  );
}
