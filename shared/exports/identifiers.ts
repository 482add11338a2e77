/**
 * Safe identifiers for generated source files: any design name becomes a C99 or VHDL-2008 basic
 * identifier that cannot collide with a reserved word or inject text into the file.
 */

// C99 §6.4.1 keywords plus the names <stdint.h> reserves that a table name could plausibly hit.
const C_RESERVED = new Set(
  (
    "auto break case char const continue default do double else enum extern float for goto if inline int long " +
    "register restrict return short signed sizeof static struct switch typedef union unsigned void volatile while " +
    "_Bool _Complex _Imaginary"
  ).split(" "),
);

// IEEE 1076-2008 §15.10 reserved words.
const VHDL_RESERVED = new Set(
  (
    "abs access after alias all and architecture array assert assume assume_guarantee attribute begin block body " +
    "buffer bus case component configuration constant context cover default disconnect downto else elsif end entity " +
    "exit fairness file for force function generate generic group guarded if impure in inertial inout is label " +
    "library linkage literal loop map mod nand new next nor not null of on open or others out package parameter " +
    "port postponed procedure process property protected pure range record register reject release rem report " +
    "restrict restrict_guarantee return rol ror select sequence severity shared signal sla sll sra srl strong subtype " +
    "then to transport type unaffected units until use variable vmode vprop vunit wait when while with xnor xor"
  ).split(" "),
);

/** Longest identifier we emit: C99 guarantees 63 significant initial characters (§5.2.4.1). */
export const IDENT_MAX_LENGTH = 63;

/**
 * Signs of the trade spelled in ASCII the way engineers write them where only ASCII goes: "50 µs" → "50 us"
 * (the SI prefix µ, U+00B5, and the Greek μ, U+03BC, it folds to), "Ω" → "ohm", "°" → "deg".
 */
export function transliterate(text: string): string {
  return String(text).replace(/[µμ]/g, "u").replace(/[ΩΩ]/g, "ohm").replace(/°/g, "deg");
}

function words(text: string): string[] {
  // Letters and digits only (accents dropped by NFKD), runs of anything else become one separator.
  return transliterate(text)
    .normalize("NFKD")
    .replace(/[\u0300-\u036f]/g, "")
    .replace(/[^A-Za-z0-9]+/g, " ")
    .trim()
    .split(" ")
    .filter((w) => w !== "");
}

/** A C identifier from any text: [a-z0-9_], not starting with a digit, never a keyword ("2-tap FIR" → "t_2_tap_fir"). */
export function cIdent(text: string): string {
  let id = words(text).join("_").toLowerCase();
  if (id === "") id = "table";
  if (/^[0-9]/.test(id) || C_RESERVED.has(id)) id = `t_${id}`;
  return id.slice(0, IDENT_MAX_LENGTH).replace(/_+$/, "");
}

/** A VHDL basic identifier: starts with a letter, single underscores, no trailing underscore, not reserved. */
export function vhdlIdent(text: string): string {
  let id = words(text).join("_").toLowerCase();
  if (id === "") id = "table";
  if (!/^[a-z]/.test(id) || VHDL_RESERVED.has(id)) id = `t_${id}`;
  return id.slice(0, IDENT_MAX_LENGTH).replace(/_+$/, "");
}
