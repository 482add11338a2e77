// Helpers shared by the authoring API tests (designs, revisions, uploads).
import { createHash } from "node:crypto";
import type { Express } from "express";
import type request from "supertest";
import { expect } from "vitest";
import { signedIn } from "./helpers";

/** A 16-bit Q1.15 format, full-scale (the usual default). */
export const Q15 = { wordLength: 16, fractionLength: 15 };

type Agent = Awaited<ReturnType<typeof signedIn>>;

// Ids by slug; each test file has its own database and its own copy of this module.
const projectIds = new Map<string, number>();

/** Project id by slug, as the admin sees them. */
export async function projectId(app: Express, slug: string): Promise<number> {
  const known = projectIds.get(slug);
  if (known !== undefined) return known;
  const admin = await signedIn(app, "admin");
  const res = await admin.get("/api/projects");
  const p = (res.body.projects as { slug: string; id: number }[]).find((x) => x.slug === slug);
  if (!p) throw new Error(`no project ${slug}`);
  projectIds.set(slug, p.id);
  return p.id;
}

/** Read an octet-stream body as a Buffer. */
export function binary(res: request.Response, cb: (err: Error | null, body: Buffer) => void): void {
  const chunks: Buffer[] = [];
  const stream = res as unknown as NodeJS.ReadableStream;
  stream.on("data", (c: Buffer) => chunks.push(c));
  stream.on("end", () => cb(null, Buffer.concat(chunks)));
}

/** Download a table's values, check the SHA-256 header with node:crypto, and decode them independently. */
export async function tableValues(agent: Agent, revisionId: number, tableId: number) {
  const res = await agent
    .get(`/api/revisions/${revisionId}/tables/${tableId}/values`)
    .buffer(true)
    .parse(binary as never);
  expect(res.status).toBe(200);
  expect(res.headers["content-type"]).toBe("application/octet-stream");
  const body = res.body as Buffer;
  expect(res.headers["x-values-sha256"]).toBe(createHash("sha256").update(body).digest("hex"));
  expect(body.length % 16).toBe(0);
  const n = body.length / 16;
  const re = new Float64Array(n);
  const im = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    re[i] = body.readDoubleLE(16 * i);
    im[i] = body.readDoubleLE(16 * i + 8);
  }
  return { re, im, bytes: body };
}

/** Bit-for-bit equality of two float arrays (Object.is tells −0 from +0). */
export function expectSameBits(actual: ArrayLike<number>, expected: ArrayLike<number>, what: string): void {
  expect(actual.length, `${what} length`).toBe(expected.length);
  for (let i = 0; i < expected.length; i++) {
    if (!Object.is(actual[i], expected[i]))
      expect(`${what}[${i}] = ${actual[i]}`).toBe(`${what}[${i}] = ${expected[i]}`);
  }
}

/** Count rows of a table through the test's own connection pool. */
export async function countRows(
  pool: { query(q: string): Promise<{ rows: { n: number }[] }> },
  table: string,
) {
  const r = await pool.query(`select count(*)::int as n from ${table}`);
  return r.rows[0]!.n;
}
