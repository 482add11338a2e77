// Review and release end to end (issue 6): the author runs the analysis and submits r1, the reviewer
// requests changes with a comment, the author starts r2 and submits it, the reviewer approves, and the
// author releases 1.0.0. Author and reviewer each have their own browser context (own session cookie).
// A screenshot of each step goes to test-results/screenshots/review-*.png, with axe on each page.
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import {
  createDemoDesign,
  DEMO,
  expectAccessible,
  launch,
  openPage,
  screenshot,
  signIn,
  type GuardedPage,
} from "./browser";

let browser: Browser;
let author: GuardedPage;
let reviewer: GuardedPage;
beforeAll(async () => {
  browser = await launch();
  author = await openPage(browser);
  reviewer = await openPage(browser);
  await signIn(author.page, DEMO.author.username, DEMO.author.password, DEMO.author.displayName);
  await signIn(reviewer.page, DEMO.reviewer.username, DEMO.reviewer.password, DEMO.reviewer.displayName);
});
afterAll(async () => {
  await browser.close();
});

/** A small LFM waveform draft with loose limits, made for this test so no other test's edits reach it. */
async function createDesign(p: GuardedPage, name: string): Promise<{ designId: number; revisionId: number }> {
  return createDemoDesign(p.page, {
    name,
    description:
      "1 MHz / 40 µs LFM, Hamming receive weighting: the review-and-release test (fictional programme).",
    content: {
      kind: "waveform",
      tx: { kind: "lfm", bandwidthHz: 1e6, pulseWidthS: 40e-6, sampleRateHz: 1.25e6 },
      rx: { window: { kind: "hamming" } },
      fixedPoint: {
        tx: { wordLength: 12, fractionLength: 11 },
        rx: { wordLength: 12, fractionLength: 11 },
      },
      limits: { pslDbMax: -20, mismatchLossDbMax: 3 },
      sweep: { minBits: 6, maxBits: 10 },
    },
  });
}

/** Runs the analysis of the open revision page unless the same content was analysed before; waits for it to finish. */
async function analyse(page: Page): Promise<void> {
  const section = page.getByRole("region", { name: "Analysis" });
  const run = section.getByRole("button", { name: "Run analysis" });
  const report = section.getByRole("link", { name: "Open the report" });
  // Wait until the status is known: r2 copies r1's content, whose report may already exist (same hash).
  // Either a report exists (same content analysed before), or the button is usable; queued/running waits here.
  await expect
    .poll(async () => (await report.count()) > 0 || (await run.isEnabled().catch(() => false)), {
      timeout: 90_000,
    })
    .toBe(true);
  if ((await report.count()) === 0) await run.click();
  await section.getByRole("link", { name: "Open the report" }).waitFor({ timeout: 90_000 });
}

/** Submits the draft open on the page through the confirm dialog. */
async function submit(page: Page, r: string): Promise<void> {
  const button = page.getByRole("button", { name: "Submit for review" });
  await expect.poll(() => button.isEnabled()).toBe(true);
  await button.click();
  const dialog = page.getByRole("dialog", { name: `Submit ${r} for review?` });
  await dialog.getByText("This cannot be undone").waitFor();
  await dialog.getByRole("button", { name: `Submit ${r}` }).click();
  await page
    .getByRole("status")
    .filter({ hasText: `${r} is in review` })
    .waitFor();
}

/** The reviewer opens the queue, finds the revision (oldest first, limits shown) and opens it. */
async function openFromQueue(page: Page, designName: string, r: string, shot: string): Promise<void> {
  await page.goto("/reviews");
  const queue = page.getByRole("table", { name: "Review queue" });
  const link = queue.getByRole("link", { name: `${designName} ${r}` });
  await link.waitFor();
  // The verdict is in the list itself: this design passes every limit.
  await expect(
    queue
      .getByRole("row")
      .filter({ hasText: `${designName} ${r}` })
      .textContent(),
  ).resolves.toContain("All limits pass");
  await screenshot(page, shot);
  await expectAccessible(page, shot);
  await link.click();
  await page.getByRole("region", { name: "Review" }).getByRole("form", { name: "Decision" }).waitFor();
}

describe("review and release", () => {
  it("submit → changes requested → r2 → approved → released as 1.0.0", async () => {
    const name = `E2E reviewed chirp ${Date.now().toString(36)}`;
    const { designId, revisionId: r1 } = await createDesign(author, name);
    const a = author.page;
    const v = reviewer.page;

    // 1. Before the analysis has finished the page's one action is to run it; Submit comes after.
    await a.goto(`/revisions/${r1}`);
    await a.getByRole("button", { name: "Run analysis" }).first().waitFor();
    expect(await a.getByRole("button", { name: "Submit for review" }).count()).toBe(0);
    await screenshot(a, "review-1-submit-needs-report");
    await expectAccessible(a, "review-1-submit-needs-report");
    await analyse(a);
    await a.getByRole("button", { name: "Submit for review" }).waitFor();
    await submit(a, "r1");
    const review = a.getByRole("region", { name: "Review" });
    await review.getByText(/Submitted by Ilse Marrow/).waitFor();
    await review
      .getByText(`Waiting for a reviewer other than ${DEMO.author.displayName} to decide.`)
      .waitFor();
    await screenshot(a, "review-2-submitted");
    await expectAccessible(a, "review-2-submitted");

    // 2. The reviewer finds it in the queue, comments (Ctrl+Enter), and requests changes with a comment.
    await openFromQueue(v, name, "r1", "review-3-queue");
    const vr = v.getByRole("region", { name: "Review" });
    await vr.getByRole("list", { name: "Acceptance limits" }).getByText("pass").first().waitFor();
    await vr
      .getByRole("table", { name: "Figures against the previous release" })
      .getByRole("row", { name: /Peak sidelobe level/ })
      .waitFor();
    // Plain text stays text: markup typed into a comment is shown, not rendered.
    const comment = vr.getByLabel("Add a comment");
    await comment.fill("<b>rx</b> taper: is Hamming enough at W = 12?");
    await comment.press("Control+Enter");
    await vr
      .getByRole("list", { name: "Comments" })
      .getByText("<b>rx</b> taper: is Hamming enough at W = 12?")
      .waitFor();
    expect(await vr.getByRole("list", { name: "Comments" }).locator("b").count()).toBe(0);
    await expect(comment.inputValue()).resolves.toBe("");

    const decision = vr.getByRole("form", { name: "Decision" });
    await decision.getByLabel("Request changes", { exact: true }).check();
    await decision.getByRole("button", { name: "Record decision…" }).click();
    await decision.getByText("say what needs to change").waitFor();
    await decision
      .getByLabel("What needs to change (required)")
      .fill("Widen the rx word to 14 bits and re-run the sweep.");
    await decision.getByRole("button", { name: "Record decision…" }).click();
    const confirmChanges = v.getByRole("dialog", { name: "Request changes to r1?" });
    const page1 = (await (await v.request.get(`/api/revisions/${r1}/review`)).json()) as {
      revision: { contentHash: string };
    };
    await confirmChanges
      .getByText(`bound to content hash ${page1.revision.contentHash.slice(0, 12)}…`, { exact: false })
      .waitFor();
    await screenshot(v, "review-4-request-changes-confirm");
    await expectAccessible(v, "review-4-request-changes-confirm");
    await confirmChanges.getByRole("button", { name: "Request changes" }).click();
    await vr.getByRole("list", { name: "Decisions" }).getByText("Changes requested").waitFor();
    await vr.getByText("Widen the rx word to 14 bits and re-run the sweep.").waitFor();
    await screenshot(v, "review-5-changes-requested");

    // 3. The author reads the request, starts r2 from the design page and submits it.
    await a.goto(`/revisions/${r1}`);
    await a
      .getByRole("region", { name: "Review" })
      .getByText("Widen the rx word to 14 bits and re-run the sweep.")
      .waitFor();
    await a.goto(`/designs/${designId}`);
    await a.getByRole("button", { name: "Start revision r2" }).click();
    await a.getByRole("link", { name: "Open r2" }).click();
    await a.getByRole("heading", { name: /r2/ }).first().waitFor();
    const r2 = Number(/\/revisions\/(\d+)$/.exec(a.url())?.[1]);
    expect(Number.isInteger(r2) && r2 !== r1).toBe(true);
    await analyse(a);
    await submit(a, "r2");
    await screenshot(a, "review-6-r2-submitted");

    // 4. The reviewer approves r2 (the decision is bound to r2's content hash).
    await openFromQueue(v, name, "r2", "review-7-queue-r2");
    const vr2 = v.getByRole("region", { name: "Review" });
    const decision2 = vr2.getByRole("form", { name: "Decision" });
    await decision2.getByLabel("Approve", { exact: true }).check();
    await decision2
      .getByLabel("Comment")
      .fill("Checked against the limits; fine for the coastal trial build.");
    await decision2.getByLabel("Comment", { exact: true }).press("Control+Enter");
    const confirmApprove = v.getByRole("dialog", { name: "Approve r2?" });
    await confirmApprove.getByText("bound to content hash", { exact: false }).waitFor();
    await confirmApprove.getByRole("button", { name: "Approve" }).click();
    await vr2.getByRole("list", { name: "Decisions" }).getByText("Approved").waitFor();
    await screenshot(v, "review-8-approved");
    await expectAccessible(v, "review-8-approved");
    await v.goto("/reviews");
    await v
      .getByRole("table", { name: "Review queue" })
      .or(v.getByText("Nothing waits for you"))
      .first()
      .waitFor();
    expect(await v.getByRole("link", { name: `${name} r2` }).count()).toBe(0);

    // 5. The author releases r2 as 1.0.0.
    await a.goto(`/revisions/${r2}`);
    const ar = a.getByRole("region", { name: "Review" });
    await ar.getByRole("button", { name: "Release…" }).click();
    const dialog = a.getByRole("dialog", { name: "Release r2" });
    await dialog
      .getByRole("group", { name: /Suggested versions/ })
      .getByRole("button", { name: /1\.0\.0/ })
      .waitFor();
    const version = dialog.getByLabel("Version (MAJOR.MINOR.PATCH)");
    await version.fill("1.0");
    await dialog.getByText("use MAJOR.MINOR.PATCH", { exact: false }).waitFor();
    await version.fill("01.0.0");
    await dialog.getByText("no leading zeros", { exact: false }).waitFor();
    await dialog
      .getByRole("group", { name: /Suggested versions/ })
      .getByRole("button", { name: /1\.0\.0/ })
      .click();
    await expect(version.inputValue()).resolves.toBe("1.0.0");
    await expect.poll(() => dialog.getByText("use MAJOR.MINOR.PATCH", { exact: false }).count()).toBe(0);
    await dialog
      .getByLabel("Release notes")
      .fill("First release for the coastal trial build: Hamming receive weighting, 12-bit tx and rx.");
    await dialog.getByRole("complementary", { name: "Transmit caution" }).waitFor();
    await screenshot(a, "review-9-release-dialog");
    await expectAccessible(a, "review-9-release-dialog");
    await dialog.getByRole("button", { name: "Continue…" }).click();
    const confirm = a.getByRole("dialog", { name: "Release 1.0.0?" });
    await confirm.getByText("A release cannot be changed or deleted.").waitFor();
    await screenshot(a, "review-10-release-confirm");
    await confirm.getByRole("button", { name: "Release 1.0.0" }).click();
    await a.getByRole("status").filter({ hasText: "1.0.0 released" }).waitFor({ timeout: 60_000 });
    await expect.poll(() => confirm.count()).toBe(0);
    await ar.getByText("Released as").waitFor();
    await ar.getByRole("link", { name: "1.0.0" }).waitFor();
    await ar.getByRole("button", { name: "Withdraw…" }).waitFor();
    await screenshot(a, "review-11-released");

    // The design page's timeline lists the release with its bundle checksum.
    await a.goto(`/designs/${designId}`);
    const releases = a.getByRole("table", { name: "Releases" });
    await releases.getByRole("link", { name: "1.0.0" }).waitFor();
    await releases.getByText("active").waitFor();
    await screenshot(a, "review-12-design-releases");
    await expectAccessible(a, "review-12-design-releases");

    const api = (await (await a.request.get(`/api/designs/${designId}/releases`)).json()) as {
      releases: Array<{
        version: string;
        revisionId: number;
        bundleSha256: string | null;
        withdrawn: unknown;
      }>;
    };
    expect(api.releases.map((r) => [r.version, r.revisionId, r.withdrawn])).toEqual([["1.0.0", r2, null]]);
    expect(api.releases[0]?.bundleSha256).toMatch(/^[0-9a-f]{64}$/);

    // The author's home lists the release; withdrawing it needs a reason and keeps it listed, flagged.
    await a.goto("/");
    await a
      .getByRole("table", { name: "Last releases" })
      .getByRole("row")
      .filter({ hasText: name })
      .getByText("1.0.0")
      .waitFor();
    await screenshot(a, "review-13-home-author");
    await expectAccessible(a, "review-13-home-author");
    await a.goto(`/designs/${designId}`);
    await releases.getByRole("button", { name: "Withdraw…" }).click();
    const withdraw = a.getByRole("dialog", { name: "Withdraw 1.0.0?" });
    await withdraw.getByText("stays visible and downloadable", { exact: false }).waitFor();
    await withdraw.getByRole("button", { name: "Withdraw 1.0.0" }).click();
    await withdraw.getByText("give a reason").waitFor();
    await withdraw
      .getByLabel("Reason (required)")
      .fill("Superseded: rx word length to be widened for the trial.");
    await screenshot(a, "review-14-withdraw-dialog");
    await expectAccessible(a, "review-14-withdraw-dialog");
    await withdraw.getByRole("button", { name: "Withdraw 1.0.0" }).click();
    await releases.getByText("withdrawn").waitFor();
    await releases.getByText("Superseded: rx word length to be widened for the trial.").waitFor();
    await releases.getByRole("link", { name: "1.0.0" }).waitFor();

    for (const p of [author, reviewer]) {
      expect(p.foreign).toEqual([]);
      expect(p.pageErrors).toEqual([]);
    }
    // The whole life cycle with two analyses and a bundle build: on a shared 2-core machine this needs room.
  }, 300_000);
});
