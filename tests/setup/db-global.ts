// Vitest global setup for API and end-to-end tests: build one migrated, demo-seeded template database that each
// test file clones (tests/setup/test-db.ts), so files never share rows.
import { openDatabase, runMigrations } from "../../server/db/client";
import { seedDemo } from "../../server/db/seed";
import { TEMPLATE_DATABASE, clusterUrl, urlForDatabase, withAdminClient } from "./test-db";

const ONCE = Symbol.for("tapwright.templateReady");
type Holder = { [ONCE]?: Promise<void> };

/** Recreate and migrate the template database (once per vitest run, though two projects list this file). */
export default function setup(): Promise<void> {
  const holder = globalThis as Holder;
  holder[ONCE] ??= buildTemplate();
  return holder[ONCE];
}

async function buildTemplate(): Promise<void> {
  // Dropped and created as the cluster's superuser (tests/setup/test-db.ts), owned by the test role.
  const owner = new URL(clusterUrl()).username || "tapwright";
  await withAdminClient(async (c) => {
    await c.query(`drop database if exists "${TEMPLATE_DATABASE}" with (force)`);
    await c.query(`create database "${TEMPLATE_DATABASE}" owner "${owner}"`);
  });
  const database = openDatabase(urlForDatabase(clusterUrl(), TEMPLATE_DATABASE), 1);
  try {
    await runMigrations(database.db);
    // Seeded once here: bcrypt at cost 12 costs about a second per hash, too much to repeat per file.
    await seedDemo(database.db);
  } finally {
    // No connection may stay open on a template, or cloning it fails.
    await database.pool.end();
  }
  // Nothing connects to the template from here on (autovacuum included), so cloning never finds it busy.
  await withAdminClient((c) => c.query(`alter database "${TEMPLATE_DATABASE}" allow_connections false`));
}
