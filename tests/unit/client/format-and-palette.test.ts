// Pure checks of the client's number formatting and of the palette's contrast (no browser needed).
import { describe, expect, it } from "vitest";
import { amplitudeToDb, formatCount, formatDb, formatDuration, formatEng, powerToDb } from "@/lib/format";
import config from "../../../tailwind.config";

describe("formatDb", () => {
  it("shows Barker peak sidelobe levels as Richards prints them (Richards, Fundamentals of Radar Signal Processing, 2nd ed., 2014, Table 4.1)", () => {
    // PSL = 20·log10(1/N) for a Barker code of length N.
    const table: Array<[number, string]> = [
      [2, "-6.02 dB"],
      [3, "-9.54 dB"],
      [4, "-12.04 dB"],
      [5, "-13.98 dB"],
      [7, "-16.90 dB"],
      [11, "-20.83 dB"],
      [13, "-22.28 dB"],
    ];
    for (const [n, text] of table) expect(formatDb(amplitudeToDb(1 / n))).toBe(text);
  });

  it("power ratios use 10·log10: Barker-13 ISL 10·log10(12/169) = -11.49 dB (derived, REFERENCES.md)", () => {
    expect(formatDb(powerToDb(12 / 169))).toBe("-11.49 dB");
  });

  it("never prints a negative zero, and names infinities", () => {
    expect(formatDb(-0.001)).toBe("0.00 dB");
    expect(formatDb(-Infinity)).toBe("-inf dB");
    expect(formatDb(Number.NaN)).toBe("—");
  });
});

describe("formatEng: SI prefixes (BIPM, The International System of Units, 9th ed., 2019, Table 7)", () => {
  it("keeps three significant figures with the mantissa in [1, 1000)", () => {
    expect(formatEng(10e6, "Hz")).toBe("10.0 MHz");
    expect(formatEng(50e-6, "s")).toBe("50.0 µs");
    expect(formatEng(12_500, "S")).toBe("12.5 kS");
    expect(formatEng(1, "V")).toBe("1.00 V");
    expect(formatEng(-2.5e-3, "s")).toBe("-2.50 ms");
    expect(formatEng(3.3e-12, "F")).toBe("3.30 pF");
    expect(formatEng(0, "Hz")).toBe("0 Hz");
  });

  it("moves to the next prefix when rounding reaches 1000", () => {
    expect(formatEng(999_960, "Hz")).toBe("1.00 MHz");
    expect(formatEng(999.4e3, "Hz")).toBe("999 kHz");
  });

  it("prints LFM resolution figures: -3 dB width 0.886/B and range resolution c/(2B) at B = 10 MHz (Richards 2014, ch. 4)", () => {
    expect(formatEng(0.886 / 10e6, "s")).toBe("88.6 ns");
    // c = 299 792 458 m/s exactly (SI definition of the metre).
    expect(formatEng(299_792_458 / (2 * 10e6), "m")).toBe("15.0 m");
  });
});

describe("counts and durations", () => {
  it("groups thousands with a thin space and splits durations", () => {
    expect(formatCount(1_234_567)).toBe("1\u2009234\u2009567");
    expect(formatCount(999)).toBe("999");
    expect(formatDuration(42)).toBe("42 s");
    expect(formatDuration(7 * 60 + 5)).toBe("7 min 05 s");
    expect(formatDuration(2 * 3600 + 5 * 60)).toBe("2 h 05 min");
    expect(formatDuration(3 * 86400 + 4 * 3600 + 59)).toBe("3 d 4 h");
  });
});

// WCAG 2.1 (W3C Recommendation, 2018), definitions "relative luminance" and "contrast ratio";
// success criterion 1.4.3 asks 4.5:1 for normal text.
function channel(c: number): number {
  const s = c / 255;
  return s <= 0.03928 ? s / 12.92 : ((s + 0.055) / 1.055) ** 2.4;
}
function luminance(hex: string): number {
  const m = /^#([0-9a-f]{2})([0-9a-f]{2})([0-9a-f]{2})$/i.exec(hex);
  if (!m) throw new Error(`not a #rrggbb colour: ${hex}`);
  const [r, g, b] = [m[1], m[2], m[3]].map((h) => channel(parseInt(h!, 16)));
  return 0.2126 * r! + 0.7152 * g! + 0.0722 * b!;
}
function contrast(a: string, b: string): number {
  const [hi, lo] = [luminance(a), luminance(b)].sort((x, y) => y - x);
  return (hi! + 0.05) / (lo! + 0.05);
}

describe("palette contrast (WCAG 2.1 SC 1.4.3, AA)", () => {
  const colors = config.theme.extend.colors as Record<string, Record<string | number, string>>;
  const tok = (name: string): string => {
    if (name === "white") return "#ffffff";
    const [family, shade] = name.split("-");
    const v = colors[family!]?.[shade!];
    if (!v) throw new Error(`unknown token ${name}`);
    return v;
  };

  it("the formula gives 21:1 for black on white and 1:1 for equal colours", () => {
    expect(contrast("#000000", "#ffffff")).toBeCloseTo(21, 10);
    expect(contrast("#18222e", "#18222e")).toBe(1);
  });

  // [text, surface, where it is used]
  const PAIRS: Array<[string, string, string]> = [
    ["ink-900", "paper-100", "body text on the page"],
    ["ink-900", "paper-50", "text in tables and panels"],
    ["ink-600", "paper-50", "muted text in panels"],
    ["ink-600", "paper-100", "page subtitles"],
    ["ink-700", "paper-100", "table headers"],
    ["ink-500", "white", "input placeholders"],
    ["signal-800", "paper-50", "links in tables"],
    ["white", "signal-700", "primary button"],
    ["white", "signal-800", "primary button, hover"],
    ["white", "fail-600", "danger button"],
    ["ink-200", "ink-900", "navigation entries"],
    ["white", "ink-800", "active navigation entry"],
    ["ink-300", "ink-900", "navigation headings and hints"],
    ["ink-300", "ink-800", "user menu roles on hover"],
    ["ink-950", "copper-300", "avatar initials"],
    ["ink-800", "ink-100", "neutral badge"],
    ["signal-800", "signal-50", "author badge"],
    ["copper-800", "copper-50", "admin badge"],
    ["pass-700", "pass-50", "pass badge"],
    ["warn-800", "warn-50", "warn badge and temporary-password banner"],
    ["fail-700", "fail-50", "fail badge and error text"],
    ["fail-800", "fail-50", "error heading"],
    ["fail-700", "paper-50", "field errors"],
    ["pass-800", "pass-50", "success toast"],
    ["ink-50", "ink-900", "neutral toast"],
  ];
  for (const [fg, bg, where] of PAIRS) {
    it(`${fg} on ${bg} (${where}) reaches 4.5:1`, () => {
      expect(contrast(tok(fg), tok(bg))).toBeGreaterThanOrEqual(4.5);
    });
  }
});
