// The small pure pieces behind the four journeys: strict number boxes, friendly messages, generator refusals
// placed at their field, the verdict of a report without limits, "use this W", and ASCII spellings of µ.
import { describe, expect, it } from "vitest";
import { verdictOf, VERDICT_WORDS } from "@shared/report-words";
import { cIdent, transliterate, vhdlIdent } from "@shared/exports/identifiers";
import { asciiText } from "@shared/exports/words";
import { RevisionContentSchema } from "@shared/schemas/designs";
import { defaultFormValues } from "@/features/designs/lib/form-values";
import { fieldMessages } from "@/features/designs/lib/issues";
import { withWordLength } from "@/features/analysis/components/use-recommended-w";
import { friendlyMessage, generatorMessage } from "@/lib/friendly-message";
import { formatElapsed } from "@/lib/format";
import { analyze } from "@shared/dsp/analysis";
import { gainText, wordText } from "@shared/report-format";
import { renderReportHtml } from "../../../server/reports/render-html";
import { parseNumberText } from "@/lib/parse-number";

describe("number boxes read strictly", () => {
  it("reads numbers, an empty box as NaN, and keeps anything else as the text typed", () => {
    expect(parseNumberText("50")).toBe(50);
    expect(parseNumberText(" -3.5 ")).toBe(-3.5);
    expect(parseNumberText("1e-6")).toBe(1e-6);
    expect(parseNumberText("\u221230")).toBe(-30);
    expect(parseNumberText(".5")).toBe(0.5);
    expect(parseNumberText("")).toBeNaN();
    // The browser's number box reads these as 1 and 50 without a word: here they stay text and are refused.
    expect(parseNumberText("1O")).toBe("1O");
    expect(parseNumberText("50 us")).toBe("50 us");
    expect(parseNumberText("1,5")).toBe("1,5");
    expect(parseNumberText("0x10")).toBe("0x10");
  });
});

describe("messages in the form's words", () => {
  it("rewrites zod's stock wording and the schema's SI units", () => {
    expect(friendlyMessage({ message: "Too big: expected number to be <=32" })).toBe("at most 32");
    expect(friendlyMessage({ message: "Too small: expected number to be >=2" })).toBe("at least 2");
    expect(friendlyMessage({ message: "Too small: expected number to be >0" })).toBe("must be more than 0");
    expect(friendlyMessage({ message: "must be > 0 s" })).toBe("must be > 0");
    expect(friendlyMessage({ message: "must be > 0 Hz" })).toBe("must be > 0");
    expect(friendlyMessage({ message: "Invalid input: expected number, received NaN" })).toBe(
      "enter a number",
    );
    expect(friendlyMessage({ message: "Invalid input: expected number, received string" })).toMatch(
      /^not a number/,
    );
  });

  it("names generator parameters as the labels do, in MHz", () => {
    expect(
      generatorMessage("sampleRateHz (5000000) must be ≥ bandwidthHz (10000000) for complex output"),
    ).toBe("fs (5 MHz) must be ≥ B (10 MHz) for complex output");
  });

  it("puts a generator refusal at content.tx at the field its message names (not the invisible group)", () => {
    const v = defaultFormValues();
    const messages = fieldMessages(v, [
      {
        path: ["content", "tx"],
        message: "sampleRateHz (5000000) must be ≥ bandwidthHz (10000000) for complex output",
      },
    ]);
    expect(messages).toEqual({ "lfm.sampleRateMHz": "fs (5 MHz) must be ≥ B (10 MHz) for complex output" });
    // A message naming no parameter stays at the group, which the page sends to its general alert.
    expect(fieldMessages(v, [{ path: ["content", "tx"], message: "could not generate" }])).toEqual({
      lfm: "could not generate",
    });
  });
});

describe("verdict", () => {
  it("is 'not judged' without limits, never a pass", () => {
    expect(verdictOf({ limits: [] })).toBe("not-judged");
    expect(verdictOf({ limits: [{ pass: true }] })).toBe("pass");
    expect(verdictOf({ limits: [{ pass: true }, { pass: false }] })).toBe("fail");
    expect(VERDICT_WORDS["not-judged"]).toMatch(/^Not judged/);
  });
});

describe("use this W", () => {
  it("sets the swept tables' W and keeps their integer bits W − F", () => {
    const content = RevisionContentSchema.parse({
      kind: "waveform",
      tx: { kind: "lfm", bandwidthHz: 10e6, pulseWidthS: 5e-6, sampleRateHz: 12.5e6 },
      fixedPoint: { tx: { wordLength: 16, fractionLength: 15 }, rx: { wordLength: 16, fractionLength: 14 } },
    });
    const next = withWordLength(content, ["rx"], 11);
    expect(next.fixedPoint).toMatchObject({
      tx: { wordLength: 16, fractionLength: 15 },
      rx: { wordLength: 11, fractionLength: 9 },
    });
  });
});

describe("ASCII spellings", () => {
  it("writes µ as u in identifiers and comments (50 µs is not 50 s)", () => {
    expect(transliterate("50 µs, 50 μs")).toBe("50 us, 50 us");
    expect(cIdent("LFM 10 MHz / 50 µs rx")).toBe("lfm_10_mhz_50_us_rx");
    expect(vhdlIdent("50 µs")).toBe("t_50_us");
    expect(asciiText("pulse 50 µs, 2 kΩ")).toBe("pulse 50 us, 2 kohm");
  });
});

describe("elapsed time", () => {
  it("never prints a short job as 0.0 s", () => {
    expect(formatElapsed(42)).toBe("42 ms");
    expect(formatElapsed(350)).toBe("350 ms");
    expect(formatElapsed(1234)).toBe("1.23 s");
    expect(formatElapsed(42_000)).toBe("42 s");
  });
});

describe("one format for the report page and the printed report", () => {
  it("writes the word and the gain the same way in both", () => {
    expect(wordText({ wordLength: 16, fractionLength: 15, signed: true })).toBe(
      "sQ1.15 (signed, W = 16, F = 15)",
    );
    // 32767/32768 to six significant figures is 0.999969 (not rounded up to 1 in one place and not the other).
    expect(gainText(32767 / 32768)).toBe("0.999969");
    expect(gainText(1)).toBe("1");
    const report = analyze({
      kind: "waveform",
      tx: { kind: "phase-code", code: { kind: "barker", length: 13 }, sampleRateHz: 1e6 },
      fixedPoint: { tx: { wordLength: 12, fractionLength: 11 }, rx: { wordLength: 10, fractionLength: 9 } },
      interpolation: 1,
    });
    const html = renderReportHtml(
      {
        project: "p",
        design: "d",
        revision: "r1",
        contentHash: "0".repeat(64),
        generatedAt: "2026-12-04T00:00:00.000Z",
        softwareVersion: "0.1.0",
      },
      report,
    );
    for (const t of report.tables) {
      expect(html).toContain(wordText(t.fixedPoint));
      expect(html).toContain(`<td class="num">${gainText(t.gain)}</td>`);
    }
    // No limits: the printed report says "not judged", as the page does.
    expect(html).toContain("Not judged");
  });
});
