// Helpers shared by the lifecycle, review and release API tests: extra users, a finished report computed
// in-process by the DSP core (the same `analyze` the worker runs), and revisions driven to each state.
import bcrypt from "bcryptjs";
import { eq } from "drizzle-orm";
import { expect } from "vitest";
import { CreatedDesignSchema } from "../../shared/schemas/designs";
import { ReleaseResponseSchema } from "../../shared/schemas/releases";
import { projectMembers, projects, userRoles, users } from "../../server/db/schema";
import type { Database } from "../../server/db/client";
import { analyseInProcess } from "../../server/services/analyses";
import { signedIn, type Agent, type ApiTestContext } from "./helpers";
import type { Role } from "../../shared/schemas/auth";

/** A 13-element Barker code, Q1.15 both ways: small, so its analysis takes milliseconds. */
export const barker13 = {
  kind: "waveform",
  tx: { kind: "phase-code", code: { kind: "barker", length: 13 }, sampleRateHz: 1e6 },
  fixedPoint: { tx: { wordLength: 16, fractionLength: 15 }, rx: { wordLength: 16, fractionLength: 15 } },
  // Barker-13 PSL is 20·log10(1/13) = −22.28 dB (sidelobes of 1 against a peak of 13; Barker, 1953, from memory);
  // a −25 dB limit therefore fails, so the queue has a failing metric to show. Interpolation 1 measures the
  // samples themselves (a ×8 interpolation shows the higher peaks between chips).
  interpolation: 1,
  limits: { pslDbMax: -25 },
};

/** Add a user with roles and memberships straight in the database (bcrypt at cost 4: tests only). */
export async function addUser(
  database: Database,
  username: string,
  roles: Role[],
  memberOf: string[],
): Promise<{ id: number; email: string }> {
  const db = database.db;
  const email = `${username}@coastwatch.example`;
  const [u] = await db
    .insert(users)
    .values({
      username,
      displayName: `Test ${username}`,
      email,
      passwordHash: await bcrypt.hash(`tapwright-${username}`, 4),
    })
    .returning({ id: users.id });
  if (!u) throw new Error("user insert returned no row");
  await db.insert(userRoles).values(roles.map((role) => ({ userId: u.id, role })));
  for (const slug of memberOf) {
    const [p] = await db.select({ id: projects.id }).from(projects).where(eq(projects.slug, slug));
    if (!p) throw new Error(`no project ${slug}`);
    await db.insert(projectMembers).values({ projectId: p.id, userId: u.id });
  }
  return { id: u.id, email };
}

/** Store the finished report of a revision's current content, computed here by the DSP core. */
export function finishAnalysis(database: Database, revisionId: number): Promise<string> {
  return analyseInProcess(database.db, revisionId, "test-inline");
}

let n = 0;
/** A new Barker-13 design in coastwatch-s by `author`, with a finished report; returns ids. */
export async function analysedDraft(t: ApiTestContext, author: Agent, content: object = barker13) {
  const [p] = await t.database.db
    .select({ id: projects.id })
    .from(projects)
    .where(eq(projects.slug, "coastwatch-s"));
  const res = await author
    .post(`/api/projects/${p!.id}/designs`)
    .send({ name: `lifecycle test ${process.pid}-${++n}`, content });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  const created = CreatedDesignSchema.parse(res.body);
  await finishAnalysis(t.database, created.revision.id);
  return { designId: created.design.id, revisionId: created.revision.id };
}

/** Expect a status, showing the body when it differs. */
export function expectStatus(res: { status: number; body: unknown }, status: number, what = ""): void {
  expect(res.status, `${what} ${JSON.stringify(res.body)}`).toBe(status);
}

/** The states a fixture can be driven to (withdrawn = released, with its release withdrawn). */
export type FixtureState =
  "draft" | "in_review" | "approved" | "changes_requested" | "released" | "withdrawn";

/** Who does what when building fixtures. */
export interface Cast {
  submitter: Agent;
  reviewer: Agent;
}

/** A revision driven through the API to `state`; submitted by cast.submitter, decided by cast.reviewer. */
export async function revisionIn(t: ApiTestContext, cast: Cast, state: FixtureState, version = "1.0.0") {
  const ids = await analysedDraft(t, cast.submitter);
  const { revisionId } = ids;
  let releaseId: number | null = null;
  if (state === "draft") return { ...ids, releaseId };
  expectStatus(await cast.submitter.post(`/api/revisions/${revisionId}/submit`), 200, "submit");
  if (state === "in_review") return { ...ids, releaseId };
  if (state === "changes_requested") {
    const res = await cast.reviewer
      .post(`/api/revisions/${revisionId}/decision`)
      .send({ decision: "changes_requested", comment: "Tighten the PSL." });
    expectStatus(res, 201, "request changes");
    return { ...ids, releaseId };
  }
  expectStatus(
    await cast.reviewer.post(`/api/revisions/${revisionId}/decision`).send({ decision: "approved" }),
    201,
    "approve",
  );
  if (state === "approved") return { ...ids, releaseId };
  const rel = await cast.submitter
    .post(`/api/revisions/${revisionId}/release`)
    .send({ version, notes: "First issue." });
  expectStatus(rel, 201, "release");
  releaseId = ReleaseResponseSchema.parse(rel.body).release.id;
  if (state === "withdrawn")
    expectStatus(
      await cast.submitter.post(`/api/releases/${releaseId}/withdraw`).send({ reason: "Wrong scale." }),
      200,
      "withdraw",
    );
  return { ...ids, releaseId };
}

export { signedIn };
