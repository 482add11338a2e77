import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { SinkMessageListSchema, SinkMessageSchema } from "../../shared/schemas/mail";
import { mailOutbox, mailSinkMessages } from "../../server/db/schema";
import { createDispatcher, type Dispatcher } from "../../server/mail/dispatcher";
import { notify, type NotifyBase } from "../../server/mail/notifications";
import { startMailSink, type MailSink } from "../../server/mail/sink";
import { smtpSender } from "../../server/mail/transport";
import { recordAudit } from "../../server/services/audit";
import { expectError, signedIn, useApiTestDatabase } from "./helpers";

const t = useApiTestDatabase();
const FROM = "Tapwright <tapwright@coastwatch.example>";
// The seeded demo programme (server/db/seed.ts): one account per role, all members of coastwatch-s.
const REVIEWER = "tomas.quill@coastwatch.example";
const AUTHOR = "ilse.marrow@coastwatch.example";
const FIRMWARE = "priya.lund@coastwatch.example";

let sink: MailSink;
let port: number;

beforeAll(async () => {
  sink = await startMailSink({ db: t.database.db, port: 0 });
  port = sink.port;
});
afterAll(async () => {
  await sink.stop();
});

/** A dispatcher that only runs when ticked, so each test decides when mail moves. */
function dispatcher(maxAttempts = 5, baseSeconds = 60): Dispatcher {
  return createDispatcher(
    {
      db: t.database.db,
      sender: smtpSender({ host: "127.0.0.1", port, secure: false, from: FROM }),
      from: FROM,
      policy: { baseSeconds, maxSeconds: 3600, maxAttempts },
    },
    false,
  );
}

async function ids(): Promise<{ projectId: number; author: number; reviewer: number }> {
  const q = (sql: string) => t.database.pool.query<{ id: number }>(sql).then((r) => r.rows[0]?.id ?? -1);
  return {
    projectId: await q("select id from projects where slug = 'coastwatch-s'"),
    author: await q("select id from users where username = 'author'"),
    reviewer: await q("select id from users where username = 'reviewer'"),
  };
}

async function base(designName: string, kind: "waveform" | "filter" = "waveform"): Promise<NotifyBase> {
  const i = await ids();
  return {
    projectId: i.projectId,
    design: { id: 901, name: designName, kind },
    revision: { id: 902, number: 3 },
    actorUserId: i.author,
    authorUserId: i.author,
    baseUrl: "http://127.0.0.1:3000/",
  };
}

async function sinkMessagesWithSubject(subject: string) {
  return t.database.db.select().from(mailSinkMessages).where(eq(mailSinkMessages.subject, subject));
}

describe("mail over a real SMTP conversation", () => {
  it("delivers 'submitted' to the project's reviewers (not the author) with the right subject", async () => {
    const c = await base("Long-pulse chirp, 10 MHz / 50 µs");
    const outboxId = await t.database.db.transaction((tx) =>
      notify(tx, "submitted", { ...c, note: "Taylor n̄=5" }),
    );
    expect(outboxId).not.toBeNull();
    const d = dispatcher();
    expect(await d.tick()).toEqual({ sent: 1, retried: 0, failed: 0 });
    await d.stop();

    const subject = "[coastwatch-s] Review wanted: Long-pulse chirp, 10 MHz / 50 µs r3";
    const got = await sinkMessagesWithSubject(subject);
    expect(got).toHaveLength(1);
    const m = got[0]!;
    expect(m.envelopeTo).toEqual([REVIEWER]);
    expect(m.envelopeFrom).toBe("tapwright@coastwatch.example");
    expect(m.text).toContain("Taylor n̄=5");
    expect(m.text).toContain("http://127.0.0.1:3000/revisions/902");
    expect(m.html).toContain("<h1");
    // The raw message carries both parts (multipart/alternative), as parsed back by mailparser.
    expect(m.raw).toMatch(/multipart\/alternative/i);

    const [row] = await t.database.db.select().from(mailOutbox).where(eq(mailOutbox.id, outboxId!));
    expect(row).toMatchObject({ status: "sent", attempts: 1, lastError: null });
    expect(row?.sentAt).toBeInstanceOf(Date);
  });

  it("sends approved / changes-requested to the author and released / withdrawn to firmware", async () => {
    const c = await base("Barker-13 short pulse");
    const i = await ids();
    await t.database.db.transaction(async (tx) => {
      await notify(tx, "approved", { ...c, actorUserId: i.reviewer, comment: "PSL −22.28 dB as expected" });
      await notify(tx, "changes-requested", { ...c, actorUserId: i.reviewer, comment: "Use W = 14" });
      await notify(tx, "released", { ...c, release: { id: 77, version: "1.0.0", notes: "First build" } });
      await notify(tx, "withdrawn", { ...c, release: { id: 77, version: "1.0.0" }, reason: "Wrong scale" });
    });
    const d = dispatcher();
    expect((await d.tick()).sent).toBe(4);
    await d.stop();
    const expectTo = async (subject: string, to: string[]) => {
      const got = await sinkMessagesWithSubject(subject);
      expect(got, subject).toHaveLength(1);
      expect(got[0]?.envelopeTo).toEqual(to);
      return got[0]!;
    };
    await expectTo("[coastwatch-s] Approved: Barker-13 short pulse r3", [AUTHOR]);
    await expectTo("[coastwatch-s] Changes requested: Barker-13 short pulse r3", [AUTHOR]);
    const released = await expectTo("[coastwatch-s] Released: Barker-13 short pulse 1.0.0", [FIRMWARE]);
    await expectTo("[coastwatch-s] Withdrawn: Barker-13 short pulse 1.0.0", [FIRMWARE]);
    // The transmit caution of DESIGN.md rides on waveform releases.
    expect(released.text).toContain("dummy load");
    expect(released.text).toContain("http://127.0.0.1:3000/releases/77");
  });

  it("leaves the transmit caution out of filter releases and enqueues nothing when nobody is to be told", async () => {
    const c = await base("4:1 decimation FIR", "filter");
    const d = dispatcher();
    await t.database.db.transaction((tx) =>
      notify(tx, "released", { ...c, release: { id: 78, version: "2.1.0", notes: "Decimator" } }),
    );
    expect((await d.tick()).sent).toBe(1);
    const [m] = await sinkMessagesWithSubject("[coastwatch-s] Released: 4:1 decimation FIR 2.1.0");
    expect(m?.text).not.toContain("dummy load");

    // harbour-lidar-trials has no firmware member in the seed.
    const other = await t.database.pool.query<{ id: number }>(
      "select id from projects where slug = 'harbour-lidar-trials'",
    );
    const none = await t.database.db.transaction((tx) =>
      notify(tx, "released", {
        ...c,
        projectId: other.rows[0]!.id,
        release: { id: 79, version: "0.1.0", notes: "-" },
      }),
    );
    expect(none).toBeNull();
    await d.stop();
  });

  it("writes no outbox row when the caller's transaction rolls back", async () => {
    const c = await base("Rolled back design");
    await expect(
      t.database.db.transaction(async (tx) => {
        await notify(tx, "submitted", { ...c, note: "" });
        throw new Error("the transition failed");
      }),
    ).rejects.toThrow("the transition failed");
    const rows = await t.database.db
      .select()
      .from(mailOutbox)
      .where(eq(mailOutbox.subject, "[coastwatch-s] Review wanted: Rolled back design r3"));
    expect(rows).toEqual([]);
  });
});

describe("with the SMTP server down", () => {
  it("commits the change, keeps the mail pending, and delivers it exactly once when the server is back", async () => {
    const c = await base("Low-sidelobe NLFM");
    await sink.stop();
    // A transition-like write: an audit row and a mail in one transaction.
    const { auditId, outboxId } = await t.database.db.transaction(async (tx) => ({
      auditId: await recordAudit(tx, {
        actor: { kind: "user", userId: c.actorUserId },
        action: "revision.submit",
        projectId: c.projectId,
        subjectType: "revision",
        subjectId: c.revision.id,
        summary: "Submitted r3 of Low-sidelobe NLFM for review",
      }),
      outboxId: await notify(tx, "submitted", { ...c, note: "" }),
    }));
    expect(outboxId).not.toBeNull();
    const committed = await t.database.pool.query("select id from audit_events where id = $1", [auditId]);
    expect(committed.rowCount).toBe(1);

    const d = dispatcher(5, 60);
    expect(await d.tick()).toEqual({ sent: 0, retried: 1, failed: 0 });
    const [pending] = await t.database.db.select().from(mailOutbox).where(eq(mailOutbox.id, outboxId!));
    expect(pending).toMatchObject({ status: "pending", attempts: 1 });
    expect(pending?.lastError).toMatch(/ECONNREFUSED|connect/i);
    // First retry after baseSeconds = 60 s (policy 60·2^0), measured against the database clock.
    const wait = await t.database.pool.query<{ s: number }>(
      "select extract(epoch from next_attempt_at - now())::float8 as s from mail_outbox where id = $1",
      [outboxId],
    );
    expect(wait.rows[0]!.s).toBeGreaterThan(55);
    expect(wait.rows[0]!.s).toBeLessThanOrEqual(60);

    sink = await startMailSink({ db: t.database.db, port });
    // Not due yet: the backoff is respected even though the server is back.
    expect(await d.tick()).toEqual({ sent: 0, retried: 0, failed: 0 });
    // Time passes (moved in the database rather than waiting a minute).
    await t.database.pool.query("update mail_outbox set next_attempt_at = now() where id = $1", [outboxId]);
    // Two dispatchers (two web replicas) race for the same row: SKIP LOCKED gives it to one.
    const d2 = dispatcher(5, 60);
    const [a, b] = await Promise.all([d.tick(), d2.tick()]);
    expect(a.sent + b.sent).toBe(1);
    expect(await d.tick()).toEqual({ sent: 0, retried: 0, failed: 0 });
    await Promise.all([d.stop(), d2.stop()]);

    expect(await sinkMessagesWithSubject("[coastwatch-s] Review wanted: Low-sidelobe NLFM r3")).toHaveLength(
      1,
    );
    const [sent] = await t.database.db.select().from(mailOutbox).where(eq(mailOutbox.id, outboxId!));
    expect(sent).toMatchObject({ status: "sent", attempts: 2, lastError: null });
  });

  it("marks a row failed after the last attempt", async () => {
    const c = await base("Never delivered");
    await sink.stop();
    try {
      const outboxId = await t.database.db.transaction((tx) => notify(tx, "submitted", { ...c, note: "" }));
      const d = dispatcher(3, 0);
      expect(await d.tick()).toEqual({ sent: 0, retried: 1, failed: 0 });
      expect(await d.tick()).toEqual({ sent: 0, retried: 1, failed: 0 });
      expect(await d.tick()).toEqual({ sent: 0, retried: 0, failed: 1 });
      expect(await d.tick()).toEqual({ sent: 0, retried: 0, failed: 0 });
      await d.stop();
      const [row] = await t.database.db.select().from(mailOutbox).where(eq(mailOutbox.id, outboxId!));
      expect(row).toMatchObject({ status: "failed", attempts: 3 });
    } finally {
      sink = await startMailSink({ db: t.database.db, port });
    }
  });
});

describe("the mailbox page's API", () => {
  it("lists sink messages newest first and shows one with its parts; 404 for a missing one", async () => {
    const c = await base("Mailbox listing");
    await t.database.db.transaction(async (tx) => {
      await notify(tx, "submitted", { ...c, note: "older" });
      await notify(tx, "approved", { ...c, comment: "newer" });
    });
    const d = dispatcher();
    expect((await d.tick()).sent).toBe(2);
    await d.stop();

    const admin = await t.admin();
    const list = SinkMessageListSchema.parse((await admin.get("/api/admin/mailbox?limit=200")).body);
    const listed = list.messages.map((m) => m.id);
    expect(listed).toEqual([...listed].sort((x, y) => y - x));
    const mine = list.messages.filter((m) => m.subject.includes("Mailbox listing"));
    expect(mine.map((m) => m.subject)).toEqual([
      "[coastwatch-s] Approved: Mailbox listing r3",
      "[coastwatch-s] Review wanted: Mailbox listing r3",
    ]);
    expect(list.outbox.sent).toBeGreaterThanOrEqual(2);

    const first = mine[0]!;
    const one = await admin.get(`/api/admin/mailbox/${first.id}`);
    expect(one.status).toBe(200);
    const m = SinkMessageSchema.parse((one.body as { message: unknown }).message);
    expect(m.subject).toBe(first.subject);
    expect(m.text.length).toBeGreaterThan(0);
    expectError(await admin.get("/api/admin/mailbox/999999"), 404, "not_found");
  });

  it("refuses non-admins", async () => {
    const firmware = await signedIn(t.app, "firmware");
    expectError(await firmware.get("/api/admin/mailbox"), 403, "forbidden");
  });
});
