/** README.txt of a bundle: plain text (ASCII punctuation where it costs nothing), what is inside and how to read it. */
import type { BundleManifest } from "./manifest";

const wrap = (text: string, width = 76): string => {
  const words = text.split(/\s+/).filter(Boolean);
  const lines: string[] = [];
  let line = "";
  for (const w of words) {
    if (line && line.length + 1 + w.length > width) {
      lines.push(line);
      line = w;
    } else line = line ? `${line} ${w}` : w;
  }
  if (line) lines.push(line);
  return lines.join("\n");
};

/** Renders README.txt from the manifest (its file list is the manifest's, so the two always agree). */
export function renderReadme(m: BundleManifest): string {
  const out: string[] = [];
  const title = `${m.project.slug}/${m.design.name} ${m.version}`;
  out.push(title, "=".repeat(title.length), "");
  out.push(`Project:       ${m.project.name} (${m.project.slug})`);
  out.push(`Design:        ${m.design.name} (${m.design.kind})`);
  out.push(`Version:       ${m.version}, from revision r${m.revision.number}`);
  out.push(`Content hash:  ${m.contentHash}`);
  out.push(`Released:      ${m.released.at} by ${m.released.by.displayName}`);
  for (const a of m.approvals) out.push(`Approved:      ${a.at} by ${a.reviewer.displayName}`);
  out.push("");
  if (m.transmitCaution) out.push("CAUTION", "-------", wrap(m.transmitCaution), "");
  out.push("Release notes", "-------------", m.notes.trim(), "");
  out.push("Conventions", "-----------");
  out.push(wrap(`Tap order: ${m.conventions.tapOrder}, i.e. h[0] multiplies the newest input sample.`));
  out.push(wrap(m.conventions.codes));
  out.push(wrap(m.conventions.complex));
  out.push("");
  out.push("Tables", "------");
  for (const t of m.tables) {
    const s = t.fixedPoint;
    out.push(
      wrap(
        `${t.role}: ${t.length} ${t.complex ? "complex" : "real"} taps at ${t.sampleRateHz} Hz; ` +
          `W=${s.wordLength} F=${s.fractionLength} ${s.signed ? "signed" : "unsigned"}, scaling ${s.scaling}, ` +
          `rounding ${s.rounding}, overflow ${s.overflow} (${t.overflowCount} overflowed); gain ${t.gain}; ` +
          `codes ${t.codeRange.min}..${t.codeRange.max}; source: ${t.provenance.method}` +
          (t.provenance.fileName ? ` ${t.provenance.fileName} (SHA-256 ${t.provenance.sha256})` : "") +
          ".",
      ),
    );
    for (const e of t.exports) out.push(`  ${e.path}`);
  }
  out.push("");
  out.push("Datapath and vector sets", "------------------------");
  const g = m.golden;
  const dp = m.tables.find((t) => t.role === g.filterTable)?.datapath;
  if (dp)
    out.push(
      wrap(
        `${g.filterTable}: ${dp.inputBits}-bit signed input, ${dp.accumulatorBits}-bit accumulator ` +
          `(${dp.accumulatorBitsSet ? "set by the author" : "the worst-case rule"}; ${dp.accumulatorRequiredBits} bits hold ` +
          `the largest |accumulator| ${dp.accumulatorBound}), output ${dp.outputBits} bits after a right shift of ` +
          `${dp.outputShift} (${dp.outputShiftSet ? "set by the author" : "accumulator bits minus output bits"}), ` +
          `rounding ${dp.outputRounding}, overflow ${dp.outputOverflow}.`,
      ),
      "",
    );
  for (const set of g.sets) {
    out.push(
      `  ${set.name}: ${set.stimulus.text} (${set.stimulus.length} samples) -> ${set.expected.text} ` +
        `(${set.expected.length} samples); largest |acc| ${set.maxAbsAccumulator} of ${set.accumulatorBound}`,
    );
    out.push(wrap(set.description, 72).replace(/^/gm, "    "));
  }
  out.push("");
  out.push(
    wrap(
      `Text files: one sample a line, "I Q" signed decimal integers; lines starting with # are comments. ` +
        `Hex files: the same as two's-complement words for $readmemh (I0 Q0 I1 Q1 ...). ${g.summary} states ` +
        `the datapath, the scenario's parameters and every set. Feed each set from a cleared delay line, ` +
        `then Nh - 1 zeros: output n belongs to input n.`,
    ),
  );
  out.push(
    wrap(
      "$readmemh fills each word zero-extended: F971 read into an 18-bit signed variable becomes 63857, " +
        "not -1679. Read into a memory of exactly the word width W and sign-extend explicitly where you widen it:",
    ),
    "    reg [W-1:0] mem [0:2*N-1];",
    "    wire signed [A-1:0] v = {{(A-W){mem[k][W-1]}}, mem[k]};",
    "",
  );
  out.push("HDL", "---");
  out.push(
    `  ${m.hdl.verilog.testbench}   self-checking testbench, Verilog-2005`,
    `  ${m.hdl.verilog.reference}  reference FIR of the ${g.filterTable} table, Verilog-2005`,
    `  ${m.hdl.vhdl.testbench}  self-checking testbench, VHDL-2008`,
    `  ${m.hdl.vhdl.reference} reference FIR, VHDL-2008`,
    wrap(
      "Run from this folder: iverilog -g2005 -o tw_tb.vvp hdl/tw_tb.v hdl/tw_fir.v && vvp tw_tb.vvp, or " +
        "ghdl -a --std=08 hdl/tw_fir.vhd hdl/tw_tb.vhd && ghdl -e --std=08 tw_tb && ghdl -r --std=08 tw_tb. " +
        "Put your design in place of tw_fir (ports: clk, rst synchronous active high, in_valid, in_i, in_q, " +
        "out_valid, out_i, out_q). Each set prints PASS or FAIL with the first mismatch; the captured output " +
        "goes to sim-<set>.txt, ready to upload as the set's simulation output.",
    ),
    "",
  );
  out.push("Other files", "-----------");
  out.push(
    `  manifest.json         everything above, machine-readable (schema ${m.schema} ${m.schemaVersion})`,
  );
  out.push("  manifest.schema.json  JSON Schema (draft 2020-12) of manifest.json");
  out.push(`  ${m.report.html.padEnd(20)}  the fixed-point analysis report (prints well)`);
  out.push(`  ${m.report.json.padEnd(20)}  the same report as JSON`);
  out.push("  SHA256SUMS            checksums of every file; check with: sha256sum -c SHA256SUMS");
  out.push("");
  return `${out.join("\n")}\n`;
}
