import { sql } from "drizzle-orm";
import type { Health } from "../../shared/schemas/health";
import type { Db } from "../db/client";

const startedAt = Date.now();

/** Ask the database for a round trip and report how long it took. */
export async function checkHealth(db: Db, version: string): Promise<Health> {
  const t0 = performance.now();
  let database: Health["database"];
  try {
    await db.execute(sql`select 1`);
    database = { ok: true, latencyMs: Math.round((performance.now() - t0) * 100) / 100 };
  } catch (err) {
    database = { ok: false, latencyMs: null, error: err instanceof Error ? err.message : String(err) };
  }
  return {
    status: database.ok ? "ok" : "degraded",
    version,
    database,
    uptimeSeconds: Math.round((Date.now() - startedAt) / 1000),
  };
}
