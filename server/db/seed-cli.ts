// Seed the demo data: `node --import tsx server/db/seed-cli.ts [--migrate]` (DATABASE_URL from the environment).
import { env } from "../env";
import { openDatabase, runMigrations } from "./client";
import { seedDemo } from "./seed";

const database = openDatabase(env().DATABASE_URL, 2);
try {
  if (process.argv.includes("--migrate")) await runMigrations(database.db);
  await seedDemo(database.db);
  process.stdout.write("Demo data seeded.\n");
} finally {
  await database.pool.end();
}
