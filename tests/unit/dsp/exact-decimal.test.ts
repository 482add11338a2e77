import Decimal from "decimal.js";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { exactDecimal, parseDecimalText } from "@shared/dsp/exact-decimal";
import { quantize } from "@shared/dsp/quantize";

// Independent reference: decimal.js with enough significant digits for any code·2^-F up to F = 96
// (2^-96 has 96 significant decimal digits after its leading zeros; 32-bit codes add 10 more).
const D = Decimal.clone({ precision: 400, toExpNeg: -1000, toExpPos: 1000 });
const reference = (code: number | bigint, f: number) => new D(code.toString()).div(new D(2).pow(f)).toFixed();

describe("exactDecimal", () => {
  it("gives the worked examples exactly", () => {
    expect(exactDecimal(-3, 2)).toBe("-0.75");
    expect(exactDecimal(1, 20)).toBe("0.00000095367431640625"); // 2^-20
    expect(exactDecimal(0, 15)).toBe("0");
    expect(exactDecimal(4, 2)).toBe("1");
    expect(exactDecimal(-32768, 15)).toBe("-1");
    expect(exactDecimal(32767, 15)).toBe("0.999969482421875");
    expect(exactDecimal(5, -3)).toBe("40");
    expect(exactDecimal(-(2 ** 31), -64)).toBe("-39614081257132168796771975168"); // −2^95
    expect(exactDecimal(2n ** 70n + 1n, 70)).toBe(reference(2n ** 70n + 1n, 70));
  });

  it("matches decimal.js for random codes across every W (2..32) and F (−64..96)", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 2, max: 32 }).chain((w) => fc.integer({ min: -(2 ** (w - 1)), max: 2 ** w - 1 })),
        fc.integer({ min: -64, max: 96 }),
        (code, f) => {
          expect(exactDecimal(code, f)).toBe(reference(code, f));
        },
      ),
      { numRuns: 2000, seed: 11 },
    );
  });

  it("prints exactly the value a quantized code stands for (round trip through Number)", () => {
    const q = quantize(
      { re: Float64Array.of(0.1, -0.7, 0.123456789), im: new Float64Array(3) },
      {
        wordLength: 24,
        fractionLength: 23,
        signed: true,
        scaling: "as-given",
        rounding: "nearest-even",
        overflow: "saturate",
      },
    );
    for (let i = 0; i < 3; i++) expect(Number(exactDecimal(q.re[i]!, 23))).toBe(q.valueRe[i]);
  });

  it("rejects non-integer codes and bad fraction lengths", () => {
    expect(() => exactDecimal(1.5, 2)).toThrow(/code/);
    expect(() => exactDecimal(2 ** 53, 2)).toThrow(/code/);
    expect(() => exactDecimal(NaN, 2)).toThrow(/code/);
    expect(() => exactDecimal(1, 2.5)).toThrow(/fractionLength/);
    expect(() => exactDecimal(1, 5000)).toThrow(/fractionLength/);
    expect(() => exactDecimal("1" as unknown as number, 2)).toThrow(TypeError);
  });
});

describe("parseDecimalText", () => {
  it("accepts ordinary decimal and scientific notation", () => {
    const cases: [string, number][] = [
      ["0.5", 0.5],
      ["-1.25e-3", -0.00125],
      ["+7", 7],
      [".5", 0.5],
      ["5.", 5],
      ["  3.25  ", 3.25],
      ["1E3", 1000],
      ["-0", -0],
      ["0.1", 0.1],
    ];
    for (const [text, value] of cases) expect(parseDecimalText(text)).toBe(value);
  });

  it("rejects anything else with a clear error", () => {
    for (const bad of [
      "",
      "   ",
      "NaN",
      "Infinity",
      "-Inf",
      "1,5",
      "1.000,5",
      "0x10",
      "1e",
      "e5",
      "1.2.3",
      "--1",
      "1 2",
      "½",
      "1e999",
    ])
      expect(() => parseDecimalText(bad), bad).toThrow(RangeError);
    expect(() => parseDecimalText("1,5")).toThrow(/decimal separator/);
    expect(() => parseDecimalText(5 as unknown as string)).toThrow(TypeError);
  });

  it("lands within one ulp of the decimal.js value of random decimal text", () => {
    fc.assert(
      fc.property(
        fc.double({ min: -1e300, max: 1e300, noNaN: true }),
        fc.integer({ min: 1, max: 20 }),
        (v, digits) => {
          const text = new D(v).toSignificantDigits(digits).toExponential();
          const got = parseDecimalText(text);
          const exact = new D(text);
          // Relative error ≤ 2^-52 (one ulp); a correctly rounded parse is within half of that.
          if (exact.isZero()) expect(got === 0).toBe(true);
          else expect(new D(got).minus(exact).abs().div(exact.abs()).lte(new D(2).pow(-52))).toBe(true);
        },
      ),
      { numRuns: 1000, seed: 12 },
    );
  });
});
