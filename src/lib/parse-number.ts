/**
 * What a number box holds, read strictly: "50", "-3.5", "1e-6", "−30" (a true minus, as pasted from a report)
 * are numbers; "" is "not given" (NaN); anything else ("1O", "50 us", "1,5") is kept as the text typed, so the
 * schema refuses it by name instead of the browser silently reading the digits it could.
 */
const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i;

/** The number typed, NaN for an empty box, or the text itself when it is not a number. */
export function parseNumberText(raw: unknown): number | string {
  if (typeof raw === "number") return raw;
  if (raw === null || raw === undefined) return NaN;
  const text = String(raw)
    .trim()
    .replace(/\u2212/g, "-");
  if (text === "") return NaN;
  return NUMBER.test(text) ? Number(text) : String(raw);
}

/** The message for a box whose text is not a number, naming what was typed. */
export function notANumberMessage(raw: string, unit?: string): string {
  const hint = unit ? `; the unit (${unit}) is already in the label` : "";
  return `“${raw.trim()}” is not a number: type digits only, e.g. 50 or 1.5e-6${hint}`;
}
