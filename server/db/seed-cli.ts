// Seed the demo data: `node --import tsx server/db/seed-cli.ts [--migrate] [--no-lifecycle]` (DATABASE_URL from
// the environment). Without --no-lifecycle the demo designs are also analysed, reviewed and released.
import { env } from "../env";
import { openDatabase, runMigrations } from "./client";
import { seedDemo } from "./seed";
import { seedDemoLifecycle } from "./seed-lifecycle";

const database = openDatabase(env().DATABASE_URL, 2);
try {
  if (process.argv.includes("--migrate")) await runMigrations(database.db);
  await seedDemo(database.db);
  if (!process.argv.includes("--no-lifecycle")) await seedDemoLifecycle(database.db);
  process.stdout.write("Demo data seeded.\n");
} finally {
  await database.pool.end();
}
