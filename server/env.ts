import { readFileSync } from "node:fs";
import { z } from "zod";

/** Version from package.json, read once so /api/health can report what is running. */
function packageVersion(): string {
  try {
    const pkg = JSON.parse(readFileSync(new URL("../package.json", import.meta.url), "utf8")) as {
      version?: string;
    };
    return pkg.version ?? "0.0.0";
  } catch {
    return "0.0.0";
  }
}

// "true"/"false"/"1"/"0" as environment variables spell booleans.
const flag = z.enum(["true", "false", "1", "0"]).transform((v) => v === "true" || v === "1");

const EnvSchema = z
  .object({
    NODE_ENV: z.enum(["development", "test", "production"]).default("development"),
    DATABASE_URL: z.string().min(1, "DATABASE_URL is required (npm start sets it from scripts/pg.sh)"),
    PORT: z.coerce.number().int().min(0).max(65535).default(3000),
    HOST: z.string().default("127.0.0.1"),
    SESSION_SECRET: z.string().min(16, "at least 16 characters").optional(),
    LOG_LEVEL: z.enum(["fatal", "error", "warn", "info", "debug", "trace", "silent"]).default("info"),
    CLIENT_DIST: z.string().default("dist/client"),
    TAPWRIGHT_VERSION: z.string().default(packageVersion()),
    // Mail (issue 6). Without SMTP_HOST, mail goes to the local sink on 127.0.0.1:MAIL_SINK_PORT.
    // Default: this server's own address, so links in mail follow PORT (see the transform below).
    PUBLIC_URL: z.url().optional(),
    SMTP_HOST: z.string().min(1).optional(),
    SMTP_PORT: z.coerce.number().int().min(1).max(65535).optional(),
    SMTP_SECURE: flag.default(false),
    SMTP_USER: z.string().min(1).optional(),
    SMTP_PASS: z.string().min(1).optional(),
    MAIL_FROM: z.string().min(3).default("Tapwright <tapwright@localhost>"),
    MAIL_SINK: z.enum(["on", "off"]).optional(),
    // Default 2525; 0 (a free port) under NODE_ENV=test so parallel runs never collide.
    MAIL_SINK_PORT: z.coerce.number().int().min(0).max(65535).optional(),
    MAIL_DISPATCH: z.enum(["on", "off"]).default("on"),
    MAIL_MAX_ATTEMPTS: z.coerce.number().int().min(1).max(50).default(8),
  })
  .refine((e) => e.NODE_ENV !== "production" || e.SMTP_HOST !== undefined || e.MAIL_SINK === "on", {
    path: ["SMTP_HOST"],
    message: "SMTP_HOST is required in production (or set MAIL_SINK=on to keep mail on this host)",
  })
  .refine((e) => e.NODE_ENV !== "production" || e.SESSION_SECRET !== undefined, {
    path: ["SESSION_SECRET"],
    message: "SESSION_SECRET is required in production",
  })
  .transform((e) => {
    if (e.PUBLIC_URL !== undefined) return { ...e, PUBLIC_URL: e.PUBLIC_URL };
    // A wildcard bind address is not one a browser can open: name the loopback instead.
    const host = e.HOST === "0.0.0.0" || e.HOST === "::" ? "127.0.0.1" : e.HOST;
    const h = host.includes(":") ? `[${host}]` : host;
    return { ...e, PUBLIC_URL: `http://${h}:${e.PORT}` };
  });

/** The validated server environment. */
export type Env = z.infer<typeof EnvSchema>;

/** Parse an environment object; throws with every problem listed. */
export function parseEnv(source: NodeJS.ProcessEnv): Env {
  const result = EnvSchema.safeParse(source);
  if (!result.success) {
    const lines = result.error.issues.map((i) => `  ${i.path.join(".")}: ${i.message}`).join("\n");
    throw new Error(`Invalid server environment:\n${lines}`);
  }
  return result.data;
}

let cached: Env | undefined;
/** The process environment, validated on first use; the only reader of process.env in the server. */
export function env(): Env {
  cached ??= parseEnv(process.env);
  return cached;
}
