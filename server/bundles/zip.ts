/**
 * Deterministic zip: files in byte order of their paths, one fixed timestamp, DEFLATE level 9, no
 * directory entries, DOS platform (no Unix extra fields or permissions), no comment. The DOS time comes
 * from the UTC fields of the date, so the bytes do not depend on the server's time zone.
 */
import { createHash } from "node:crypto";
import { crc32, deflateRawSync } from "node:zlib";

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

const u16 = (v: number) => {
  const b = Buffer.alloc(2);
  b.writeUInt16LE(v);
  return b;
};
const u32 = (v: number) => {
  const b = Buffer.alloc(4);
  b.writeUInt32LE(v >>> 0);
  return b;
};

/** MS-DOS time and date words of a UTC instant (APPNOTE.TXT 4.4.6: 2-second resolution, years from 1980). */
function dosTimeDate(at: Date): { time: number; date: number } {
  return {
    time: (at.getUTCHours() << 11) | (at.getUTCMinutes() << 5) | Math.floor(at.getUTCSeconds() / 2),
    date: ((at.getUTCFullYear() - 1980) << 9) | ((at.getUTCMonth() + 1) << 5) | at.getUTCDate(),
  };
}

/**
 * Zip the files deterministically: same files and date → same bytes. Written here to PKWARE's APPNOTE.TXT
 * (6.3.x) with Node's native zlib (raw DEFLATE, level 9) and CRC-32: local headers, data, central directory,
 * end record; version 2.0, MS-DOS platform, no extra fields, no data descriptors, no comment. Native zlib
 * compresses tens of MiB in about a second, where a JavaScript DEFLATE took most of a long release's build.
 */
export async function zipFiles(files: readonly BundleFile[], date: Date): Promise<Buffer> {
  const sorted = [...files].sort((a, b) => comparePaths(a.path, b.path));
  const { time, date: day } = dosTimeDate(zipDate(date));
  const parts: Buffer[] = [];
  const central: Buffer[] = [];
  let offset = 0;
  for (let i = 0; i < sorted.length; i++) {
    const f = sorted[i]!;
    checkBundlePath(f.path);
    if (i > 0 && sorted[i - 1]!.path === f.path) throw new RangeError(`duplicate bundle path: ${f.path}`);
    const name = Buffer.from(f.path, "ascii");
    const data = deflateRawSync(f.bytes, { level: 9 });
    const crc = crc32(f.bytes);
    if (f.bytes.byteLength >= 0xffffffff || data.byteLength >= 0xffffffff || offset >= 0xffffffff)
      throw new RangeError(`${f.path}: a bundle file or the bundle is too large for a zip without ZIP64`);
    // version needed, flags, method 8 (DEFLATE), time, date, CRC-32, sizes, name length, extra length.
    const common = [
      u16(20),
      u16(0),
      u16(8),
      u16(time),
      u16(day),
      u32(crc),
      u32(data.byteLength),
      u32(f.bytes.byteLength),
      u16(name.byteLength),
      u16(0),
    ];
    const local = Buffer.concat([u32(0x04034b50), ...common, name]);
    central.push(
      Buffer.concat([u32(0x02014b50), u16(20), ...common, u16(0), u16(0), u16(0), u32(0), u32(offset), name]),
    );
    parts.push(local, data);
    offset += local.byteLength + data.byteLength;
  }
  if (sorted.length > 0xffff) throw new RangeError("too many files for a zip without ZIP64");
  const cd = Buffer.concat(central);
  const end = Buffer.concat([
    u32(0x06054b50),
    u16(0),
    u16(0),
    u16(sorted.length),
    u16(sorted.length),
    u32(cd.byteLength),
    u32(offset),
    u16(0),
  ]);
  return Buffer.concat([...parts, cd, end]);
}

/** SHA256SUMS in coreutils format: "<hex>  <path>" (two spaces = binary-safe text mode), sorted by path. */
export function sha256sums(files: readonly BundleFile[]): string {
  return [...files]
    .sort((a, b) => comparePaths(a.path, b.path))
    .map((f) => `${sha256Hex(f.bytes)}  ${f.path}\n`)
    .join("");
}
