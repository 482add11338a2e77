import { describe, expect, it } from "vitest";
import { buildExportContext } from "../../../shared/exports/context";
import {
  MAX_EXPORT_FILE_BYTES,
  MAX_RELEASE_TABLE_LENGTH,
  oversizedFiles,
  unreleasableTable,
  WORST_BYTES_PER_TAP,
  WORST_HEADER_BYTES,
} from "../../../server/bundles/limits";
import { builtinTemplates } from "../../../server/exports/builtins";
import { renderExport } from "../../../server/exports/render";

// Worst cases for line width: 32-bit codes at both extremes, the longest names, floats with 17 digits and
// an exponent, and the fraction lengths at both ends of the schema (−64 and 96: the longest exact decimals).
function worstContext(n: number, fractionLength: number) {
  const re = Float64Array.from({ length: n }, (_, k) => (k % 2 ? -(2 ** 31) : 2 ** 31 - 1));
  const im = Float64Array.from({ length: n }, () => -(2 ** 31));
  const ref = Float64Array.from({ length: n }, (_, k) => -1.234567890123456e-300 * (k + 1));
  return buildExportContext({
    project: { name: "P".repeat(120), slug: "p".repeat(60) },
    design: { name: "D".repeat(120), kind: "waveform" },
    version: "999.999.999",
    revision: 99_999,
    contentHash: "a".repeat(64),
    role: "rx",
    sampleRateHz: 1.2345678901234567e9,
    complex: true,
    spec: {
      wordLength: 32,
      fractionLength,
      signed: true,
      scaling: "full-scale",
      rounding: "nearest-even",
      overflow: "saturate",
    },
    gain: 1.2345678901234567,
    codes: { re, im },
    reference: { re: ref, im: ref },
  });
}

describe("release size limits (server/bundles/limits.ts)", () => {
  it("the longest releasable table at the worst bytes per tap fits one exported file", () => {
    expect(WORST_HEADER_BYTES + MAX_RELEASE_TABLE_LENGTH * WORST_BYTES_PER_TAP).toBeLessThanOrEqual(
      MAX_EXPORT_FILE_BYTES,
    );
  });

  for (const F of [-64, 0, 31, 96])
    it(`every built-in export stays within the per-tap and header bounds (W = 32, F = ${F})`, async () => {
      for (const t of builtinTemplates()) {
        const small = (await renderExport(t, worstContext(64, F))).bytes.byteLength;
        const large = (await renderExport(t, worstContext(192, F))).bytes.byteLength;
        const perTap = (large - small) / 128;
        expect(perTap, `${t.id}: ${perTap} bytes per tap`).toBeLessThanOrEqual(WORST_BYTES_PER_TAP);
        expect(small - 64 * perTap, `${t.id} header`).toBeLessThanOrEqual(WORST_HEADER_BYTES);
      }
    });

  it("names the table and the limits when a draft could never be released", () => {
    expect(unreleasableTable([{ role: "tx", length: 65_536 }])).toBeNull();
    expect(unreleasableTable([{ role: "rx", length: 65_537 }])).toMatch(
      /^The rx table would have 65,537 samples; a release can carry tables of at most 65,536 samples/,
    );
    expect(oversizedFiles([{ path: "tables/rx/x.json", size: MAX_EXPORT_FILE_BYTES + 1 }])).toMatch(
      /tables\/rx\/x\.json would be 100,663,297 bytes; an exported file may have at most 100,663,296/,
    );
  });
});
