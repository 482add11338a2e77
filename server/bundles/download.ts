/**
 * Serving a stored bundle: the bytes are checked against the SHA-256 stored at release time before a
 * single byte leaves the server (once per stored row version, by PostgreSQL), then streamed. A mismatch
 * is refused loudly (500 bundle_corrupt) and audited; a good download is audited as `release.download`
 * with who (user or token) and from where.
 */
import type { Request, Response } from "express";
import { createHash } from "node:crypto";
import { once } from "node:events";
import type { Release } from "../../shared/schemas/releases";
import type { Db } from "../db/client";
import { HttpError } from "../http/errors";
import { poolOf } from "../jobs/queue";
import { recordAudit, type AuditActor } from "../services/audit";

/** The error code of a bundle whose bytes no longer match their stored SHA-256. */
export const BUNDLE_CORRUPT = "bundle_corrupt";

/** The actor of a download: a person with a session, or a script with a token (kind "token"). */
export function downloadActor(req: Request): AuditActor {
  return { kind: req.apiToken ? "token" : "user", userId: req.user?.id ?? null, ip: req.ip ?? null };
}

/** `<project>-<design>-<version>.zip` with anything outside [A-Za-z0-9._-] turned into "-". */
export function bundleFileName(r: Pick<Release, "projectSlug" | "designName" | "version">): string {
  const safe = (s: string) => s.replace(/[^A-Za-z0-9._-]+/g, "-").replace(/^-+|-+$/g, "");
  return `${safe(r.projectSlug)}-${safe(r.designName)}-${safe(r.version)}.zip`;
}

/** Bytes read from the database per query while streaming. */
export const DOWNLOAD_CHUNK_BYTES = 1024 * 1024;

/** A verified bundle is hashed again after this long, or at once if its row changed (a new row version). */
export const REVERIFY_AFTER_MS = 24 * 60 * 60 * 1000;

// Release id → the row version (xmin) whose bytes were hashed, and when. Any UPDATE of the row, even one
// made with the immutability trigger switched off, gives it a new xmin and so forces a new check.
const verified = new Map<number, { xmin: string; at: number }>();

interface StoredMeta {
  sha256: string;
  size: number;
  xmin: string;
}

async function storedMeta(db: Db, releaseId: number): Promise<StoredMeta> {
  const r = await poolOf(db).query<{ sha256: string | null; size: number | null; xmin: string }>(
    "select bundle_sha256 as sha256, octet_length(bundle) as size, xmin::text as xmin from releases where id = $1",
    [releaseId],
  );
  const row = r.rows[0];
  if (!row?.sha256 || row.size === null)
    throw new HttpError("not_found", "This release has no stored bundle");
  return { sha256: row.sha256, size: Number(row.size), xmin: row.xmin };
}

/** SHA-256 of the stored bytes, computed by PostgreSQL (no copy of the blob reaches this process). */
async function storedDigest(db: Db, releaseId: number): Promise<string> {
  const r = await poolOf(db).query<{ actual: string }>(
    "select encode(sha256(bundle), 'hex') as actual from releases where id = $1",
    [releaseId],
  );
  return r.rows[0]?.actual ?? "";
}

async function chunk(db: Db, releaseId: number, offset: number, length: number): Promise<Buffer> {
  // substring on bytea counts from 1; with EXTERNAL storage PostgreSQL reads only the TOAST chunks needed.
  const r = await poolOf(db).query<{ part: Buffer }>(
    "select substring(bundle from $2::int for $3::int) as part from releases where id = $1",
    [releaseId, offset + 1, length],
  );
  return r.rows[0]?.part ?? Buffer.alloc(0);
}

/** One satisfiable byte range of a `Range: bytes=…` header, "none" to send it all, or "bad" for 416. */
export function parseRange(
  header: string | undefined,
  size: number,
): { start: number; end: number } | "none" | "bad" {
  if (!header) return "none";
  const m = /^bytes=(\d*)-(\d*)$/.exec(header.trim());
  if (!m) return header.includes(",") ? "none" : "bad"; // several ranges: the whole body (RFC 9110 §14.2)
  const [, a, b] = m;
  if (a === "" && b === "") return "bad";
  let start: number;
  let end: number;
  if (a === "") {
    const suffix = Number(b);
    if (suffix === 0) return "bad";
    start = Math.max(0, size - suffix);
    end = size - 1;
  } else {
    start = Number(a);
    end = b === "" ? size - 1 : Math.min(Number(b), size - 1);
  }
  if (!Number.isSafeInteger(start) || !Number.isSafeInteger(end) || start > end || start >= size)
    return "bad";
  return { start, end };
}

function etagMatches(header: string | undefined, etag: string): boolean {
  if (!header) return false;
  return header.split(",").some((t) => {
    const v = t.trim().replace(/^W\//, "");
    return v === "*" || v === etag;
  });
}

async function refuseCorrupt(
  db: Db,
  req: Request,
  release: Release,
  stored: string,
  actual: string,
  size: number,
): Promise<void> {
  await recordAudit(db, {
    actor: downloadActor(req),
    action: "release.bundle-corrupt",
    projectId: release.projectId,
    subjectType: "release",
    subjectId: release.id,
    summary: `Refused to serve ${release.designName} ${release.version}: its bundle no longer matches its SHA-256`,
    details: { version: release.version, storedSha256: stored, actualSha256: actual, size },
  });
  req.log?.error({ releaseId: release.id, stored, actual }, "stored bundle does not match its SHA-256");
}

/**
 * Answer with the release's zip, streamed from the database in DOWNLOAD_CHUNK_BYTES pieces: ETag (the
 * SHA-256), If-None-Match (304), Range and If-Range (206, 416), HEAD. The bytes are checked against the
 * stored SHA-256 by PostgreSQL when a row version is first served (and daily); a mismatch is 500
 * bundle_corrupt, audited. A whole-body download is also hashed as it streams: if the bytes changed
 * underneath, the last piece is withheld and the connection cut, so no client receives a wrong file whole.
 */
export async function sendBundle(db: Db, req: Request, res: Response, release: Release): Promise<void> {
  const meta = await storedMeta(db, release.id);
  const { sha256: stored, size } = meta;
  const seen = verified.get(release.id);
  if (!seen || seen.xmin !== meta.xmin || Date.now() - seen.at > REVERIFY_AFTER_MS) {
    const actual = await storedDigest(db, release.id);
    if (actual !== stored) {
      verified.delete(release.id);
      await refuseCorrupt(db, req, release, stored, actual, size);
      res.status(500).json({
        error: {
          code: BUNDLE_CORRUPT,
          message: `The stored bundle of ${release.designName} ${release.version} does not match its recorded SHA-256; it was not served. Tell an administrator.`,
          details: { storedSha256: stored, actualSha256: actual },
        },
      });
      return;
    }
    verified.set(release.id, { xmin: meta.xmin, at: Date.now() });
  }

  const etag = `"${stored}"`;
  res.setHeader("ETag", etag);
  res.setHeader("Accept-Ranges", "bytes");
  // The bytes never change, but withdrawal and membership do: let clients keep it, not shared caches.
  res.setHeader("Cache-Control", "private, no-transform");
  // RFC 9530 digest of the whole representation, plus a plain hex copy that shell scripts can compare directly.
  res.setHeader("Repr-Digest", `sha-256=:${Buffer.from(stored, "hex").toString("base64")}:`);
  res.setHeader("X-Bundle-Sha256", stored);
  if (etagMatches(req.get("If-None-Match"), etag)) {
    res.status(304).end();
    return;
  }
  const ifRange = req.get("If-Range");
  const range =
    ifRange !== undefined && ifRange.trim() !== etag ? "none" : parseRange(req.get("Range"), size);
  if (range === "bad") {
    res.setHeader("Content-Range", `bytes */${size}`);
    res.status(416).json({
      error: { code: "bad_request", message: `The requested range is not within the bundle's ${size} bytes` },
    });
    return;
  }
  const whole = range === "none";
  const start = whole ? 0 : range.start;
  const end = whole ? size - 1 : range.end;

  await recordAudit(db, {
    actor: downloadActor(req),
    action: "release.download",
    projectId: release.projectId,
    subjectType: "release",
    subjectId: release.id,
    summary: `Downloaded ${release.projectSlug}/${release.designName} ${release.version}${req.apiToken ? ` with token ${req.apiToken.prefix}…` : ""}${whole ? "" : ` (bytes ${start}–${end})`}`,
    details: {
      version: release.version,
      sha256: stored,
      size,
      tokenId: req.apiToken?.id ?? null,
      ...(whole ? {} : { range: { start, end } }),
    },
  });
  res.setHeader("Content-Type", "application/zip");
  res.setHeader("Content-Disposition", `attachment; filename="${bundleFileName(release)}"`);
  res.setHeader("Content-Length", String(end - start + 1));
  if (!whole) res.setHeader("Content-Range", `bytes ${start}-${end}/${size}`);
  res.status(whole ? 200 : 206);
  if (req.method === "HEAD") {
    res.end();
    return;
  }
  const hash = whole ? createHash("sha256") : null;
  for (let at = start; at <= end; at += DOWNLOAD_CHUNK_BYTES) {
    const piece = await chunk(db, release.id, at, Math.min(DOWNLOAD_CHUNK_BYTES, end - at + 1));
    hash?.update(piece);
    const last = at + DOWNLOAD_CHUNK_BYTES > end;
    if (last && hash) {
      const actual = hash.digest("hex");
      if (actual !== stored) {
        verified.delete(release.id);
        await refuseCorrupt(db, req, release, stored, actual, size);
        res.destroy(new Error("bundle bytes changed while streaming"));
        return;
      }
    }
    if (res.destroyed) return;
    if (!res.write(piece)) await once(res, "drain");
  }
  res.end();
}
