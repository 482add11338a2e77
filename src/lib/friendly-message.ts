/**
 * Validation messages in the words of the form beside them: zod's stock wording ("Too big: expected number to
 * be <=32") and the API's SI names ("sampleRateHz (5000000) must be ≥ bandwidthHz (10000000)") rewritten the way
 * a labelled input with its unit reads. Used by every form that validates with the server's schemas.
 */
import type { FieldErrors, FieldValues, Resolver } from "react-hook-form";

/** The part of a zod issue read here. */
interface MessageLike {
  message: string;
}

// The API's names of generator parameters, as the form's labels call them.
export const API_WORDS: Record<string, string> = {
  sampleRateHz: "fs",
  bandwidthHz: "B",
  intermediateFrequencyHz: "IF",
  pulseWidthS: "T",
  cutoffHz: "the cutoff",
  lowCutoffHz: "the low cutoff",
  highCutoffHz: "the high cutoff",
  transitionHz: "the transition width",
};

/** A number in Hz written the way the form reads it (MHz), e.g. 10000000 → "10 MHz". */
function hzText(hz: string): string {
  const n = Number(hz);
  return Number.isFinite(n) ? `${Number((n / 1e6).toPrecision(6))} MHz` : hz;
}

/**
 * A generator's refusal (a RangeError the server returns at the source's path) in the form's words:
 * "sampleRateHz (5000000) must be ≥ bandwidthHz (10000000) for complex output"
 * → "fs (5 MHz) must be ≥ B (10 MHz) for complex output".
 */
export function generatorMessage(message: string): string {
  return message
    .replace(/\b([a-zA-Z]+Hz)\b( \(([-\d.e+]+)\))?/g, (all, name: string, _p, value?: string) =>
      name in API_WORDS ? `${API_WORDS[name]}${value !== undefined ? ` (${hzText(value)})` : ""}` : all,
    )
    .replace(/\bbandwidthHz\/2\b/g, "B/2")
    .replace(/\b(pulseWidthS)\b/g, "T");
}

/**
 * Zod's stock wording ("Too big: expected number to be <=32", "expected number, received NaN") and the schema's
 * SI units ("must be > 0 s" on a µs field) read oddly next to a labelled input: say it the way the label does.
 */
export function friendlyMessage(issue: MessageLike): string {
  const m = issue.message;
  if (/expected number, received (undefined|NaN)/.test(m)) return "enter a number";
  if (/expected number, received string/.test(m))
    return "not a number: type digits only (the unit is in the label)";
  if (/expected int/.test(m)) return "enter a whole number";
  let r = /Too big: expected number to be (<=?)\s*(\S+)/.exec(m);
  if (r) return `${r[1] === "<" ? "must be less than" : "at most"} ${r[2]}`;
  r = /Too small: expected number to be (>=?)\s*(\S+)/.exec(m);
  if (r) return `${r[1] === ">" ? "must be more than" : "at least"} ${r[2]}`;
  // The field's label carries the unit; the schema speaks Hz and s.
  r = /^(must be [<>≤≥]=? ?)(-?[\d.]+) (Hz|s)$/.exec(m);
  if (r) return `${r[1]}${r[2]}`;
  return generatorMessage(m);
}

function rewrite(node: unknown): void {
  if (!node || typeof node !== "object") return;
  const n = node as Record<string, unknown>;
  if (typeof n.message === "string" && typeof n.type === "string")
    n.message = friendlyMessage({ message: n.message });
  for (const [k, v] of Object.entries(n)) if (k !== "ref" && k !== "message") rewrite(v);
}

/** A resolver whose messages are rewritten by friendlyMessage (wraps e.g. zodResolver). */
export function friendlyResolver<T extends FieldValues, C, O>(inner: Resolver<T, C, O>): Resolver<T, C, O> {
  return async (values, context, options) => {
    const result = await inner(values, context, options);
    rewrite(result.errors as FieldErrors<T>);
    return result;
  };
}
