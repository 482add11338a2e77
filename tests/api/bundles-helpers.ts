// Helpers shared by the bundle, token and pull API tests: a released design, downloads as bytes, and
// unpacking with Debian's unzip (an outside tool, so the zip is checked by something we did not write).
import { execFileSync } from "node:child_process";
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import type request from "supertest";
import { ReleaseResponseSchema, type Release } from "../../shared/schemas/releases";
import { binary } from "./designs-helpers";
import { analysedDraft, barker13, expectStatus, signedIn } from "./lifecycle-helpers";
import type { Agent, ApiTestContext } from "./helpers";

/** A 4:1 decimation low-pass FIR (Kaiser design), Q1.15, with its limits; small enough to analyse in a blink. */
export const decimationFir = {
  kind: "filter",
  fir: {
    kind: "design",
    band: "lowpass",
    sampleRateHz: 40e6,
    cutoffHz: 5e6,
    transitionHz: 2e6,
    stopbandAttenuationDb: 60,
  },
  fixedPoint: { fir: { wordLength: 16, fractionLength: 15 } },
  inputBits: 12,
};

/** A released design: author submits, the demo reviewer approves, author releases `version`. */
export async function releasedDesign(t: ApiTestContext, content: object = barker13, version = "1.0.0") {
  const author = await signedIn(t.app, "author");
  const reviewer = await signedIn(t.app, "reviewer");
  const ids = await analysedDraft(t, author, content);
  expectStatus(await author.post(`/api/revisions/${ids.revisionId}/submit`), 200, "submit");
  expectStatus(
    await reviewer
      .post(`/api/revisions/${ids.revisionId}/decision`)
      .send({ decision: "approved", comment: "Meets the limits." }),
    201,
    "approve",
  );
  const rel = await author
    .post(`/api/revisions/${ids.revisionId}/release`)
    .send({ version, notes: "First issue for the bench." });
  expectStatus(rel, 201, "release");
  const release: Release = ReleaseResponseSchema.parse(rel.body).release;
  return { ...ids, author, reviewer, release };
}

/** GET a binary body as a Buffer (supertest's own parsers would treat a zip as text or drop it). */
export async function download(req: request.Test): Promise<request.Response & { body: Buffer }> {
  const res = await req.buffer(true).parse(binary as never);
  return res as request.Response & { body: Buffer };
}

/** GET /api/releases/:id/bundle as `agent`. */
export function bundleOf(agent: Agent, releaseId: number) {
  return download(agent.get(`/api/releases/${releaseId}/bundle`));
}

/** Unzip bytes into a fresh temporary folder with Debian's unzip; returns the folder, a reader and a cleanup. */
export function unzipToTemp(zip: Buffer): { dir: string; read(p: string): Buffer; cleanup(): void } {
  const dir = mkdtempSync(path.join(tmpdir(), "tapwright-bundle-"));
  const zipPath = `${dir}.zip`;
  writeFileSync(zipPath, zip);
  try {
    execFileSync("unzip", ["-q", zipPath, "-d", dir]);
  } finally {
    rmSync(zipPath, { force: true });
  }
  return {
    dir,
    read: (p) => readFileSync(path.join(dir, p)),
    cleanup: () => rmSync(dir, { recursive: true, force: true }),
  };
}
