/**
 * The CPU-heavy pieces of request handling, run in worker threads by server/jobs/cpu-pool.ts so the event
 * loop that answers requests never waits on them: coefficient parsing, bcrypt, template previews and
 * release bundle builds. Each task takes and returns structured-cloneable values.
 */
import bcrypt from "bcryptjs";
import { parseCoefficients, type ParsedCoefficients } from "../../shared/coefficients/parse";
import type { SampleKind } from "../../shared/exports/sample-kinds";
import type { BuildReleaseInput, BuiltBundle } from "../bundles/build";
import type { Database } from "../db/client";
import type { PreviewResult } from "../../shared/exports/schemas";

const databases = new Map<string, Database>();

/** This thread's own small pool for a database URL (bundle builds read the revision through it). */
async function databaseFor(url: string): Promise<Database> {
  let d = databases.get(url);
  if (!d) {
    const { openDatabase } = await import("../db/client");
    d = openDatabase(url, 2);
    databases.set(url, d);
  }
  return d;
}

/** Every task a CPU thread runs, by name. */
export const cpuTasks = {
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
    const { buildReleaseBundle } = await import("../bundles/build");
    const { db } = await databaseFor(a.databaseUrl);
    return buildReleaseBundle(db, a.input);
  },
};

/** The task table's type, for the pool's typed `run`. */
export type CpuTasks = typeof cpuTasks;
