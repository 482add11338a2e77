/**
 * Where release bundles are built: the bundle lane of the CPU pool (one worker thread, its own database
 * connection), never the request thread. Each user may have one build waiting or running at a time, and
 * the lane holds at most MAX_QUEUED_BUNDLE_BUILDS; beyond that the answer is 429 with a clear message.
 */
import { eq, max } from "drizzle-orm";
import type pg from "pg";
import type { Db } from "../db/client";
import { coefficientTables } from "../db/schema";
import { HttpError } from "../http/errors";
import { cpuPool } from "../jobs/cpu-pool";
import { poolOf } from "../jobs/queue";
import { buildReleaseBundle, BundleBuildError, type BuildReleaseInput, type BuiltBundle } from "./build";
import { oversizedFiles } from "./limits";

/**
 * Bundles whose tables are all at most this long build on the calling thread (tens of milliseconds: a
 * thread's start-up would cost more than the build); longer ones go to the bundle lane.
 */
export const INLINE_BUNDLE_MAX_SAMPLES = 4096;

/** Bundle builds waiting or running in this process, at most. */
export const MAX_QUEUED_BUNDLE_BUILDS = 4;

const building = new Map<number, number>();

/** The connection string behind a Drizzle handle, for the build thread's own pool. */
function databaseUrl(db: Db): string {
  const url = (poolOf(db) as pg.Pool & { options?: { connectionString?: string } }).options?.connectionString;
  if (!url) throw new Error("the database pool has no connection string");
  return url;
}

/** Build a bundle in the bundle lane; a build problem becomes a 409 naming it, nothing is released. */
export async function buildBundleOffThread(
  db: Db,
  userId: number,
  input: BuildReleaseInput,
): Promise<BuiltBundle> {
  const lane = cpuPool().bundle;
  if ((building.get(userId) ?? 0) >= 1)
    throw new HttpError(
      "rate_limited",
      "One of your releases is still being built: wait for it to finish before starting another",
      { reason: "build_in_progress" },
    );
  if (lane.load >= MAX_QUEUED_BUNDLE_BUILDS)
    throw new HttpError(
      "rate_limited",
      `${lane.load} release bundles are being built on this server: try again in a minute`,
      { reason: "build_queue_full" },
    );
  building.set(userId, (building.get(userId) ?? 0) + 1);
  try {
    const [longest] = await db
      .select({ n: max(coefficientTables.length) })
      .from(coefficientTables)
      .where(eq(coefficientTables.revisionId, input.revisionId));
    if ((longest?.n ?? 0) <= INLINE_BUNDLE_MAX_SAMPLES) {
      const built = await buildReleaseBundle(db, input);
      const tooBig = oversizedFiles(built.manifest.files);
      if (tooBig) throw new BundleBuildError(tooBig);
      return built;
    }
    const built = await lane.run("buildBundle", { databaseUrl: databaseUrl(db), input });
    const zip = Buffer.from(built.zip.buffer, built.zip.byteOffset, built.zip.byteLength);
    return { ...built, zip };
  } catch (e) {
    if (e instanceof BundleBuildError)
      throw new HttpError("conflict", `The release bundle could not be built: ${e.message}`, {
        reason: "bundle_build_failed",
      });
    throw e;
  } finally {
    const n = (building.get(userId) ?? 1) - 1;
    if (n > 0) building.set(userId, n);
    else building.delete(userId);
  }
}
