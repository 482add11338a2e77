// The new-design form's pure helpers: unit conversions (checked against decimal.js), derived figures (against
// published formulas and tables), and the mapping to the server's CreateDesignSchema with error paths back.
import Decimal from "decimal.js";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { CreateDesignSchema } from "@shared/schemas/designs";
import {
  chipCount,
  deriveFigures,
  kaiserEstimate,
  pulseSampleCount,
  qFormat,
  rangeResolutionM,
  timeBandwidth,
} from "@/features/designs/lib/derived-figures";
import { defaultFormValues, type DesignFormValues } from "@/features/designs/lib/form-values";
import { createDesignResolver, fieldMessages } from "@/features/designs/lib/issues";
import { formPathOf, toCreateInput } from "@/features/designs/lib/to-create-input";
import { hzToMhz, mhzToHz, sToUs, usToS } from "@/features/designs/lib/units";

/** x·10^k through decimal.js (exact decimal arithmetic, one rounding to double at the end). */
const decimalShift = (x: number, k: number) =>
  new Decimal(String(x)).times(new Decimal(10).pow(k)).toNumber();

describe("unit conversions", () => {
  it("give the double nearest the typed value times 10^±6, unlike ×1e-6 or ÷1e6", () => {
    // Values an author types; 0.1 and 13.3 are the ones where x/1e6 misses by one ulp, 50 and 12.5 where x·1e-6 does.
    for (const x of [50, 12.5, 6.25, 0.1, 13.3, 100, 0.3, 2.2]) {
      expect(usToS(x)).toBe(decimalShift(x, -6));
      expect(mhzToHz(x)).toBe(decimalShift(x, 6));
    }
    expect(usToS(50)).toBe(5e-5);
    expect(mhzToHz(12.5)).toBe(12_500_000);
    expect(usToS(0.1)).toBe(1e-7);
  });

  it("agree with decimal.js for any finite double, and round-trip", () => {
    fc.assert(
      fc.property(fc.double({ noNaN: true, noDefaultInfinity: true, min: -1e300, max: 1e300 }), (x) => {
        expect(mhzToHz(x)).toBe(decimalShift(x, 6));
        expect(usToS(x)).toBe(decimalShift(x, -6));
      }),
      { seed: 4, numRuns: 2000 },
    );
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 10_000_000 }), fc.integer({ min: 0, max: 4 }), (m, d) => {
        const typed = m / 10 ** d; // a value with at most 4 decimals, as typed into a box
        expect(hzToMhz(mhzToHz(typed))).toBe(typed);
        expect(sToUs(usToS(typed))).toBe(typed);
      }),
      { seed: 5, numRuns: 2000 },
    );
  });
});

describe("derived figures", () => {
  it("LFM 10 MHz / 50 µs at 12.5 MHz: N = 625, BT = 500, c/2B = 14.9896229 m", () => {
    // Range resolution c/(2B) and compression ratio BT: Richards, Fundamentals of Radar Signal Processing, 2014, ch. 4.
    // c = 299 792 458 m/s exactly (SI, 1983); the reference quotient comes from decimal.js.
    expect(pulseSampleCount(5e-5, 12.5e6)).toBe(625);
    expect(timeBandwidth(10e6, 5e-5)).toBe(500);
    expect(rangeResolutionM(10e6)).toBe(new Decimal(299_792_458).div(2e7).toNumber());
    expect(rangeResolutionM(10e6)).toBe(14.9896229);
    const d = deriveFigures(defaultFormValues());
    expect(Object.fromEntries(d.figures.map((f) => [f.label, f.value]))).toEqual({
      "Samples N": "625",
      "Time-bandwidth BT": "500",
      "Range resolution c/2B": "15.0 m",
      "Oversampling fs/B": "1.25",
    });
    expect(d.warnings).toEqual([]);
  });

  it("Kaiser β and order: O&S example (A = 60 dB, Δω = 0.2π) gives β = 5.653, M = 37", () => {
    // Oppenheim & Schafer, Discrete-Time Signal Processing, 1989, §7.2 Kaiser low-pass example (from memory:
    // ωp = 0.4π, ωs = 0.6π, δ = 0.001 → β = 5.653, M = 37), eqs. 7.92–7.93.
    const e = kaiserEstimate(1, 0.1, 60);
    expect(e.order).toBe(37);
    expect(e.beta).toBeCloseTo(5.653, 3);
    expect(e.taps).toBe(38);
  });

  it("the demo decimation FIR (fs 100 MHz, Δf 5 MHz, 70 dB): M = 87, β = 6.75526 from the formulas by hand", () => {
    // Independent evaluation of O&S eqs. 7.92–7.93: β = 0.1102(A − 8.7); M = ⌈(A − 8)/(2.285·Δω)⌉, Δω = 2π·5/100.
    const beta = new Decimal("0.1102").times(new Decimal(70).minus("8.7")).toNumber();
    const m = Math.ceil(62 / (2.285 * 2 * Math.PI * 0.05));
    const e = kaiserEstimate(100e6, 5e6, 70);
    expect(m).toBe(87);
    expect(e.order).toBe(m);
    expect(e.beta).toBeCloseTo(beta, 12);
    const v: DesignFormValues = { ...defaultFormValues(), kind: "filter" };
    const labels = Object.fromEntries(deriveFigures(v).figures.map((f) => [f.label, f.value]));
    expect(labels).toMatchObject({
      "Kaiser order M": "87",
      "Kaiser β": "6.755",
      Taps: "88",
      "Transition Δω": "0.1000·π rad/sample",
    });
  });

  it("chips: Barker-13 has 13, Frank M = 4 has 16, P4 of length 64 has 64", () => {
    // Barker lengths and the Frank code's N = M² — Richards 2014, Table 4.1 and §4.7 (Frank N = 16 for M = 4).
    expect(chipCount("barker", { barkerLength: 13, order: 0, length: 0 })).toBe(13);
    expect(chipCount("frank", { barkerLength: 0, order: 4, length: 0 })).toBe(16);
    expect(chipCount("p4", { barkerLength: 0, order: 0, length: 64 })).toBe(64);
    const v = defaultFormValues();
    v.generator = "phase-code";
    v.phaseCode = {
      ...v.phaseCode,
      code: "barker",
      barkerLength: 13,
      samplesPerChip: 2,
      rateBasis: "chip",
      rateMHz: 5,
    };
    const f = Object.fromEntries(deriveFigures(v).figures.map((x) => [x.label, x.value]));
    // Chip 1/(5 MHz) = 200 ns → cτ/2 = 29.98 m; fs = 2 samples/chip × 5 MHz.
    expect(f).toMatchObject({
      Chips: "13",
      "Chip length": "200 ns",
      "Samples N": "26",
      "Range resolution cτ/2": "30.0 m",
      "Sample rate": "10.0 MHz",
    });
  });

  it("Q notation counts the sign among the integer bits (common practice: Q1.15 for a 16-bit fraction)", () => {
    expect(qFormat(16, 15, true)).toBe("Q1.15");
    expect(qFormat(12, 11, true)).toBe("Q1.11");
    expect(qFormat(16, 16, false)).toBe("UQ0.16");
    expect(qFormat(18, 20, true)).toBe("Q-2.20");
  });

  it("warns when undersampled, for a real chirp below B/2, and for huge N", () => {
    const v = defaultFormValues();
    v.lfm.sampleRateMHz = 8; // below B = 10 MHz
    expect(deriveFigures(v).warnings.join(" ")).toMatch(
      /undersampled: complex baseband needs fs ≥ B = 10.0 MHz/,
    );
    v.lfm = { ...v.lfm, output: "real", intermediateFrequencyMHz: 4, sampleRateMHz: 40 };
    const w = deriveFigures(v).warnings.join(" ");
    expect(w).toMatch(/IF is below B\/2/);
    v.lfm = { ...v.lfm, intermediateFrequencyMHz: 15, sampleRateMHz: 30 }; // needs 2·(15 + 5) = 40 MHz
    expect(deriveFigures(v).warnings.join(" ")).toMatch(/needs fs ≥ 40.0 MHz/);
    v.lfm = { ...v.lfm, output: "complex", pulseWidthUs: 200_000, sampleRateMHz: 12.5 }; // 2.5 M samples
    expect(deriveFigures(v).warnings.join(" ")).toMatch(/2\u2009500\u2009000 samples: analysis and plots/);
  });

  it("passes the Taylor n̄ rule warning through for the receive window", () => {
    // n̄ ≥ 2A² + 0.5 (Carrara, Goodman, Majewski, Spotlight SAR, 1995, from memory): −45 dB needs n̄ ≥ 6.
    const v = defaultFormValues();
    v.rxWindow = { ...v.rxWindow, kind: "taylor", nbar: 3, sidelobeDb: -45 };
    expect(deriveFigures(v).warnings.join(" ")).toMatch(/Taylor n̄ = 3 is below/);
  });
});

describe("form → CreateDesignSchema mapping", () => {
  it("the defaults map to a valid LFM body in Hz and s", () => {
    const v = { ...defaultFormValues(), name: "Long pulse" };
    const parsed = CreateDesignSchema.parse(toCreateInput(v));
    expect(parsed.content).toMatchObject({
      kind: "waveform",
      tx: {
        kind: "lfm",
        bandwidthHz: 10_000_000,
        pulseWidthS: 5e-5,
        sampleRateHz: 12_500_000,
        direction: "up",
        output: "complex",
      },
      rx: { window: { kind: "taylor", nbar: 6, sidelobeDb: -35 } },
      fixedPoint: { tx: { wordLength: 16, fractionLength: 15 }, rx: { wordLength: 16, fractionLength: 15 } },
      limits: {},
    });
  });

  it("phase code from a chip rate; NLFM with its window; filter design; uploads with bands", () => {
    const v = { ...defaultFormValues(), name: "x" };
    v.generator = "phase-code";
    v.phaseCode = {
      ...v.phaseCode,
      code: "p4",
      length: 64,
      samplesPerChip: 3,
      rateBasis: "chip",
      rateMHz: 2.5,
    };
    expect(CreateDesignSchema.parse(toCreateInput(v)).content).toMatchObject({
      tx: {
        kind: "phase-code",
        code: { kind: "p4", length: 64 },
        samplesPerChip: 3,
        sampleRateHz: 7_500_000,
      },
    });
    v.generator = "nlfm";
    v.nlfm.window = { kind: "chebyshev", attenuationDb: 40, beta: 1, nbar: 1, sidelobeDb: -20 };
    expect(CreateDesignSchema.parse(toCreateInput(v)).content).toMatchObject({
      tx: {
        kind: "nlfm",
        bandwidthHz: 5e6,
        pulseWidthS: 1e-4,
        sampleRateHz: 6.25e6,
        window: { kind: "chebyshev", attenuationDb: 40 },
      },
    });
    const f = { ...defaultFormValues(), name: "fir", kind: "filter" as const };
    expect(CreateDesignSchema.parse(toCreateInput(f)).content).toEqual({
      kind: "filter",
      fir: {
        kind: "design",
        band: "lowpass",
        sampleRateHz: 1e8,
        cutoffHz: 1e7,
        transitionHz: 5e6,
        stopbandAttenuationDb: 70,
      },
      fixedPoint: {
        fir: {
          wordLength: 16,
          fractionLength: 15,
          signed: true,
          scaling: "full-scale",
          rounding: "nearest-even",
          overflow: "saturate",
        },
      },
      responsePoints: 8192,
      interpolation: 8,
      inputBits: 14,
      datapath: { outputBits: 16, outputRounding: "nearest-even", outputOverflow: "saturate" },
      limits: {},
    });
    f.source = "upload";
    f.upload = {
      uploadId: 7,
      sampleRateMHz: 100,
      passLowMHz: 0,
      passHighMHz: 8,
      stopLowMHz: 12.5,
      stopHighMHz: 50,
    };
    f.limits.stopbandAttenuationDbMin = 60;
    expect(CreateDesignSchema.parse(toCreateInput(f)).content).toMatchObject({
      fir: {
        kind: "upload",
        uploadId: 7,
        sampleRateHz: 1e8,
        passbands: [[0, 8e6]],
        stopbands: [[12.5e6, 5e7]],
      },
      limits: { stopbandAttenuationDbMin: 60 },
    });
  });

  it("issue paths come back to the field that holds the value, unions resolved to the chosen branch", async () => {
    const v = { ...defaultFormValues(), name: "" };
    v.lfm.bandwidthMHz = NaN;
    v.lfm.sampleRateMHz = -1;
    v.fixedPoint.rx.wordLength = 40;
    const result = await createDesignResolver(v, undefined, { fields: {}, shouldUseNativeValidation: false });
    const e = result.errors as Record<string, unknown>;
    expect(e).toMatchObject({
      name: { message: "enter a name" },
      lfm: { bandwidthMHz: { message: "enter a number" }, sampleRateMHz: { message: "must be > 0" } },
      // The label carries the unit (MHz); zod's "Too big: expected number to be <=32" reads as "at most 32".
      fixedPoint: { rx: { wordLength: { message: "at most 32" } } },
    });
    // The server's 400 details carry the same paths (no union wrapper): they land on the same fields.
    expect(
      fieldMessages(v, [
        { path: ["content", "tx", "pulseWidthS"], message: "too long" },
        { path: ["name"], message: "taken" },
      ]),
    ).toEqual({
      "lfm.pulseWidthUs": "too long",
      name: "taken",
    });
    const p = { ...v, generator: "phase-code" as const };
    expect(formPathOf(p, ["content", "tx", "code", "order"])).toBe("phaseCode.barkerLength");
    expect(
      formPathOf({ ...p, phaseCode: { ...p.phaseCode, code: "frank" } }, ["content", "tx", "code", "order"]),
    ).toBe("phaseCode.order");
    expect(
      formPathOf({ ...v, kind: "filter", source: "upload" }, ["content", "fir", "stopbands", 0, 1]),
    ).toBe("upload.stopHighMHz");
    expect(formPathOf(v, ["content", "limits", "pslDbMax"])).toBe("limits.pslDbMax");
    expect(formPathOf(v, ["content", "rx", "window", "nbar"])).toBe("rxWindow.nbar");
  });
});
