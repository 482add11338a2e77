import type { Express } from "express";
import request from "supertest";
import { afterAll, afterEach, beforeAll, beforeEach, expect, vi, type MockInstance } from "vitest";
import { ApiErrorBodySchema, type ErrorCode } from "../../shared/schemas/errors";
import { createApp, type CreatedApp } from "../../server/app";
import { openDatabase, type Database } from "../../server/db/client";
import { createTestDatabase } from "../setup/test-db";

/** The session secret the tests share between app instances (a restart keeps the secret). */
export const TEST_SECRET = "tapwright-test-secret-0123456789";

/** Build an app over a database with the settings the tests use. */
export function buildApp(database: Database, signInLimitPerMinute = 1000): CreatedApp {
  return createApp({
    database,
    sessionSecret: TEST_SECRET,
    version: "test",
    pruneSessionsMinutes: false,
    signInLimitPerMinute,
  });
}

/** A supertest agent that keeps cookies between requests. */
export type Agent = ReturnType<typeof request.agent>;

/** What a test file gets from useApiTestDatabase. */
export interface ApiTestContext {
  readonly app: Express;
  readonly database: Database;
  readonly url: string;
  /** One signed-in admin agent per file (a sign-in costs a bcrypt compare, about a second here). */
  admin(): Promise<Agent>;
}

/**
 * Per test file: a fresh database cloned from the demo-seeded template, one app over it, and a check
 * that no test calls console.error unexpectedly.
 */
export function useApiTestDatabase(): ApiTestContext {
  failOnConsoleError();
  let adminAgent: Promise<Agent> | undefined;
  let created: Awaited<ReturnType<typeof createTestDatabase>> | undefined;
  let database: Database | undefined;
  let built: CreatedApp | undefined;
  beforeAll(async () => {
    created = await createTestDatabase();
    database = openDatabase(created.url, 5);
    built = buildApp(database);
  });
  afterAll(async () => {
    built?.close();
    await database?.pool.end();
    await created?.drop();
  });
  return {
    get app() {
      if (!built) throw new Error("app not ready: use it inside a test");
      return built.app;
    },
    get database() {
      if (!database) throw new Error("database not ready: use it inside a test");
      return database;
    },
    admin() {
      adminAgent ??= signedIn(this.app, "admin");
      return adminAgent;
    },
    get url() {
      if (!created) throw new Error("database not ready: use it inside a test");
      return created.url;
    },
  };
}

/** Fail any test during which something calls console.error unexpectedly (STYLE.md #11). */
export function failOnConsoleError(): void {
  let spy: MockInstance<typeof console.error>;
  beforeEach(() => {
    spy = vi.spyOn(console, "error");
  });
  afterEach(() => {
    const calls = spy.mock.calls;
    spy.mockRestore();
    expect(calls, "unexpected console.error").toEqual([]);
  });
}

/**
 * An agent that keeps cookies and, like a browser on the app's own page, says its requests are same-origin
 * (the CSRF guard refuses state-changing requests that carry the session cookie but say nothing).
 */
export function browserAgent(app: Express): Agent {
  return request.agent(app).set("Sec-Fetch-Site", "same-origin");
}

/** Sign in through the API and return an agent carrying the session cookie. */
export async function signedIn(
  app: Express,
  username: string,
  password = `tapwright-${username}`,
): Promise<Agent> {
  const agent = browserAgent(app);
  const res = await agent.post("/api/auth/sign-in").send({ username, password });
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return agent;
}

/** Assert the one JSON error shape with the expected status and code; returns the error for more checks. */
export function expectError(res: request.Response, status: number, code: ErrorCode) {
  expect(res.status, JSON.stringify(res.body)).toBe(status);
  expect(res.headers["content-type"]).toMatch(/^application\/json/);
  const body = ApiErrorBodySchema.parse(res.body);
  expect(body.error.code).toBe(code);
  expect(body.error.message.length).toBeGreaterThan(0);
  return body.error;
}

/** The session cookie ("tapwright.sid=...") from a response's Set-Cookie header. */
export function sessionCookie(res: request.Response): string {
  const raw = res.headers["set-cookie"] as unknown as string[] | undefined;
  const cookie = raw?.find((c) => c.startsWith("tapwright.sid="));
  if (!cookie) throw new Error("no session cookie was set");
  return cookie;
}
