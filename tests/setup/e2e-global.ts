// End-to-end harness: build the client once, start the real server on a free port against a fresh
// seeded database, hand its URL to the tests, and stop everything afterwards.
// Set TAPWRIGHT_E2E_BASE_URL to run the tests against a server you started yourself instead.
import { spawn, type ChildProcess } from "node:child_process";
import { once } from "node:events";
import { createServer } from "node:net";
import { fileURLToPath } from "node:url";
import type { TestProject } from "vitest/node";
import { createTestDatabase } from "./test-db";

declare module "vitest" {
  export interface ProvidedContext {
    baseUrl: string;
  }
}

const ROOT = fileURLToPath(new URL("../..", import.meta.url));

function run(args: string[], env: NodeJS.ProcessEnv = process.env): Promise<void> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, args, { cwd: ROOT, env, stdio: ["ignore", "ignore", "pipe"] });
    let stderr = "";
    child.stderr.on("data", (d: Buffer) => (stderr += d.toString()));
    child.on("error", reject);
    child.on("exit", (code) =>
      code === 0 ? resolve() : reject(new Error(`node ${args.join(" ")} exited ${code}\n${stderr}`)),
    );
  });
}

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = createServer();
    srv.unref();
    srv.on("error", reject);
    srv.listen(0, "127.0.0.1", () => {
      const addr = srv.address();
      const port = typeof addr === "object" && addr ? addr.port : 0;
      srv.close(() => resolve(port));
    });
  });
}

async function waitForHealth(url: string, child: ChildProcess, log: () => string): Promise<void> {
  const deadline = Date.now() + 60_000;
  while (Date.now() < deadline) {
    if (child.exitCode !== null) throw new Error(`The server exited with ${child.exitCode}:\n${log()}`);
    try {
      const res = await fetch(`${url}/api/health`);
      if (res.ok) return;
    } catch {
      // Not listening yet.
    }
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error(`The server did not answer /api/health within 60 s:\n${log()}`);
}

/** Vitest global setup for the `e2e` project. */
export default async function setup(project: TestProject): Promise<() => Promise<void>> {
  const external = process.env.TAPWRIGHT_E2E_BASE_URL;
  if (external) {
    project.provide("baseUrl", external.replace(/\/$/, ""));
    return async () => {};
  }
  await run([
    fileURLToPath(new URL("../../node_modules/vite/bin/vite.js", import.meta.url)),
    "build",
    "--logLevel",
    "error",
  ]);
  const database = await createTestDatabase();
  const env = { ...process.env, DATABASE_URL: database.url, NODE_ENV: "test", LOG_LEVEL: "warn" };
  await run(["--import", "tsx", "server/db/seed-cli.ts"], env);
  const port = await freePort();
  const baseUrl = `http://127.0.0.1:${port}`;
  const server = spawn(process.execPath, ["--import", "tsx", "server/index.ts"], {
    cwd: ROOT,
    env: { ...env, PORT: String(port), HOST: "127.0.0.1", CLIENT_DIST: "dist/client" },
    stdio: ["ignore", "pipe", "pipe"],
  });
  let output = "";
  server.stdout?.on("data", (d: Buffer) => (output += d.toString()));
  server.stderr?.on("data", (d: Buffer) => (output += d.toString()));
  try {
    await waitForHealth(baseUrl, server, () => output);
  } catch (err) {
    server.kill("SIGKILL");
    await database.drop();
    throw err;
  }
  project.provide("baseUrl", baseUrl);
  return async () => {
    if (server.exitCode === null) {
      server.kill("SIGTERM");
      const timer = setTimeout(() => server.kill("SIGKILL"), 10_000);
      await once(server, "exit");
      clearTimeout(timer);
    }
    await database.drop();
  };
}
