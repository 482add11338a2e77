import type { AnalysisReport } from "@shared/dsp/analysis";
import { Table, Td, Th, Tr } from "@/components/ui/table";
import { formatDb } from "@/lib/format";

/** The receive/FIR datapath and its figures (shared/dsp/datapath.ts); nothing for older reports. */
export function DatapathTable({ report }: { report: AnalysisReport }) {
  const d = report.datapath;
  if (!d) return <p className="text-sm text-ink-700">This report predates the datapath figures.</p>;
  const narrow = d.accumulatorBits < d.accumulatorRequiredBits;
  const rows: [string, string, boolean?][] = [
    ["Input (ADC)", `${d.inputBits} bits`],
    [
      "Accumulator",
      `${d.accumulatorBits} bits (${d.accumulatorBitsSet ? "set" : "worst-case rule"}; rule ${d.accumulatorRuleBits}, worst case needs ${d.accumulatorRequiredBits})`,
      narrow,
    ],
    ["Output", `${d.outputBits} bits, shift ${d.outputShift} (${d.outputShiftSet ? "set" : "derived"})`],
    ["Output rounding / overflow", `${d.outputRounding} / ${d.outputOverflow}`],
    [
      "Output SQNR (bit-true vs float, scenario)",
      d.outputSqnrDb === null ? "exact" : formatDb(d.outputSqnrDb),
    ],
    [
      "Largest |accumulator|, scenario",
      `${d.scenarioMaxAbsAccumulator} (${d.scenarioAccumulatorBitsReached} bits)`,
    ],
    [
      "Largest |accumulator|, worst case",
      `${d.worstCase.maxAbsAccumulator} (${d.worstCase.accumulatorBitsReached} bits)`,
      narrow,
    ],
    [
      "Overflows on the scenario (output / accumulator)",
      `${d.scenarioOverflowCount} / ${d.scenarioAccumulatorOverflowCount}`,
      d.scenarioOverflowCount + d.scenarioAccumulatorOverflowCount > 0,
    ],
    [
      "Worst-case extremes that overflow (output / accumulator, of 4)",
      `${d.worstCase.outputOverflowCount} / ${d.worstCase.accumulatorOverflowCount}`,
      d.worstCase.accumulatorOverflowCount > 0,
    ],
  ];
  return (
    <Table label="Datapath">
      <thead>
        <tr>
          <Th>Datapath of table {report.kind === "waveform" ? "rx" : "fir"}</Th>
          <Th numeric>Value</Th>
        </tr>
      </thead>
      <tbody>
        {rows.map(([k, v, bad]) => (
          <Tr key={k}>
            <Td>{k}</Td>
            <Td numeric className={bad ? "text-fail-700" : undefined}>
              {v}
            </Td>
          </Tr>
        ))}
      </tbody>
    </Table>
  );
}
