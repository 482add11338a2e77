import { randomBytes } from "node:crypto";
import pg from "pg";

/** The migrated database every test database is cloned from (made by db-global.ts). */
export const TEMPLATE_DATABASE = "tapwright_template";

/** DATABASE_URL of the throwaway cluster (scripts/test.mjs sets it). */
export function clusterUrl(): string {
  const url = process.env.DATABASE_URL;
  if (!url)
    throw new Error(
      "DATABASE_URL is not set: run tests through `npm test`, or start a test cluster (see DEVELOPERS.md)",
    );
  return url;
}

/** The same server URL pointing at another database. */
export function urlForDatabase(url: string, database: string): string {
  const u = new URL(url);
  u.pathname = `/${database}`;
  return u.toString();
}

/**
 * The connection that creates and drops test databases: the cluster's superuser when scripts/test.mjs provides it
 * (TAPWRIGHT_TEST_ADMIN_URL). Only a superuser (or a member of pg_signal_backend, which scripts/pg.sh grants the
 * test role) may end the autovacuum worker that DROP DATABASE ... WITH (FORCE) can meet inside the database.
 */
function adminUrl(): string {
  return process.env.TAPWRIGHT_TEST_ADMIN_URL ?? clusterUrl();
}

/** Run statements on the cluster's maintenance connection (CREATE/DROP DATABASE cannot run in a pool transaction). */
export async function withAdminClient<T>(fn: (client: pg.Client) => Promise<T>): Promise<T> {
  const client = new pg.Client({ connectionString: adminUrl() });
  await client.connect();
  try {
    return await fn(client);
  } finally {
    await client.end();
  }
}

/** Clone the migrated template into a uniquely named database, one per test file. */
export async function createTestDatabase(): Promise<{ url: string; drop(): Promise<void> }> {
  const name = `tapwright_t_${process.pid}_${randomBytes(4).toString("hex")}`;
  // Names are generated here from [a-z0-9_] only, so quoting them inline is safe.
  // Owned by the test role, as if it had created it: the app's own statements (triggers, grants) run as that role.
  const owner = new URL(clusterUrl()).username || "tapwright";
  await withAdminClient((c) =>
    c.query(`create database "${name}" template "${TEMPLATE_DATABASE}" owner "${owner}"`),
  );
  return {
    url: urlForDatabase(clusterUrl(), name),
    drop: () =>
      withAdminClient((c) => c.query(`drop database if exists "${name}" with (force)`)).then(() => undefined),
  };
}

/** An empty database (no tables, no demo rows), for tests of a first start; drop() removes it. */
export async function createEmptyDatabase(): Promise<{ url: string; drop(): Promise<void> }> {
  const name = `tapwright_e_${process.pid}_${randomBytes(4).toString("hex")}`;
  const owner = new URL(clusterUrl()).username || "tapwright";
  await withAdminClient((c) => c.query(`create database "${name}" owner "${owner}"`));
  return {
    url: urlForDatabase(clusterUrl(), name),
    drop: () =>
      withAdminClient((c) => c.query(`drop database if exists "${name}" with (force)`)).then(() => undefined),
  };
}
