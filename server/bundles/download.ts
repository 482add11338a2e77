/**
 * Serving a stored bundle: the bytes are checked against the SHA-256 stored at release time before a
 * single byte leaves the server. A mismatch is refused loudly (500 bundle_corrupt) and audited; a good
 * download is audited as `release.download` with who (user or token) and from where.
 */
import { eq } from "drizzle-orm";
import type { Request, Response } from "express";
import type { Release } from "../../shared/schemas/releases";
import type { Db } from "../db/client";
import { releases } from "../db/schema";
import { HttpError } from "../http/errors";
import { recordAudit, type AuditActor } from "../services/audit";
import { sha256Hex } from "./zip";

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

/** The stored bundle of a release, verified; throws HttpError 404 when none was stored. */
async function storedBundle(
  db: Db,
  releaseId: number,
): Promise<{ bytes: Buffer; stored: string; actual: string }> {
  const [row] = await db
    .select({ bundle: releases.bundle, sha256: releases.bundleSha256 })
    .from(releases)
    .where(eq(releases.id, releaseId));
  if (!row?.bundle || !row.sha256) throw new HttpError("not_found", "This release has no stored bundle");
  return { bytes: row.bundle, stored: row.sha256, actual: sha256Hex(row.bundle) };
}

/** Answer with the release's zip after checking it, or with 500 bundle_corrupt; both are audited. */
export async function sendBundle(db: Db, req: Request, res: Response, release: Release): Promise<void> {
  const { bytes, stored, actual } = await storedBundle(db, release.id);
  const actor = downloadActor(req);
  const subject = { projectId: release.projectId, subjectType: "release", subjectId: release.id };
  if (actual !== stored) {
    await recordAudit(db, {
      actor,
      action: "release.bundle-corrupt",
      ...subject,
      summary: `Refused to serve ${release.designName} ${release.version}: its bundle no longer matches its SHA-256`,
      details: {
        version: release.version,
        storedSha256: stored,
        actualSha256: actual,
        size: bytes.byteLength,
      },
    });
    req.log?.error({ releaseId: release.id, stored, actual }, "stored bundle does not match its SHA-256");
    res.status(500).json({
      error: {
        code: BUNDLE_CORRUPT,
        message: `The stored bundle of ${release.designName} ${release.version} does not match its recorded SHA-256; it was not served. Tell an administrator.`,
        details: { storedSha256: stored, actualSha256: actual },
      },
    });
    return;
  }
  await recordAudit(db, {
    actor,
    action: "release.download",
    ...subject,
    summary: `Downloaded ${release.projectSlug}/${release.designName} ${release.version}${req.apiToken ? ` with token ${req.apiToken.prefix}…` : ""}`,
    details: {
      version: release.version,
      sha256: stored,
      size: bytes.byteLength,
      tokenId: req.apiToken?.id ?? null,
    },
  });
  res.setHeader("Content-Type", "application/zip");
  res.setHeader("Content-Disposition", `attachment; filename="${bundleFileName(release)}"`);
  res.setHeader("Content-Length", String(bytes.byteLength));
  // RFC 9530 digest of the bytes as sent, plus a plain hex copy that shell scripts can compare directly.
  res.setHeader("Repr-Digest", `sha-256=:${Buffer.from(stored, "hex").toString("base64")}:`);
  res.setHeader("X-Bundle-Sha256", stored);
  res.setHeader("ETag", `"${stored}"`);
  // The bytes never change, but withdrawal and membership do: let clients keep it, not shared caches.
  res.setHeader("Cache-Control", "private, no-transform");
  res.end(bytes);
}
