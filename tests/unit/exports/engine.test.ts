import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { parseTemplate, renderTemplate, TemplateError } from "../../../server/exports/engine";
import { builtinTemplates } from "../../../server/exports/builtins";
import { cIdent, vhdlIdent } from "@shared/exports/identifiers";
import { sampleExportContext } from "@shared/exports/sample";
import { binWord, cLiteral, hexWord, padText, twosComplement } from "@shared/exports/words";

async function failure(body: string, ctx: object = sampleExportContext("real")): Promise<TemplateError> {
  try {
    await renderTemplate(body, ctx);
  } catch (err) {
    expect(err).toBeInstanceOf(TemplateError);
    return err as TemplateError;
  }
  throw new Error("expected the template to fail");
}

describe("hex, bin and twos words", () => {
  it("gives REFERENCES.md's IEEE 1364 examples: −1 at W=12 → FFF, −2048 → 800", () => {
    expect(hexWord(-1, 12)).toBe("FFF");
    expect(hexWord(-2048, 12)).toBe("800");
    expect(hexWord(2047, 12)).toBe("7FF");
    expect(hexWord(-1, 13)).toBe("1FFF"); // ⌈13/4⌉ = 4 digits, top digit holds one bit
    expect(hexWord(-(2 ** 31), 32)).toBe("80000000");
    expect(hexWord(2 ** 32 - 1, 32, false)).toBe("FFFFFFFF");
    expect(binWord(-1, 4)).toBe("1111");
    expect(binWord(-8, 4)).toBe("1000");
    expect(twosComplement(-1, 12)).toBe(4095n);
  });

  it("round-trips every code: sign-extending the hex word (BigInt.asIntN) gives the code back", () => {
    fc.assert(
      fc.property(
        fc
          .integer({ min: 2, max: 32 })
          .chain((w) =>
            fc.tuple(fc.constant(w), fc.integer({ min: -(2 ** (w - 1)), max: 2 ** (w - 1) - 1 })),
          ),
        ([w, c]) => {
          const hex = hexWord(c, w);
          expect(hex.length).toBe(Math.ceil(w / 4));
          expect(BigInt.asIntN(w, BigInt(`0x${hex}`))).toBe(BigInt(c));
          expect(BigInt.asIntN(w, BigInt(`0b${binWord(c, w)}`))).toBe(BigInt(c));
        },
      ),
      { numRuns: 3000, seed: 7 },
    );
  });

  it("refuses codes outside the word", () => {
    expect(() => hexWord(2048, 12)).toThrow(RangeError);
    expect(() => hexWord(-1, 8, false)).toThrow(RangeError);
    expect(() => hexWord(0.5, 8)).toThrow(RangeError);
  });

  it("writes C literals that are valid for int32_t and uint32_t (C99 §6.4.4.1)", () => {
    expect(cLiteral(-2147483648)).toBe("(-2147483647 - 1)");
    expect(cLiteral(4294967295)).toBe("4294967295U");
    expect(cLiteral(-5)).toBe("-5");
  });

  it("pads left, or right for a negative width", () => {
    expect(padText("7", 3)).toBe("  7");
    expect(padText("7", -3, ".")).toBe("7..");
  });
});

describe("identifiers", () => {
  it("makes C and VHDL identifiers from any name", () => {
    expect(cIdent("Long pulse LFM / rx")).toBe("long_pulse_lfm_rx");
    expect(cIdent("2-tap FIR")).toBe("t_2_tap_fir");
    expect(cIdent("int")).toBe("t_int");
    expect(cIdent("Ångström chirp")).toBe("angstrom_chirp");
    expect(cIdent("*/ #define X")).toBe("define_x");
    expect(vhdlIdent("_signal__x_")).toBe("signal_x");
    expect(vhdlIdent("signal")).toBe("t_signal");
    expect(vhdlIdent("4:1 FIR")).toBe("t_4_1_fir");
    fc.assert(
      fc.property(fc.string({ maxLength: 200 }), (s) => {
        expect(cIdent(s)).toMatch(/^[a-z_][a-z0-9_]{0,62}$/);
        expect(vhdlIdent(s)).toMatch(/^[a-z](_?[a-z0-9])*$/);
      }),
      { numRuns: 500, seed: 3 },
    );
  });
});

describe("the sandboxed engine", () => {
  it("applies our filters with widths from the spec by default", async () => {
    const ctx = sampleExportContext("real"); // W = 12, F = 11
    expect(
      await renderTemplate(
        "{{ -1 | hex }} {{ -2048 | hex }} {{ -1 | hex: 16 }} {{ -1 | bin: 4 }} {{ -1 | twos }}",
        ctx,
      ),
    ).toBe("FFF 800 FFFF 1111 4095");
    expect(await renderTemplate("{{ -3 | exact: 2 }} {{ 1 | exact }} {{ 'x' | pad: 3 }}", ctx)).toBe(
      "-0.75 0.00048828125   x",
    );
  });

  it("answers an unknown filter with its line and column", async () => {
    const e = await failure("first line\n  {{ taps | nope }}");
    expect(e.message).toContain("nope");
    expect([e.line, e.column]).toEqual([2, 3]);
  });

  it("answers an unknown variable (strict) with its line and column", async () => {
    const e = await failure("a\nb\n   {{ tap.i }}");
    expect(e.message).toMatch(/undefined variable: tap/);
    expect(e.line).toBe(3);
  });

  it("answers a syntax error with its line", async () => {
    const e = await failure("{% for t in taps %}\n{{ t.i }}\n");
    expect(e.line).toBe(1);
    expect(e.message).toMatch(/not closed/);
  });

  it("refuses include, render and layout (no file system)", async () => {
    for (const tag of ["include", "render", "layout"]) {
      const e = await failure(`x\n{% ${tag} 'etc/passwd' %}`);
      expect(e.message).toContain(`${tag} tag is not available`);
      expect(e.line).toBe(2);
    }
  });

  it("exposes no inherited properties (ownPropertyOnly)", async () => {
    const e = await failure("{{ taps.constructor }}");
    expect(e.message).toMatch(/undefined variable/);
    await failure("{{ spec.toString }}");
  });

  it("stops runaway loops by the render limits", async () => {
    const e = await failure("{% for a in (1..100000000) %}{{ a }}{% endfor %}");
    expect(e.message).toMatch(/limit/);
  });

  it("stops a CPU-bound loop that writes nothing by its render time limit", async () => {
    await expect(
      renderTemplate(
        "{% for a in (1..3000) %}{% for b in (1..3000) %}{% endfor %}{% endfor %}",
        sampleExportContext("real"),
        {
          renderMs: 300,
        },
      ),
    ).rejects.toThrow(/render limit/);
  });

  it("refuses a template longer than 64 KiB before parsing", () => {
    expect(() => parseTemplate("x".repeat(64 * 1024 + 1))).toThrow(/longer than/);
  });
});

describe("built-in templates", () => {
  it("each has an id, a name, a version and an extension, and renders both sample tables", async () => {
    const list = builtinTemplates();
    expect(list.map((t) => t.id).sort()).toEqual([
      "binary",
      "c-header",
      "csv",
      "json",
      "readmemh",
      "vhdl-package",
    ]);
    for (const t of list) {
      expect(t.version).toBeGreaterThanOrEqual(1);
      expect(t.extension).toMatch(/^[a-z0-9]+$/);
      if (t.body !== null)
        for (const kind of ["complex", "real"] as const)
          expect((await renderTemplate(t.body, sampleExportContext(kind))).length).toBeGreaterThan(100);
    }
  });

  it("the hex file says in a // header how complex tables are laid out", async () => {
    const t = builtinTemplates().find((x) => x.id === "readmemh")!;
    const text = await renderTemplate(t.body!, sampleExportContext("complex"));
    expect(text).toMatch(/^\/\/ complex: I and Q interleaved, word 2k = I\[k\], word 2k\+1 = Q\[k\]/m);
  });
});
