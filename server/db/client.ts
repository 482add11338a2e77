import { drizzle, type NodePgDatabase } from "drizzle-orm/node-postgres";
import { migrate } from "drizzle-orm/node-postgres/migrator";
import { fileURLToPath } from "node:url";
import pg from "pg";
import * as schema from "./schema";

/** The typed database handle used by services. */
export type Db = NodePgDatabase<typeof schema>;

/** A pool plus its Drizzle handle; close the pool on shutdown. */
export interface Database {
  pool: pg.Pool;
  db: Db;
}

/** Open a connection pool to the given PostgreSQL URL. */
export function openDatabase(url: string, max = 10): Database {
  const pool = new pg.Pool({ connectionString: url, max });
  // An idle client losing its connection must not crash the process; the next query reconnects.
  pool.on("error", () => undefined);
  return { pool, db: drizzle(pool, { schema }) };
}

/** The folder of generated SQL migrations (drizzle/), independent of the working directory. */
export const MIGRATIONS_FOLDER = fileURLToPath(new URL("../../drizzle", import.meta.url));

/** Apply every pending migration from drizzle/. */
export async function runMigrations(db: Db): Promise<void> {
  await migrate(db, { migrationsFolder: MIGRATIONS_FOLDER });
}
