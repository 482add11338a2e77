/**
 * The export template engine: Liquid (liquidjs), sandboxed and logic-light. Templates cannot run
 * JavaScript, read files (include/render/layout are refused), reach prototype properties, or use an
 * unknown variable or filter; parse size, render time and allocation are capped.
 */
import {
  evalToken,
  ForTag,
  Liquid,
  TablerowTag,
  type Context,
  type Emitter,
  type Template,
  type Token,
} from "liquidjs";
import { exactDecimal } from "../../shared/dsp/exact-decimal";
import { cIdent, vhdlIdent } from "../../shared/exports/identifiers";
import { asciiText, binWord, cLiteral, hexWord, padText, twosComplement } from "../../shared/exports/words";

/** Limits of one template: source size, render time and output size. */
export const TEMPLATE_LIMITS = {
  /** Characters of template source. */
  maxBodyChars: 64 * 1024,
  /** Milliseconds of render time (liquidjs renderLimit) for a real table. */
  renderMs: 2_000,
  /** Milliseconds for a preview or validation render on a sample table (tiny; a slow one is a runaway). */
  previewMs: 500,
  /** Characters liquidjs may allocate while rendering (memoryLimit; a rough count). */
  memoryChars: 64 * 1024 * 1024,
  /** Characters of rendered output (an exported file is at most 96 MiB, server/bundles/limits.ts). */
  maxOutputChars: 96 * 1024 * 1024,
  /**
   * Loop iterations (for and tablerow bodies) in one render: the work bound. One pass over the largest
   * releasable table (262,144 taps) per loop leaves room for 16 such passes; a loop nested in a loop over
   * the taps runs out at once, however fast the machine.
   */
  maxLoopIterations: 16 * 262_144,
} as const;

/** A template problem with its position in the source (1-based), when the engine knows it. */
export class TemplateError extends Error {
  constructor(
    message: string,
    readonly line: number | null,
    readonly column: number | null,
  ) {
    super(message);
    this.name = "TemplateError";
  }
}

interface Positioned {
  token?: { getPosition?: () => [number, number] };
  originalError?: Error;
  message: string;
}

/** Turns a liquidjs error into a TemplateError with line and column (message without liquidjs' own suffix). */
export function toTemplateError(err: unknown): TemplateError {
  if (err instanceof TemplateError) return err;
  const e = err as Positioned;
  const pos = e?.token?.getPosition?.();
  const raw = e?.originalError?.message ?? e?.message ?? String(err);
  const message = raw.replace(/, line:\d+, col:\d+$/, "");
  return pos ? new TemplateError(message, pos[0], pos[1]) : new TemplateError(message, null, null);
}

type Ctx = { getSync(path: (string | number)[]): unknown };

function specValue(ctx: Ctx, key: string): unknown {
  return ctx.getSync(["spec", key]);
}

function wordArgs(self: { context: Ctx }, width: unknown): { w: number; signed: boolean } {
  const w = width === undefined ? specValue(self.context, "word_length") : width;
  if (typeof w !== "number") throw new TypeError("the word width must be a number (or set spec.word_length)");
  const signed = specValue(self.context, "signed");
  return { w, signed: signed === undefined ? true : Boolean(signed) };
}

function code(value: unknown): number {
  const n = typeof value === "string" && /^-?\d+$/.test(value) ? Number(value) : value;
  if (typeof n !== "number" || !Number.isSafeInteger(n))
    throw new TypeError(`expected an integer code, got ${String(value)}`);
  return n;
}

const DATE_FILTERS = ["date", "date_to_xmlschema", "date_to_rfc822", "date_to_string", "date_to_long_string"];
const CLOCK_WORDS = new Set(["now", "today"]);

// Loop iterations charged so far, per render (liquidjs makes one Context per render call).
const loopCharges = new WeakMap<Context, number>();

function chargeLoop(ctx: Context, items: unknown): void {
  const n = Array.isArray(items)
    ? items.length
    : typeof items === "string"
      ? 1
      : items && typeof items === "object"
        ? Object.keys(items).length
        : 0;
  const used = (loopCharges.get(ctx) ?? 0) + n;
  loopCharges.set(ctx, used);
  if (used > TEMPLATE_LIMITS.maxLoopIterations)
    throw new Error(
      `the template runs more than ${TEMPLATE_LIMITS.maxLoopIterations.toLocaleString("en")} loop iterations (the work limit of one render): loop over the taps once, not inside another loop`,
    );
}

type LoopCollection = { collection: Token };

class CountedFor extends ForTag {
  override *render(ctx: Context, emitter: Emitter): Generator<unknown, void | string, Template[]> {
    const items: unknown = yield evalToken((this as unknown as LoopCollection).collection, ctx);
    chargeLoop(ctx, items);
    return yield* super.render(ctx, emitter);
  }
}

class CountedTablerow extends TablerowTag {
  override *render(ctx: Context, emitter: Emitter): Generator<unknown, void, unknown> {
    chargeLoop(ctx, yield evalToken((this as unknown as LoopCollection).collection, ctx));
    yield* super.render(ctx, emitter);
  }
}

/** A configured engine: strict, no file system, our filters. */
export function createExportEngine(): Liquid {
  const liquid = new Liquid({
    // An empty in-memory file system: every lookup fails, and the tags below refuse before that.
    templates: {},
    strictVariables: true,
    strictFilters: true,
    ownPropertyOnly: true,
    parseLimit: TEMPLATE_LIMITS.maxBodyChars,
    renderLimit: TEMPLATE_LIMITS.renderMs,
    memoryLimit: TEMPLATE_LIMITS.memoryChars,
    cache: false,
    // Dates format in UTC, so the server's time zone never changes an export's bytes.
    timezoneOffset: 0,
  });
  // The stock loops, charged per iteration against maxLoopIterations before they run.
  liquid.registerTag("for", CountedFor);
  liquid.registerTag("tablerow", CountedTablerow);
  for (const tag of ["include", "render", "layout"]) {
    liquid.registerTag(tag, {
      parse() {
        throw new Error(`the ${tag} tag is not available in export templates (one template, one file)`);
      },
      render() {
        return "";
      },
    });
  }
  // The date filters read the clock for "now" and "today": an export must be the same bytes every time it is
  // rendered, so those inputs are refused; dates given by the context (and literal ones) still format.
  for (const name of DATE_FILTERS) {
    const builtIn = liquid.filters[name];
    const handler = typeof builtIn === "function" ? builtIn : builtIn?.handler;
    if (!handler) continue;
    liquid.registerFilter(name, function (this: unknown, v: unknown, ...args: unknown[]) {
      if (typeof v === "string" && CLOCK_WORDS.has(v.trim().toLowerCase()))
        throw new TypeError(
          `the ${name} filter cannot read the clock ("${v}"): an export must not change with the time it is rendered`,
        );
      return (handler as (this: unknown, ...a: unknown[]) => unknown).call(this, v, ...args);
    });
  }
  liquid.registerFilter("hex", function (this: { context: Ctx }, v: unknown, width?: unknown) {
    const { w, signed } = wordArgs(this, width);
    return hexWord(code(v), w, signed);
  });
  liquid.registerFilter("bin", function (this: { context: Ctx }, v: unknown, width?: unknown) {
    const { w, signed } = wordArgs(this, width);
    return binWord(code(v), w, signed);
  });
  liquid.registerFilter("twos", function (this: { context: Ctx }, v: unknown, width?: unknown) {
    const { w, signed } = wordArgs(this, width);
    return twosComplement(code(v), w, signed).toString();
  });
  liquid.registerFilter("exact", function (this: { context: Ctx }, v: unknown, fraction?: unknown) {
    const f = fraction === undefined ? specValue(this.context, "fraction_length") : fraction;
    if (typeof f !== "number") throw new TypeError("exact needs a fraction length (or spec.fraction_length)");
    return exactDecimal(code(v), f);
  });
  liquid.registerFilter("pad", (v: unknown, width: unknown, fill?: unknown) => {
    if (typeof width !== "number") throw new TypeError("pad needs a width");
    return padText(String(v), width, fill === undefined ? " " : String(fill));
  });
  liquid.registerFilter("c_ident", (v: unknown) => cIdent(String(v)));
  liquid.registerFilter("vhdl_ident", (v: unknown) => vhdlIdent(String(v)));
  liquid.registerFilter("c_literal", (v: unknown) => cLiteral(code(v)));
  liquid.registerFilter("ascii", (v: unknown) => asciiText(String(v)));
  return liquid;
}

// One engine per process is enough: it holds no per-render state (cache is off).
let shared: Liquid | undefined;
function engine(): Liquid {
  shared ??= createExportEngine();
  return shared;
}

/** Parses a template body; throws TemplateError with the line and column of the first problem. */
export function parseTemplate(body: string): Template[] {
  if (typeof body !== "string") throw new TemplateError("the template must be text", null, null);
  if (body.length > TEMPLATE_LIMITS.maxBodyChars)
    throw new TemplateError(
      `the template is longer than ${TEMPLATE_LIMITS.maxBodyChars} characters`,
      null,
      null,
    );
  try {
    return engine().parse(body);
  } catch (err) {
    throw toTemplateError(err);
  }
}

/** Renders a parsed or source template against a context; errors become TemplateError. */
export async function renderTemplate(
  template: string | Template[],
  context: object,
  opts: { renderMs?: number; sync?: boolean } = {},
): Promise<string> {
  const parsed = typeof template === "string" ? parseTemplate(template) : template;
  let out: unknown;
  try {
    // Rendering runs on the calling thread: the time limit bounds how long one template can hold it.
    const renderOpts = { renderLimit: opts.renderMs ?? TEMPLATE_LIMITS.renderMs };
    // Synchronous rendering (same output) skips a promise per tag: about twice as fast on long tables.
    out = opts.sync
      ? engine().renderSync(parsed, context, renderOpts)
      : await engine().render(parsed, context, renderOpts);
  } catch (err) {
    throw toTemplateError(err);
  }
  const text = String(out);
  if (text.length > TEMPLATE_LIMITS.maxOutputChars)
    throw new TemplateError(
      `the output is longer than ${TEMPLATE_LIMITS.maxOutputChars} characters`,
      null,
      null,
    );
  return text;
}
