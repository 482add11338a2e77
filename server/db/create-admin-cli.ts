// The first admin of a production database: `npm run create-admin -- --username NAME --name "Full Name" --email
// ADDRESS` (DATABASE_URL from the environment). Applies pending migrations, creates an active admin with a random
// temporary password, prints it once (it is stored only as a bcrypt hash) and exits; the first sign-in must change it.
// Never seeds demo data. Exit status: 0 created, 1 refused (bad input, a taken user name), 2 usage.
import { parseArgs } from "node:util";
import { z } from "zod";
import { CreateUserSchema } from "../../shared/schemas/users";
import { HttpError } from "../http/errors";
import { createUser } from "../services/users";
import { openDatabase, runMigrations } from "./client";

const USAGE =
  'usage: npm run create-admin -- --username NAME --name "Full Name" --email ADDRESS   (DATABASE_URL must be set)\n';

let values: { username?: string; name?: string; email?: string };
try {
  ({ values } = parseArgs({
    options: { username: { type: "string" }, name: { type: "string" }, email: { type: "string" } },
    strict: true,
  }));
} catch (err) {
  process.stderr.write(`create-admin: ${(err as Error).message}\n${USAGE}`);
  process.exit(2);
}
const databaseUrl = z.string().min(1).safeParse(process.env.DATABASE_URL);
if (!databaseUrl.success) {
  process.stderr.write(`create-admin: DATABASE_URL is not set\n${USAGE}`);
  process.exit(2);
}
const input = CreateUserSchema.safeParse({
  username: values.username,
  displayName: values.name,
  email: values.email,
  roles: ["admin"],
});
if (!input.success) {
  const lines = input.error.issues.map((i) => {
    const flag = { username: "--username", displayName: "--name", email: "--email" }[String(i.path[0])];
    return `  ${flag ?? i.path.join(".")}: ${i.message}`;
  });
  process.stderr.write(`create-admin: invalid arguments:\n${lines.join("\n")}\n${USAGE}`);
  process.exit(2);
}

const database = openDatabase(databaseUrl.data, 2);
let status = 0;
try {
  await runMigrations(database.db);
  const { user, temporaryPassword } = await createUser(database.db, input.data);
  process.stdout.write(
    [
      `Created admin ${user.username} (${user.displayName}, ${user.email}).`,
      `Temporary password: ${temporaryPassword}`,
      "It is shown only now. Sign in with it and choose a new password (the first sign-in asks for one).",
      "",
    ].join("\n"),
  );
} catch (err) {
  status = 1;
  const message =
    err instanceof HttpError && Array.isArray(err.details)
      ? (err.details as { path: unknown[]; message: string }[])
          .map((d) => `${d.path.join(".")}: ${d.message}`)
          .join("; ")
      : err instanceof Error
        ? err.message
        : String(err);
  process.stderr.write(`create-admin: not created: ${message}\n`);
} finally {
  await database.pool.end();
}
process.exit(status);
