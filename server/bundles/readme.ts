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
  out.push("Golden vectors", "--------------");
  const g = m.golden;
  out.push(
    wrap(
      `${g.stimulus.text} (and .hex): ${g.stimulus.length} stimulus samples, ${g.stimulus.bits}-bit signed I/Q, ` +
        `seed ${g.stimulus.seed}. ${g.expected.text} (and .hex): ${g.expected.length} outputs of the bit-true ` +
        `filter with the ${g.filterTable} table, ${g.expected.bits}-bit signed: the exact accumulator shifted ` +
        `right by ${g.outputShift} with rounding ${g.rounding}, then ${g.overflow} (${g.overflowCount} overflowed). ` +
        `${g.scenario} states everything needed to rebuild them.`,
    ),
  );
  out.push("");
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
