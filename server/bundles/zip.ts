/**
 * Deterministic zip: files in byte order of their paths, one fixed timestamp, DEFLATE level 9, no
 * directory entries, DOS platform (no Unix extra fields or permissions), no comment. jszip writes the
 * DOS time from the UTC fields of the date, so the bytes do not depend on the server's time zone.
 */
import JSZip from "jszip";
import { createHash } from "node:crypto";

/** One file of a bundle; `path` uses "/" and no leading slash. */
export interface BundleFile {
  path: string;
  bytes: Uint8Array;
}

/** The zip format's earliest date (DOS time starts in 1980); used when no release time is given. */
export const ZIP_EPOCH = new Date(Date.UTC(1980, 0, 1, 0, 0, 0));

/** SHA-256 (lower-case hex) of some bytes. */
export function sha256Hex(bytes: Uint8Array): string {
  return createHash("sha256").update(bytes).digest("hex");
}

/** Byte-wise (code unit) path order, the same in every locale (`sort` in the C locale agrees for ASCII). */
export function comparePaths(a: string, b: string): number {
  return a < b ? -1 : a > b ? 1 : 0;
}

/** DOS time keeps even seconds only; round down so the stored time is exactly the given one or 1 s before. */
export function zipDate(at: Date): Date {
  const ms = at.getTime();
  if (ms < ZIP_EPOCH.getTime()) return ZIP_EPOCH;
  return new Date(Math.floor(ms / 2000) * 2000);
}

/** Checks a bundle path: relative, "/"-separated, printable ASCII, no "." or ".." segments. */
export function checkBundlePath(path: string): void {
  if (
    !/^[A-Za-z0-9._-]+(\/[A-Za-z0-9._-]+)*$/.test(path) ||
    path.split("/").some((s) => s === "." || s === "..")
  )
    throw new RangeError(`bad bundle path: ${JSON.stringify(path)}`);
}

/** Zip the files deterministically: same files and date → same bytes. */
export async function zipFiles(files: readonly BundleFile[], date: Date): Promise<Buffer> {
  const zip = new JSZip();
  const sorted = [...files].sort((a, b) => comparePaths(a.path, b.path));
  const fixed = zipDate(date);
  for (let i = 0; i < sorted.length; i++) {
    const f = sorted[i]!;
    checkBundlePath(f.path);
    if (i > 0 && sorted[i - 1]!.path === f.path) throw new RangeError(`duplicate bundle path: ${f.path}`);
    zip.file(f.path, f.bytes, { binary: true, date: fixed, createFolders: false });
  }
  return zip.generateAsync({
    type: "nodebuffer",
    compression: "DEFLATE",
    compressionOptions: { level: 9 },
    platform: "DOS",
    streamFiles: false,
  });
}

/** SHA256SUMS in coreutils format: "<hex>  <path>" (two spaces = binary-safe text mode), sorted by path. */
export function sha256sums(files: readonly BundleFile[]): string {
  return [...files]
    .sort((a, b) => comparePaths(a.path, b.path))
    .map((f) => `${sha256Hex(f.bytes)}  ${f.path}\n`)
    .join("");
}
