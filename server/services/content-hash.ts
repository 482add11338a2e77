/**
 * The content hash fixed at submission: SHA-256 over a canonical serialization of the revision content and
 * each table's role, sample rate, complex flag and values SHA-256. Canonical = JSON with object keys sorted
 * by UTF-16 code units and no white space, numbers in ECMAScript's shortest round-trip form (the same rules
 * as RFC 8785, "JSON Canonicalization Scheme", 2020, §3.2 for the values we store).
 */
import { createHash } from "node:crypto";

/** Sorted-key, white-space-free JSON; undefined object members are left out, non-finite numbers refused. */
export function canonicalJson(value: unknown): string {
  if (value === null) return "null";
  switch (typeof value) {
    case "number":
      if (!Number.isFinite(value)) throw new RangeError(`cannot serialize ${value} canonically`);
      return JSON.stringify(value);
    case "string":
    case "boolean":
      return JSON.stringify(value);
    case "object": {
      if (Array.isArray(value))
        return `[${value.map((v) => canonicalJson(v === undefined ? null : v)).join(",")}]`;
      const entries = Object.entries(value as Record<string, unknown>)
        .filter(([, v]) => v !== undefined)
        .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
      return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${canonicalJson(v)}`).join(",")}}`;
    }
    default:
      throw new TypeError(`cannot serialize a ${typeof value} canonically`);
  }
}

/** What of a table enters the hash. */
export interface HashedTable {
  role: string;
  position: number;
  sampleRateHz: number;
  complex: boolean;
  valuesSha256: string;
}

/** The canonical text that is hashed (exported so tests and the bundle docs can show it). */
export function contentHashInput(content: unknown, tables: HashedTable[]): string {
  const ordered = [...tables]
    .sort((a, b) => a.position - b.position)
    .map((t) => ({
      role: t.role,
      sampleRateHz: t.sampleRateHz,
      complex: t.complex,
      valuesSha256: t.valuesSha256,
    }));
  return canonicalJson({ content, tables: ordered });
}

/** SHA-256 (hex) of contentHashInput. */
export function contentHash(content: unknown, tables: HashedTable[]): string {
  return createHash("sha256").update(contentHashInput(content, tables), "utf8").digest("hex");
}
