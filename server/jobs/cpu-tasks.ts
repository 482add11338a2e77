/**
 * The CPU-heavy pieces of request handling, run in worker threads by server/jobs/cpu-pool.ts so the event
 * loop that answers requests never waits on them: coefficient parsing, bcrypt, template previews and
 * release bundle builds. Each task takes and returns structured-cloneable values.
 */
import bcrypt from "bcryptjs";
import { parseCoefficients, type ParsedCoefficients } from "../../shared/coefficients/parse";
import type { SampleKind } from "../../shared/exports/sample-kinds";
import type { BuildReleaseInput, BuiltBundle } from "../bundles/build";
import type { RevisionContent } from "../../shared/schemas/designs";
import type { Database } from "../db/client";
import type { MaterializedTable, ParsedUpload } from "../services/materialize";
import type { PreviewResult } from "../../shared/exports/schemas";

/** A one-build connection (closed after the build, so nothing holds the database between builds). */
async function withDatabase<T>(url: string, fn: (db: Database["db"]) => Promise<T>): Promise<T> {
  const { openDatabase } = await import("../db/client");
  const d = openDatabase(url, 1);
  try {
    return await fn(d.db);
  } finally {
    await d.pool.end();
  }
}

/** Every task a CPU thread runs, by name. */
export const cpuTasks = {
  async materialize(a: { content: RevisionContent; uploads: ParsedUpload[] }): Promise<MaterializedTable[]> {
    const { materialize } = await import("../services/materialize");
    const byId = new Map(a.uploads.map((u) => [u.id, u]));
    return materialize(a.content, (id) => byId.get(id));
  },
  parseCoefficients(a: { bytes: Uint8Array; fileName: string }): ParsedCoefficients {
    return parseCoefficients(a.bytes, { fileName: a.fileName });
  },
  hashPassword(a: { password: string; cost: number }): string {
    return bcrypt.hashSync(a.password, a.cost);
  },
  comparePassword(a: { password: string; hash: string }): boolean {
    return bcrypt.compareSync(a.password, a.hash);
  },
  async previewTemplate(a: { body: string; sample: SampleKind }): Promise<PreviewResult> {
    const { renderPreview } = await import("../exports/render");
    return renderPreview(a.body, a.sample);
  },
  async buildBundle(a: { databaseUrl: string; input: BuildReleaseInput }): Promise<BuiltBundle> {
    const { buildReleaseBundle, BundleBuildError } = await import("../bundles/build");
    const { oversizedFiles } = await import("../bundles/limits");
    const built = await withDatabase(a.databaseUrl, (db) => buildReleaseBundle(db, a.input));
    const tooBig = oversizedFiles(built.manifest.files);
    if (tooBig) throw new BundleBuildError(tooBig);
    return built;
  },
};

/** The task table's type, for the pool's typed `run`. */
export type CpuTasks = typeof cpuTasks;
