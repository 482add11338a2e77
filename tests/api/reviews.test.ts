// Reviews end to end over HTTP: submit needs a finished report; the queue (oldest first, failing metrics);
// the review page; comments; decisions bound to the content hash and to the report's SHA-256 (recomputed
// here with node:crypto over an independently written canonical JSON); each transition's audit row and its
// mail, delivered to the SMTP sink over a real SMTP conversation; decisions and comments append-only.
import { createHash } from "node:crypto";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { ReviewPageSchema, ReviewQueueSchema, TransitionResponseSchema } from "../../shared/schemas/reviews";
import { createDispatcher } from "../../server/mail/dispatcher";
import { startMailSink, type MailSink } from "../../server/mail/sink";
import { smtpSender } from "../../server/mail/transport";
import { addUser, analysedDraft, barker13, expectStatus, revisionIn } from "./lifecycle-helpers";
import { expectError, signedIn, useApiTestDatabase, type Agent } from "./helpers";

const t = useApiTestDatabase();
const REVIEWER = "tomas.quill@coastwatch.example";
const FROM = "Tapwright <tapwright@coastwatch.example>";

let author: Agent;
let reviewer: Agent;
let dual: Agent;
let dualEmail: string;
let sink: MailSink;

beforeAll(async () => {
  dualEmail = (await addUser(t.database, "dual", ["author", "reviewer"], ["coastwatch-s"])).email;
  author = await signedIn(t.app, "author");
  reviewer = await signedIn(t.app, "reviewer");
  dual = await signedIn(t.app, "dual");
  sink = await startMailSink({ db: t.database.db, port: 0 });
}, 60_000);
afterAll(async () => {
  await sink.stop();
});

/** Canonical JSON written out independently: sorted keys, no spaces. */
function canonical(v: unknown): string {
  if (Array.isArray(v)) return `[${v.map(canonical).join(",")}]`;
  if (v !== null && typeof v === "object")
    return `{${Object.keys(v)
      .sort()
      .filter((k) => (v as Record<string, unknown>)[k] !== undefined)
      .map((k) => `${JSON.stringify(k)}:${canonical((v as Record<string, unknown>)[k])}`)
      .join(",")}}`;
  return JSON.stringify(v);
}

const q = <T extends Record<string, unknown>>(sql: string, params: unknown[] = []) =>
  t.database.pool.query<T>(sql, params).then((r) => r.rows);

async function deliver(): Promise<void> {
  const d = createDispatcher(
    {
      db: t.database.db,
      sender: smtpSender({ host: "127.0.0.1", port: sink.port, secure: false, from: FROM }),
      from: FROM,
      policy: { baseSeconds: 60, maxSeconds: 3600, maxAttempts: 5 },
    },
    false,
  );
  await d.tick();
  await d.stop();
}

describe("submit", () => {
  it("is refused (409 no_report) until the current content has a finished report, and nothing is written", async () => {
    const pid = (await q<{ id: number }>("select id from projects where slug = 'coastwatch-s'"))[0]!.id;
    const res = await author
      .post(`/api/projects/${pid}/designs`)
      .send({ name: "unanalysed", content: barker13 });
    expectStatus(res, 201);
    const id = (res.body as { revision: { id: number } }).revision.id;
    const audits = (await q("select id from audit_events where action = 'revision.submit'")).length;
    const err = expectError(await author.post(`/api/revisions/${id}/submit`), 409, "conflict");
    expect(err.details).toMatchObject({ reason: "no_report" });
    expect((await q<{ state: string }>("select state from revisions where id = $1", [id]))[0]!.state).toBe(
      "draft",
    );
    expect(await q("select id from audit_events where action = 'revision.submit'")).toHaveLength(audits);
  });
});

describe("a review from submission to approval", () => {
  let revisionId: number;
  beforeAll(async () => {
    ({ revisionId } = await analysedDraft(t, dual));
  });

  it("submit: state, audit row, and 'submitted' mail to the project's reviewers but not the submitter", async () => {
    expectStatus(await dual.post(`/api/revisions/${revisionId}/submit`), 200);
    const audit = await q(
      "select action, subject_id, actor_user_id from audit_events where action = 'revision.submit' and subject_id = $1",
      [String(revisionId)],
    );
    expect(audit).toHaveLength(1);
    const mail = await q<{ to_addresses: string[]; template: string }>(
      "select to_addresses, template from mail_outbox where template = 'submitted' order by id desc limit 1",
    );
    // dual is also a reviewer, but nobody is asked to review their own submission.
    expect(mail[0]).toEqual({ to_addresses: [REVIEWER], template: "submitted" });
    await deliver();
    const got = await q<{ envelope_to: string[]; subject: string }>(
      "select envelope_to, subject from mail_sink_messages where subject like '%Review wanted%' order by id desc limit 1",
    );
    expect(got[0]!.envelope_to).toEqual([REVIEWER]);
    expect(got[0]!.subject).toMatch(/^\[coastwatch-s\] Review wanted: lifecycle test .* r1$/);
  });

  it("the queue lists it for the reviewer with its failing limit, oldest first; firmware may not see the queue", async () => {
    const later = await revisionIn(t, { submitter: author, reviewer }, "in_review");
    const res = await reviewer.get("/api/reviews/queue");
    expectStatus(res, 200);
    const items = ReviewQueueSchema.parse(res.body).items;
    const ids = items.map((i) => i.revisionId);
    expect(ids).toContain(revisionId);
    expect(ids.indexOf(revisionId)).toBeLessThan(ids.indexOf(later.revisionId));
    const times = items.map((i) => Date.parse(i.submittedAt));
    expect([...times].sort((a, b) => a - b)).toEqual(times);
    const mine = items.find((i) => i.revisionId === revisionId)!;
    // Barker-13: PSL 20·log10(1/13) = −22.28 dB fails the −25 dB limit (helper's content).
    expect(mine.pass).toBe(false);
    expect(mine.failing.map((f) => f.name)).toContain("pslDbMax");
    expect(mine.failing.find((f) => f.name === "pslDbMax")!.value).toBeCloseTo(20 * Math.log10(1 / 13), 2);
    const dualQueue = ReviewQueueSchema.parse((await dual.get("/api/reviews/queue")).body).items;
    expect(dualQueue.find((i) => i.revisionId === revisionId)!.canDecide).toBe(false);
    expectError(await (await signedIn(t.app, "firmware")).get("/api/reviews/queue"), 403, "forbidden");
  });

  it("comments are plain text kept as typed, in order, and audited", async () => {
    const body = "<script>alert(1)</script> PSL is −22.28 dB & the limit −25 dB";
    const res = await reviewer.post(`/api/revisions/${revisionId}/comments`).send({ body });
    expectStatus(res, 201);
    expect(res.body.comment.body).toBe(body);
    expectStatus(
      await dual.post(`/api/revisions/${revisionId}/comments`).send({ body: "Accepted for the demo." }),
      201,
    );
    expectError(
      await reviewer.post(`/api/revisions/${revisionId}/comments`).send({ body: "  " }),
      400,
      "validation_failed",
    );
    const page = ReviewPageSchema.parse((await reviewer.get(`/api/revisions/${revisionId}/review`)).body);
    expect(page.comments.map((c) => c.body)).toEqual([body, "Accepted for the demo."]);
    expect(
      await q("select id from audit_events where action = 'review.comment' and subject_id = $1", [
        String(revisionId),
      ]),
    ).toHaveLength(2);
  });

  it("self-review is refused; 'changes requested' needs a comment", async () => {
    const self = expectError(
      await dual.post(`/api/revisions/${revisionId}/decision`).send({ decision: "approved" }),
      403,
      "forbidden",
    );
    expect(self.details).toMatchObject({ reason: "self_review" });
    expectError(
      await reviewer
        .post(`/api/revisions/${revisionId}/decision`)
        .send({ decision: "changes_requested", comment: " " }),
      400,
      "validation_failed",
    );
  });

  it("approve binds the decision to the content hash and the report's SHA-256; audit and mail to the author", async () => {
    const res = await reviewer
      .post(`/api/revisions/${revisionId}/decision`)
      .send({ decision: "approved", comment: "Fine for the blind zone." });
    expectStatus(res, 201);
    const body = TransitionResponseSchema.parse(res.body);
    expect(body.revision.state).toBe("approved");
    const doc = (await reviewer.get(`/api/revisions/${revisionId}/report.json`)).body as {
      header: { contentHash: string };
      report: unknown;
    };
    expect(body.review!.contentHash).toBe(doc.header.contentHash);
    expect(body.review!.reportHash).toBe(
      createHash("sha256").update(canonical(doc.report), "utf8").digest("hex"),
    );
    expect(
      await q("select id from audit_events where action = 'review.approve' and subject_id = $1", [
        String(revisionId),
      ]),
    ).toHaveLength(1);
    const mail = await q<{ to_addresses: string[] }>(
      "select to_addresses from mail_outbox where template = 'approved' order by id desc limit 1",
    );
    expect(mail[0]!.to_addresses).toEqual([dualEmail]);
    await deliver();
    const got = await q<{ envelope_to: string[] }>(
      "select envelope_to from mail_sink_messages where $1 = any(envelope_to) order by id desc limit 1",
      [dualEmail],
    );
    expect(got[0]!.envelope_to).toEqual([dualEmail]);
    const page = ReviewPageSchema.parse((await dual.get(`/api/revisions/${revisionId}/review`)).body);
    expect(page.decisions.map((d) => d.decision)).toEqual(["approved"]);
    expect(page.report!.reportHash).toBe(body.review!.reportHash);
    expect(page.allowedActions).toContain("release");
  });

  it("decisions and comments cannot be changed or deleted, even by SQL through the app's role", async () => {
    await expect(
      q("update reviews set comment = 'edited' where revision_id = $1", [revisionId]),
    ).rejects.toThrow(/append-only/);
    await expect(q("delete from review_comments where revision_id = $1", [revisionId])).rejects.toThrow(
      /append-only/,
    );
  });
});

describe("changes requested", () => {
  it("mails the author the comment, audits, and the author can start r2 from it", async () => {
    const { revisionId, designId } = await revisionIn(t, { submitter: author, reviewer }, "in_review");
    const comment = "Use W = 14 on receive.";
    expectStatus(
      await reviewer
        .post(`/api/revisions/${revisionId}/decision`)
        .send({ decision: "changes_requested", comment }),
      201,
    );
    expect(
      await q("select id from audit_events where action = 'review.request-changes' and subject_id = $1", [
        String(revisionId),
      ]),
    ).toHaveLength(1);
    const mail = await q<{ to_addresses: string[]; text: string }>(
      "select to_addresses, text from mail_outbox where template = 'changes-requested' order by id desc limit 1",
    );
    expect(mail[0]!.to_addresses).toEqual(["ilse.marrow@coastwatch.example"]);
    expect(mail[0]!.text).toContain(comment);
    expectStatus(await author.post(`/api/designs/${designId}/revisions`), 201);
  });
});
