// The printable report's pieces: escaping, number formats, tick choice, the SVG plot, and the page itself
// (every string escaped, every figure shown as analyze() computed it). The new plot data of analyze()
// (coefficient error in LSB, transmit spectrum) is checked against independent computations here.
import { describe, expect, it } from "vitest";
import { analyze } from "../../../shared/dsp/analysis";
import { quantize } from "../../../shared/dsp/quantize";
import { linearFm } from "../../../shared/dsp/lfm";
import { escapeHtml } from "../../../server/reports/escape";
import { db, plain, si } from "../../../server/reports/format";
import { METRIC_LABELS, formatMetric } from "../../../server/reports/metrics";
import { renderReportHtml } from "../../../server/reports/render-html";
import { linePlot, niceTicks } from "../../../server/reports/svg-plot";

const header = {
  project: 'Coastwatch <S-band> & "trials"',
  design: "long-pulse chirp 'A'",
  revision: "r2",
  contentHash: "0123456789abcdef".repeat(4),
  generatedAt: "2026-12-02T01:00:00.000Z",
  softwareVersion: "0.1.0",
};

const lfmSpec = {
  kind: "waveform",
  tx: { kind: "lfm", bandwidthHz: 2e6, pulseWidthS: 100e-6, sampleRateHz: 2.5e6 },
  rx: { window: { kind: "taylor", nbar: 5, sidelobeDb: -35 } },
  fixedPoint: { tx: { wordLength: 14, fractionLength: 13 }, rx: { wordLength: 12, fractionLength: 11 } },
  dopplerHz: 5000,
  limits: { pslDbMax: -33, islrDbMax: -22, coefficientSqnrDbMin: 60 },
  sweep: { minBits: 6, maxBits: 14 },
};

describe("formats", () => {
  it("escapes the five HTML specials", () => {
    expect(escapeHtml(`<a href="x">'&'</a>`)).toBe("&lt;a href=&quot;x&quot;&gt;&#39;&amp;&#39;&lt;/a&gt;");
  });
  it("prints dB with two decimals and a true minus; SI with engineering prefixes", () => {
    expect(db(-34.2356)).toBe("\u221234.24 dB");
    expect(db(-0.001)).toBe("0.00 dB");
    expect(db(null)).toBe("\u2014");
    expect(si(2.5e6, "Hz")).toBe("2.5 MHz");
    expect(si(100e-6, "s")).toBe("100 \u00b5s");
    expect(si(-37.474, "m")).toBe("\u221237.474 m");
    expect(plain(1.48530001)).toBe("1.4853");
    expect(formatMetric("coefficientSqnrDb", null)).toBe("exact");
    expect(formatMetric("width3dbSamples", 1.5)).toBe("1.5 samples");
  });
  it("chooses 1-2-5 ticks covering the range", () => {
    expect(niceTicks(-120, 3, 5)).toEqual([-100, -50, 0]);
    expect(niceTicks(-120, 3, 8)).toEqual([-120, -100, -80, -60, -40, -20, 0]);
    expect(niceTicks(6, 18, 6)).toEqual([6, 8, 10, 12, 14, 16, 18]);
  });
});

describe("linePlot", () => {
  it("maps data to the viewBox: the first point at the left edge, the maximum at the top", () => {
    const svg = linePlot({
      title: "t <1>",
      xLabel: "x",
      yLabel: "y",
      series: [{ x: [0, 1, 2], y: [0, 10, 5], label: "a&b", cls: "float" }],
      width: 200,
      height: 100,
    });
    // margins l 58, r 12, t 26, b 40 → inner 130 × 34; y range 0…10.
    expect(svg).toContain('points="58,60 123,26 188,43"');
    expect(svg).toContain("t &lt;1&gt;");
    expect(svg).toContain("a&amp;b");
    expect(svg).not.toMatch(/<script/);
  });
});

describe("analyze() plot data for the report", () => {
  const report = analyze(lfmSpec);

  it("coefficient error in LSB equals (ĥ − g·h)·2^F from the quantizer, within ±0.5 LSB", () => {
    const s = linearFm({ bandwidthHz: 2e6, pulseWidthS: 100e-6, sampleRateHz: 2.5e6 });
    const q = quantize(s, {
      wordLength: 14,
      fractionLength: 13,
      signed: true,
      scaling: "full-scale",
      rounding: "nearest-even",
      overflow: "saturate",
    });
    const t = report.coefficientErrorLsb!.tx!;
    // N = 250 < PLOT_POINTS: every coefficient is kept.
    expect(t.x).toEqual(Array.from({ length: 250 }, (_, i) => i));
    for (let i = 0; i < 250; i++) {
      const e = (q.valueRe[i]! - q.gain * s.re[i]!) * 2 ** 13;
      expect(Math.abs(t.re[i]! - e)).toBeLessThanOrEqual(5e-5); // rounded to 4 decimals
      expect(Math.abs(t.re[i]!)).toBeLessThanOrEqual(0.5);
    }
  });

  it("the transmit spectrum peaks at 0 dB and is centred on 0 Hz; a bin matches a naive DFT", () => {
    const sp = report.plots.spectrum!;
    expect(Math.max(...sp.floatDb)).toBe(0);
    const s = linearFm({ bandwidthHz: 2e6, pulseWidthS: 100e-6, sampleRateHz: 2.5e6 });
    const m = 512; // convolution size for N = 250: the power of two ≥ 2N − 1
    const dft = (k: number) => {
      let re = 0;
      let im = 0;
      for (let n = 0; n < s.re.length; n++) {
        const a = (-2 * Math.PI * k * n) / m;
        re += s.re[n]! * Math.cos(a) - s.im[n]! * Math.sin(a);
        im += s.re[n]! * Math.sin(a) + s.im[n]! * Math.cos(a);
      }
      return re * re + im * im;
    };
    let peak = 0;
    for (let k = 0; k < m; k++) peak = Math.max(peak, dft(k));
    const i0 = sp.x.indexOf(0); // 0 Hz
    expect(i0).toBe(256);
    expect(sp.floatDb[i0]).toBeCloseTo(10 * Math.log10(dft(0) / peak), 3);
    expect(sp.x[0]).toBeCloseTo(-1.25e6, 6);
  });

  it("the Doppler cut peaks at −(peak loss) dB near the range shift", () => {
    const d = report.plots.doppler!;
    const i = d.floatDb.indexOf(Math.max(...d.floatDb));
    expect(d.floatDb[i]).toBeCloseTo(-report.doppler!.float.peakLossDb, 2);
    expect(d.x[i]).toBeCloseTo(report.doppler!.float.rangeShiftSamples, 3);
  });
});

describe("renderReportHtml", () => {
  const report = analyze(lfmSpec);
  const html = renderReportHtml(header, report);

  it("shows the datapath figures as analyze() computed them, and a caution when the accumulator is too narrow", () => {
    const d = report.datapath!;
    expect(html).toContain("Datapath of table rx");
    expect(html).toContain(escapeHtml(db(d.outputSqnrDb)));
    expect(html).toContain(
      `${d.worstCase.maxAbsAccumulator} (${d.worstCase.accumulatorBitsReached} bits of ${d.accumulatorBits})`,
    );
    expect(html).not.toContain("narrower than");
    const narrow = analyze({ ...lfmSpec, datapath: { accumulatorBits: d.accumulatorRequiredBits - 1 } });
    expect(narrow.datapath!.worstCase.accumulatorOverflowCount).toBeGreaterThan(0);
    expect(renderReportHtml(header, narrow)).toMatch(/narrower than the \d+ bits the worst case needs/);
  });

  it("escapes the header and shows each field", () => {
    for (const v of Object.values(header)) expect(html).toContain(escapeHtml(v));
    expect(html).not.toContain("<S-band>");
  });

  it("shows every figure (label and key) with analyze()'s values, and every limit with its verdict", () => {
    for (const [k, v] of Object.entries(report.fixed)) {
      expect(html).toContain(escapeHtml(METRIC_LABELS[k]!));
      expect(html).toContain(escapeHtml(formatMetric(k, v)));
      expect(html).toContain(escapeHtml(formatMetric(k, report.float[k])));
    }
    expect((html.match(/class="verdict pass"/g) ?? []).length).toBeGreaterThanOrEqual(
      report.limits.filter((c) => c.pass).length,
    );
    expect(html).toContain(`${report.limits.length} acceptance limits pass`);
  });

  it("states its assumptions and prints on A4/Letter with nothing external", () => {
    expect(html).toContain("white noise");
    expect(html).toContain("U = 8");
    expect(html).toContain("5 kHz");
    expect(html).toMatch(/@page \{ size: auto; margin: 15mm/);
    expect(html).not.toMatch(/<script|\ssrc=|\shref=|@import|url\((?!#)/i);
  });

  it("marks the recommended word length in the sweep", () => {
    const w = report.sweep!.smallestPassingWordLength!;
    expect(html).toContain(`recommended W = ${w}`);
    expect(html).toContain(`<b class="num">W = ${w}</b>`);
  });

  it("names failing limits in the banner", () => {
    const failing = analyze({ ...lfmSpec, limits: { pslDbMax: -40 } });
    expect(renderReportHtml(header, failing)).toContain(
      "1 of 1 acceptance limits fail: Peak sidelobe level (PSL).",
    );
  });
});
