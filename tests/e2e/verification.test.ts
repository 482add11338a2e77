// Verification end to end on the demo's released 4:1 decimation FIR: the firmware engineer sees it waiting
// on the home page, opens the release (table summary, vector sets), uploads a malformed file (refused with
// its line and column), the set's expected output (PASS) and a copy with one sample off by one LSB (FAIL,
// first mismatch shown, error plot); the releases list shows the newest verdict; the reviewer sees the
// evidence in the review section of the released revision. Screenshots and axe on each page.
import JSZip from "jszip";
import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DEMO, expectAccessible, launch, openPage, screenshot, signIn, type GuardedPage } from "./browser";

const DESIGN = "4:1 decimation FIR";

let browser: Browser;
let firmware: GuardedPage;
let reviewer: GuardedPage;
let release: { id: number; revisionId: number; version: string };
let expected: string;
let broken: string;
const BROKEN_INDEX = 5;

beforeAll(async () => {
  browser = await launch();
  [firmware, reviewer] = await Promise.all([openPage(browser), openPage(browser)]);
  await signIn(firmware.page, DEMO.firmware.username, DEMO.firmware.password, DEMO.firmware.displayName);
  await signIn(reviewer.page, DEMO.reviewer.username, DEMO.reviewer.password, DEMO.reviewer.displayName);
  const list = (await (await firmware.page.request.get("/api/releases?project=coastwatch-s")).json()) as {
    releases: { id: number; revisionId: number; version: string; designName: string }[];
  };
  const found = list.releases.find((r) => r.designName === DESIGN && r.version === "1.0.0");
  expect(found, "the demo seed releases the decimation FIR as 1.0.0").toBeDefined();
  release = found!;
  const zip = await JSZip.loadAsync(
    await (await firmware.page.request.get(`/api/releases/${release.id}/bundle`)).body(),
  );
  expected = await zip.file("golden/scenario/expected.txt")!.async("string");
  const lines = expected.split("\n");
  const [re, im] = lines[BROKEN_INDEX]!.split(" ").map(Number);
  lines[BROKEN_INDEX] = `${re! + 1} ${im}`;
  broken = lines.join("\n");
}, 120_000);

afterAll(async () => {
  await browser.close();
});

describe("verification runs in the browser", () => {
  it("firmware sees the release waiting, uploads, and reads each verdict", async () => {
    const { page } = firmware;
    await page.goto("/");
    const waiting = page.getByRole("table", { name: "Waiting for verification" });
    await waiting.getByRole("link", { name: "1.0.0" }).first().waitFor();
    await expect
      .poll(() => waiting.getByRole("row", { name: new RegExp(DESIGN) }).count())
      .toBeGreaterThan(0);
    await screenshot(page, "verification-firmware-home");

    await page.goto(`/releases/${release.id}`);
    await page.getByRole("table", { name: "Coefficient tables" }).waitFor();
    const tables = page.getByRole("table", { name: "Coefficient tables" });
    await expect
      .poll(() => tables.getByRole("row", { name: /fir/ }).textContent())
      .toMatch(/real.*18.*17.*signed/);
    await expect.poll(() => page.getByText(/Approved by Tomas Quill on/).count()).toBe(1);
    const files = page.getByRole("table", { name: "Bundle files" });
    await files.getByRole("cell", { name: "SHA256SUMS" }).waitFor();
    await files.getByRole("cell", { name: "manifest.json" }).waitFor();
    await page
      .getByRole("table", { name: "Vector sets" })
      .getByRole("cell", { name: "scenario", exact: true })
      .waitFor();

    const form = page.getByRole("form", { name: "Upload simulation output" });
    // A malformed file: refused with the line and column, and nothing is recorded.
    await form.getByLabel("Simulation output").setInputFiles({
      name: "sim_bad.txt",
      mimeType: "text/plain",
      buffer: Buffer.from("# bench output\n12 -4\n7 x\n"),
    });
    await form.getByRole("button", { name: "Upload and compare" }).click();
    await expect
      .poll(() => form.getByRole("alert").textContent())
      .toMatch(/sim_bad\.txt, line 3, column 3: expected a decimal integer \(Q/);
    await screenshot(page, "verification-bad-file");
    await page.getByRole("table", { name: "Vector sets" }).waitFor();
    expect(await page.getByRole("table", { name: "Verification runs" }).count()).toBe(0);

    // The set's own expected output passes, typed from the keyboard after choosing the file.
    await form.getByLabel("Simulation output").setInputFiles({
      name: "sim_scenario.txt",
      mimeType: "text/plain",
      buffer: Buffer.from(`# captured on out_valid\n${expected}`),
    });
    await form.getByLabel("Simulator (optional)").fill("Icarus Verilog 12");
    await form.getByLabel("RTL revision (optional)").fill("fir_dec4 4f2a9c1");
    await form.getByLabel("RTL revision (optional)").press("Enter");
    const runs = page.getByRole("table", { name: "Verification runs" });
    await runs.waitFor();
    await expect.poll(() => runs.getByRole("row").nth(1).textContent()).toMatch(/scenarioPASS/);

    // One LSB off at sample 5: FAIL with the first mismatch, and the error plot.
    await form.getByLabel("Simulation output").setInputFiles({
      name: "sim_broken.txt",
      mimeType: "text/plain",
      buffer: Buffer.from(broken),
    });
    await form.getByLabel("Latency (samples)").fill("0");
    await form.getByRole("button", { name: "Upload and compare" }).click();
    await expect.poll(() => runs.getByRole("row").count()).toBe(3);
    const newest = runs.getByRole("row").nth(1);
    await expect.poll(() => newest.textContent()).toMatch(/FAIL/);
    expect(await newest.textContent()).toMatch(new RegExp(`#${BROKEN_INDEX}: \\(`));
    await page
      .getByRole("img", { name: /Error of run \d+/ })
      .or(page.getByText(/Error of run \d+/))
      .first()
      .waitFor();
    await page.getByRole("table", { name: "Vector sets" }).getByText("FAIL", { exact: true }).waitFor();
    await screenshot(page, "verification-release");
    await expectAccessible(page, "verification-release");

    await page.goto("/releases?project=coastwatch-s");
    const list = page.getByRole("table", { name: "Releases" });
    const row = list.getByRole("row", { name: new RegExp(DESIGN) });
    await expect.poll(() => row.textContent()).toMatch(/FAIL1\/5 passed/);
    await screenshot(page, "verification-releases-list");
  });

  it("the reviewer sees the evidence beside the report of the released revision", async () => {
    const { page } = reviewer;
    await page.goto(`/revisions/${release.revisionId}`);
    const evidence = page.getByRole("group", { name: "Verification evidence" });
    await evidence.waitFor();
    await expect.poll(() => evidence.textContent()).toMatch(/scenarioFAIL1 of \d+ differ/);
    expect(await evidence.textContent()).toMatch(/Priya Lund/);
    await evidence.scrollIntoViewIfNeeded();
    await screenshot(page, "verification-reviewer");
    await expectAccessible(page, "verification-reviewer");
  });
});
