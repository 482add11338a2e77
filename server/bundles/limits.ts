/**
 * What a release can carry. Every exported file is at most MAX_EXPORT_FILE_BYTES; the widest built-in
 * export writes at most WORST_BYTES_PER_TAP per tap (JSON with 32-bit codes and F = 96: 309 B, the longest
 * exact decimals and floats; measured by tests/unit/bundles/limits.test.ts), so a table longer than MAX_RELEASE_TABLE_LENGTH
 * could never be released and is refused when the draft is saved, not after a long build.
 */

/** Largest exported file in a bundle (96 MiB): what a firmware repository or a review tool can still open. */
export const MAX_EXPORT_FILE_BYTES = 96 * 1024 * 1024;

/** Bytes per tap the widest built-in export may write (worst case; the fixed header is extra). */
export const WORST_BYTES_PER_TAP = 320;

/** Fixed part (header, footer) a built-in export may add to its per-tap lines. */
export const WORST_HEADER_BYTES = 64 * 1024;

/**
 * Longest table a release can carry: 2^16 samples, the longest whose release is built and checked end to end
 * in the suite (tests/api/sizes.test.ts). The byte limit alone would allow 2^18 (262,144 × 320 B + 64 KiB ≈ 80 MiB),
 * but a 262,144-sample release does not yet build (the Liquid exports and the five vector sets at that length),
 * so drafts that could never be released are refused when saved rather than failing at release.
 */
export const MAX_RELEASE_TABLE_LENGTH = 65_536;

/** A table too long to release, as words for a 400 (null when every table can be released). */
export function unreleasableTable(tables: readonly { role: string; length: number }[]): string | null {
  const t = tables.find((x) => x.length > MAX_RELEASE_TABLE_LENGTH);
  if (!t) return null;
  return `The ${t.role} table would have ${t.length.toLocaleString("en")} samples; a release can carry tables of at most ${MAX_RELEASE_TABLE_LENGTH.toLocaleString("en")} samples (each exported file is limited to ${MAX_EXPORT_FILE_BYTES / 1048576} MiB), so this draft could never be released. Shorten the pulse or lower the sample rate.`;
}

/** Files of a built bundle over the per-file limit (a custom template can write more than a built-in). */
export function oversizedFiles(files: readonly { path: string; size: number }[]): string | null {
  const big = files.find((f) => f.size > MAX_EXPORT_FILE_BYTES);
  return big
    ? `${big.path} would be ${big.size.toLocaleString("en")} bytes; an exported file may have at most ${MAX_EXPORT_FILE_BYTES.toLocaleString("en")} (96 MiB)`
    : null;
}
