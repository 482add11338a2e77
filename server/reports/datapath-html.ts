/** The report's datapath section (shared/dsp/datapath.ts figures), for the printed HTML report. */
import type { AnalysisReport } from "../../shared/dsp/analysis";
import { escapeHtml as e } from "./escape";
import { db, plain } from "./format";

/** "<h2>Datapath</h2>…", or nothing for reports made before the datapath figures existed. */
export function datapathSection(r: AnalysisReport): string {
  const d = r.datapath;
  if (!d) return "";
  const table = r.kind === "waveform" ? "rx" : "fir";
  const set = (flag: boolean, derived: string) => (flag ? "set by the author" : derived);
  const rows: [string, string][] = [
    ["Input (ADC)", `${d.inputBits} bits, signed`],
    ["Coefficients", `${d.coefficientBits} bits, signed`],
    [
      "Accumulator",
      `${d.accumulatorBits} bits (${set(d.accumulatorBitsSet, "the worst-case rule")}); rule ${d.accumulatorRuleBits} bits, ` +
        `the largest |accumulator| ${d.accumulatorBound} needs ${d.accumulatorRequiredBits}`,
    ],
    ["Output", `${d.outputBits} bits, signed`],
    ["Output shift", `${d.outputShift} (${set(d.outputShiftSet, "accumulator bits − output bits")})`],
    ["Output rounding, overflow", `${d.outputRounding}, ${d.outputOverflow}`],
  ];
  const narrow = d.accumulatorBits < d.accumulatorRequiredBits;
  const figures: [string, string][] = [
    [
      "Output SQNR (bit-true vs float filter, scenario)",
      d.outputSqnrDb === null ? "exact" : db(d.outputSqnrDb),
    ],
    [
      "Largest |accumulator| on the scenario",
      `${d.scenarioMaxAbsAccumulator} (${d.scenarioAccumulatorBitsReached} bits of ${d.accumulatorBits})`,
    ],
    [
      "Worst-case |accumulator| (sign-matched full scale)",
      `${d.worstCase.maxAbsAccumulator} (${d.worstCase.accumulatorBitsReached} bits of ${d.accumulatorBits})`,
    ],
    ["Output overflows on the scenario", plain(d.scenarioOverflowCount)],
    ["Accumulator overflows on the scenario", plain(d.scenarioAccumulatorOverflowCount)],
    [
      "At the worst case: accumulator wraps, outputs overflow (of 4 extremes)",
      `${d.worstCase.accumulatorOverflowCount}, ${d.worstCase.outputOverflowCount}`,
    ],
  ];
  const tr = ([k, v]: [string, string]) =>
    `<tr><th scope="row">${e(k)}</th><td class="num">${e(v)}</td></tr>`;
  return `<h2>Datapath of table ${e(table)}</h2>
<table>${rows.map(tr).join("")}</table>
<table class="metrics"><tbody>${figures.map(tr).join("")}</tbody></table>
${
  narrow
    ? `<p class="banner fail">The accumulator (${e(d.accumulatorBits)} bits) is narrower than the ${e(d.accumulatorRequiredBits)} bits the worst case needs: full-scale inputs wrap it (a wrap-around can put full-scale glitches into the output).</p>`
    : ""
}
<p>SQNR = 10·log10(Σ|y_f|² / Σ|y_b·2^shift/(g·2^F) − y_f|²) over the ${e(plain(d.scenarioLength))}-sample scenario (noise seed 1),
y_f the float taps on the same integer input, y_b the bit-true output codes. The bundle's vector sets prove the same datapath.</p>`;
}
