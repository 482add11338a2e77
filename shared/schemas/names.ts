import { z } from "zod";

// Control (Cc), format (Cf: zero-width, bidirectional overrides, BOM), line and paragraph separators (Zl, Zp),
// and unassigned code points: invisible or look-alike, they would let two names read the same.
const FORBIDDEN = /[\p{Cc}\p{Cf}\p{Zl}\p{Zp}\p{Cn}]/u;

/** U+XXXX spelling of a code point, for messages. */
function codePoint(ch: string): string {
  return `U+${(ch.codePointAt(0) ?? 0).toString(16).toUpperCase().padStart(4, "0")}`;
}

/**
 * A name as it is stored and compared: Unicode NFC, every run of white space (no-break space included) one
 * ASCII space, trimmed. Two names that normalise to the same text, in any case, are the same name.
 */
export function normaliseName(raw: string): string {
  return raw.normalize("NFC").replace(/\s+/gu, " ").trim();
}

/** The first forbidden character of a name with its position (1-based), or null. */
export function forbiddenCharacter(raw: string): { char: string; position: number } | null {
  let position = 0;
  for (const ch of raw) {
    position += 1;
    if (FORBIDDEN.test(ch)) return { char: codePoint(ch), position };
  }
  return null;
}

/** The zod schema of a display name (designs, projects): normalised, no invisible characters, 1..max long. */
export function nameSchema(max = 120) {
  return z
    .string()
    .superRefine((raw, ctx) => {
      const bad = forbiddenCharacter(raw);
      if (bad)
        ctx.addIssue({
          code: "custom",
          message: `${bad.char} at character ${bad.position} is a control or invisible formatting character, not allowed in a name`,
        });
    })
    .transform(normaliseName)
    .pipe(z.string().min(1, "enter a name").max(max, `at most ${max} characters`));
}
