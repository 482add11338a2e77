// Start-up as an operator meets it: a busy port fails at once naming itself, the mail sink falls back to a free
// port, and the production command starts on an empty database without any demo account and refuses to start
// without a session secret; `npm run create-admin` makes the first admin with a temporary password.
import { spawn, spawnSync } from "node:child_process";
import { once } from "node:events";
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { createServer, type Server } from "node:net";
import { tmpdir } from "node:os";
import path from "node:path";
import { fileURLToPath } from "node:url";
import pino from "pino";
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { openDatabase } from "../../server/db/client";
import { parseEnv } from "../../server/env";
import { startMail } from "../../server/mail/runtime";
import { startMailSink } from "../../server/mail/sink";
import { createEmptyDatabase } from "../setup/test-db";
import { useApiTestDatabase } from "./helpers";

const ROOT = fileURLToPath(new URL("../..", import.meta.url));
const t = useApiTestDatabase();

/** Hold a loopback port with a plain TCP server, as another program would. */
async function holdPort(): Promise<{ port: number; server: Server }> {
  const server = createServer();
  await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", resolve));
  const address = server.address();
  if (!address || typeof address !== "object") throw new Error("no address");
  return { port: address.port, server };
}

/** Run the server (what `npm run start:production` and scripts/start.mjs run) until it exits or says it started. */
function startServer(env: NodeJS.ProcessEnv): Promise<{
  started: boolean;
  code: number | null;
  output: () => string;
  stop: () => Promise<void>;
}> {
  const child = spawn(process.execPath, ["--import", "tsx", "server/index.ts"], {
    cwd: ROOT,
    env: { PATH: process.env.PATH, LOG_LEVEL: "warn", ANALYSIS_THREADS: "1", ...env },
    stdio: ["ignore", "pipe", "pipe", "ipc"],
  });
  let output = "";
  child.stdout?.on("data", (d: Buffer) => (output += d.toString()));
  child.stderr?.on("data", (d: Buffer) => (output += d.toString()));
  const stop = async () => {
    if (child.exitCode !== null || child.signalCode !== null) return;
    child.kill("SIGTERM");
    await once(child, "exit");
  };
  return new Promise((resolve) => {
    child.on("message", () => resolve({ started: true, code: null, output: () => output, stop }));
    child.on("exit", (code) => resolve({ started: false, code, output: () => output, stop }));
  });
}

describe("the mail sink on a taken port", () => {
  it("rejects with EADDRINUSE instead of ending the process", async () => {
    const held = await holdPort();
    try {
      await expect(startMailSink({ db: t.database.db, port: held.port })).rejects.toMatchObject({
        code: "EADDRINUSE",
      });
    } finally {
      held.server.close();
    }
  });

  it("falls back to a free port, and says so", async () => {
    const held = await holdPort();
    const lines: string[] = [];
    const logger = pino({ level: "warn" }, { write: (l: string) => void lines.push(l) });
    const e = parseEnv({
      DATABASE_URL: t.url,
      NODE_ENV: "development",
      MAIL_SINK_PORT: String(held.port),
      MAIL_DISPATCH: "off",
    });
    const mail = await startMail(e, t.database.db, logger);
    try {
      expect(mail.sink?.port).toBeGreaterThan(0);
      expect(mail.sink?.port).not.toBe(held.port);
      expect(lines.join("")).toContain(`port ${held.port} is taken`);
    } finally {
      await mail.stop();
      held.server.close();
    }
  });
});

describe("server start-up", () => {
  it("fails, naming the web port, when PORT is taken", async () => {
    const held = await holdPort();
    try {
      const r = await startServer({
        DATABASE_URL: t.url,
        NODE_ENV: "development",
        PORT: String(held.port),
        MAIL_SINK_PORT: "0",
        ANALYSIS_WORKER: "off",
      });
      await r.stop();
      expect(r.started).toBe(false);
      expect(r.code).toBe(1);
      expect(r.output()).toContain(`cannot start: web port 127.0.0.1:${held.port}`);
      expect(r.output()).toContain("in use");
    } finally {
      held.server.close();
    }
  });
});

describe("the production command", () => {
  let empty: Awaited<ReturnType<typeof createEmptyDatabase>>;
  let clientDist: string;
  beforeAll(async () => {
    empty = await createEmptyDatabase();
    clientDist = mkdtempSync(path.join(tmpdir(), "tapwright-client-"));
    writeFileSync(path.join(clientDist, "index.html"), "<!doctype html><title>Tapwright</title>");
  });
  afterAll(async () => {
    rmSync(clientDist, { recursive: true, force: true });
    await empty?.drop();
  });

  const productionEnv = (port: number): NodeJS.ProcessEnv => ({
    DATABASE_URL: empty.url,
    NODE_ENV: "production",
    PORT: String(port),
    CLIENT_DIST: clientDist,
    SMTP_HOST: "127.0.0.1",
    MAIL_DISPATCH: "off",
  });

  it("is the server under NODE_ENV=production (no seeding step)", () => {
    const pkg = JSON.parse(readFileSync(path.join(ROOT, "package.json"), "utf8")) as {
      scripts: Record<string, string>;
    };
    expect(pkg.scripts["start:production"]).toBe("NODE_ENV=production node --import tsx server/index.ts");
  });

  it("refuses to start without a session secret, naming it", async () => {
    const held = await holdPort();
    const port = held.port;
    held.server.close();
    const r = await startServer(productionEnv(port));
    await r.stop();
    expect(r.started).toBe(false);
    expect(r.code).toBe(1);
    expect(r.output()).toContain("SESSION_SECRET is required in production");
  });

  it("starts on an empty database with no account; create-admin makes the first admin", async () => {
    const held = await holdPort();
    const port = held.port;
    held.server.close();
    const r = await startServer({ ...productionEnv(port), SESSION_SECRET: "a".repeat(32) });
    try {
      expect(r.started, r.output()).toBe(true);
      const base = `http://127.0.0.1:${port}`;
      expect((await request(base).get("/api/health")).status).toBe(200);
      const database = openDatabase(empty.url, 1);
      try {
        const users = await database.pool.query("select username from users");
        expect(users.rows).toEqual([]);
      } finally {
        await database.pool.end();
      }
      const demo = await request(base)
        .post("/api/auth/sign-in")
        .send({ username: "admin", password: "tapwright-admin" });
      expect(demo.status).toBe(401);

      const created = spawnSync(
        process.execPath,
        [
          "--import",
          "tsx",
          "server/db/create-admin-cli.ts",
          "--username",
          "opslead",
          "--name",
          "Mara Holt",
          "--email",
          "mara.holt@example.org",
        ],
        { cwd: ROOT, env: { PATH: process.env.PATH, DATABASE_URL: empty.url }, encoding: "utf8" },
      );
      expect(created.status, created.stderr).toBe(0);
      const password = /Temporary password: (\S+)/.exec(created.stdout)?.[1];
      expect(password).toMatch(/^[A-Za-z0-9]{16}$/);
      const signIn = await request(base).post("/api/auth/sign-in").send({ username: "opslead", password });
      expect(signIn.status, JSON.stringify(signIn.body)).toBe(200);
      expect(signIn.body.user).toMatchObject({
        username: "opslead",
        roles: ["admin"],
        mustChangePassword: true,
      });

      const again = spawnSync(
        process.execPath,
        [
          "--import",
          "tsx",
          "server/db/create-admin-cli.ts",
          "--username",
          "opslead",
          "--name",
          "X",
          "--email",
          "x@example.org",
        ],
        { cwd: ROOT, env: { PATH: process.env.PATH, DATABASE_URL: empty.url }, encoding: "utf8" },
      );
      expect(again.status).toBe(1);
      expect(again.stderr).toContain("this user name is taken");
    } finally {
      await r.stop();
    }
  });
});
