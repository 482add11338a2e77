// The life cycle against the API, generated over (state × action × user): each cell is allowed or refused
// with the status the rules of DESIGN.md and issue 6 give, written out below independently of
// server/services/lifecycle.ts. Refused cells share one fixture per state (a refusal changes nothing, which
// is checked); allowed cells that change state each get a fresh fixture.
import { beforeAll, describe, expect, it } from "vitest";
import { expectStatus, revisionIn, type FixtureState } from "./lifecycle-helpers";
import { addUser } from "./lifecycle-helpers";
import { signedIn, useApiTestDatabase, type Agent } from "./helpers";

const t = useApiTestDatabase();

const STATES: FixtureState[] = [
  "draft",
  "in_review",
  "approved",
  "changes_requested",
  "released",
  "withdrawn",
];
const ACTIONS = ["submit", "approve", "request_changes", "release", "withdraw", "comment"] as const;
type Action = (typeof ACTIONS)[number];
// `dual` (author + reviewer) submits every fixture, so it is the self-reviewer; `outsider` holds every
// working role but is not a member of the project.
const USERS = ["author", "reviewer", "firmware", "admin", "dual", "outsider"] as const;
type User = (typeof USERS)[number];
const ROLES: Record<User, string[]> = {
  author: ["author"],
  reviewer: ["reviewer"],
  firmware: ["firmware"],
  admin: ["admin"],
  dual: ["author", "reviewer"],
  outsider: ["author", "reviewer", "firmware"],
};

/** The expected status of one cell, from the rules as issue 6 states them. */
function expected(state: FixtureState, action: Action, user: User): number {
  if (user === "outsider") return 404; // non-members cannot tell the revision exists
  // Withdraw acts on a release: before there is one, there is nothing to find, whoever asks.
  if (action === "withdraw" && state !== "released" && state !== "withdrawn") return 404;
  const may: Record<Action, string[]> = {
    submit: ["author"],
    approve: ["reviewer"],
    request_changes: ["reviewer"],
    release: ["author"],
    withdraw: ["author", "admin"],
    comment: ["author", "reviewer", "admin"],
  };
  if (!may[action].some((r) => ROLES[user].includes(r))) return 403;
  const from: Record<Action, FixtureState[]> = {
    submit: ["draft"],
    approve: ["in_review"],
    request_changes: ["in_review"],
    release: ["approved"],
    withdraw: ["released"],
    comment: ["in_review", "approved", "changes_requested", "released", "withdrawn"],
  };
  if (!from[action].includes(state)) return 409;
  if ((action === "approve" || action === "request_changes") && user === "dual") return 403; // self-review
  return action === "submit" || action === "withdraw" ? 200 : 201;
}

interface Fixture {
  revisionId: number;
  releaseId: number | null;
}

/** Perform one action; withdraw before any release targets a release id that does not exist (404). */
function act(agent: Agent, action: Action, f: Fixture, version = "1.0.0") {
  const rev = `/api/revisions/${f.revisionId}`;
  switch (action) {
    case "submit":
      return agent.post(`${rev}/submit`);
    case "approve":
      return agent.post(`${rev}/decision`).send({ decision: "approved", comment: "" });
    case "request_changes":
      return agent
        .post(`${rev}/decision`)
        .send({ decision: "changes_requested", comment: "Please widen the Taylor n̄." });
    case "release":
      return agent.post(`${rev}/release`).send({ version, notes: "Matrix release." });
    case "withdraw":
      return agent
        .post(`/api/releases/${f.releaseId ?? 2_000_000_000}/withdraw`)
        .send({ reason: "Matrix withdrawal." });
    case "comment":
      return agent.post(`${rev}/comments`).send({ body: "Looks right to me." });
  }
}

const agents = new Map<User, Agent>();
const shared = new Map<FixtureState, Fixture>();
const stateChanging = (a: Action) => a !== "comment";

beforeAll(async () => {
  await addUser(t.database, "dual", ["author", "reviewer"], ["coastwatch-s"]);
  await addUser(t.database, "outsider", ["author", "reviewer", "firmware"], ["harbour-lidar-trials"]);
  for (const u of USERS) agents.set(u, await signedIn(t.app, u));
  const cast = { submitter: agents.get("dual")!, reviewer: agents.get("reviewer")! };
  for (const s of STATES) shared.set(s, await revisionIn(t, cast, s));
}, 120_000);

const cells = STATES.flatMap((state) =>
  ACTIONS.flatMap((action) =>
    USERS.map((user) => ({ state, action, user, status: expected(state, action, user) })),
  ),
);

describe("refused cells leave the revision as it was", () => {
  const refused = cells.filter((c) => c.status >= 400);
  it.each(refused)("$state × $action × $user → $status", async ({ state, action, user, status }) => {
    const f = shared.get(state)!;
    const agent = agents.get(user)!;
    const before = await t.database.pool.query("select state, content_hash from revisions where id = $1", [
      f.revisionId,
    ]);
    const res = await act(agent, action, f);
    expectStatus(res, status, `${state} × ${action} × ${user}`);
    const after = await t.database.pool.query("select state, content_hash from revisions where id = $1", [
      f.revisionId,
    ]);
    expect(after.rows).toEqual(before.rows);
  });
  it("covers every refusal status the rules name", () => {
    expect(new Set(refused.map((c) => c.status))).toEqual(new Set([403, 404, 409]));
    expect(refused.length).toBeGreaterThan(150);
  });
});

describe("allowed cells succeed and move the revision", () => {
  const allowed = cells.filter((c) => c.status < 400);
  const NEXT: Record<Action, string | null> = {
    submit: "in_review",
    approve: "approved",
    request_changes: "changes_requested",
    release: "released",
    withdraw: "released",
    comment: null,
  };
  it.each(allowed)(
    "$state × $action × $user → $status",
    async ({ state, action, user, status }) => {
      const cast = { submitter: agents.get("dual")!, reviewer: agents.get("reviewer")! };
      const f = stateChanging(action) ? await revisionIn(t, cast, state) : shared.get(state)!;
      const res = await act(agents.get(user)!, action, f);
      expectStatus(res, status, `${state} × ${action} × ${user}`);
      const after = await t.database.pool.query<{ state: string }>(
        "select state from revisions where id = $1",
        [f.revisionId],
      );
      expect(after.rows[0]!.state).toBe(NEXT[action] ?? (state === "withdrawn" ? "released" : state));
    },
    60_000,
  );
  it("has the expected number of allowed cells", () => {
    // submit 2 (author, dual); approve 1 and request changes 1 (reviewer); release 2; withdraw 3 (author, admin, dual);
    // comment in 5 states by author, reviewer, admin, dual = 20.
    expect(allowed.length).toBe(2 + 1 + 1 + 2 + 3 + 20);
  });
});
