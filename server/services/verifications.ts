/**
 * Verification runs (docs/verification.md): firmware uploads its simulation output for one vector set of a
 * release; the expected output is read from the release's stored bundle (zip checked against its SHA-256,
 * the file against the manifest), compared bit-exactly, and the run is stored with the uploaded bytes, audited
 * and mailed in one transaction. A bad file stores nothing. Runs are append-only (database trigger).
 */
import { createHash } from "node:crypto";
import { and, asc, desc, eq, inArray, sql } from "drizzle-orm";
import JSZip from "jszip";
import type { ReleaseVerification } from "../../shared/schemas/releases";
import type {
  CreateVerificationFields,
  ReleaseSummary,
  TableSummary,
  VectorSet,
  Verification,
} from "../../shared/schemas/verifications";
import type { Db } from "../db/client";
import { releases, reviews, users, verificationRuns } from "../db/schema";
import { HttpError } from "../http/errors";
import { notify } from "../mail/notifications";
import { recordAudit } from "./audit";
import type { Tx } from "./designs";
import type { Viewer } from "./projects";
import { getRelease } from "./releases";
import { mailBase, revisionFacts } from "./reviews";
import { cleanFileName, type ReceivedFile } from "./uploads";
import { formatOfName, SampleParseError, type Comparison } from "./verification-compare";
import { compare } from "./verification-runner";

type Json = Record<string, unknown>;
const isObj = (v: unknown): v is Json => typeof v === "object" && v !== null && !Array.isArray(v);
const str = (v: unknown, fallback = ""): string => (typeof v === "string" ? v : fallback);
const num = (v: unknown, fallback = 0): number =>
  typeof v === "number" && Number.isFinite(v) ? v : fallback;
const bigText = (v: unknown): string | null =>
  typeof v === "string" ? v : typeof v === "number" && Number.isFinite(v) ? String(v) : null;

function fileRef(v: unknown): VectorSet["expected"] {
  const o = isObj(v) ? v : {};
  return { text: str(o.text), hex: str(o.hex), length: num(o.length), bits: num(o.bits) };
}

/** Description of format 1.x's single golden set, which the reader calls `scenario`. */
const LEGACY_SCENARIO_DESCRIPTION =
  "Today's targets in seeded noise (golden/scenario.json): two delayed, scaled echoes of the transmit waveform (waveforms) or an impulse (filters).";

/**
 * The vector sets a manifest describes: `golden.sets` in format 2 bundles, or format 1.x's one set at
 * `golden/expected.txt` (manifest.golden), read as the set `scenario`.
 */
export function vectorSetsOf(manifest: unknown): VectorSet[] {
  const golden = isObj(manifest) && isObj(manifest.golden) ? manifest.golden : null;
  if (!golden) return [];
  if (Array.isArray(golden.sets))
    return golden.sets.filter(isObj).map((s) => ({
      name: str(s.name),
      description: str(s.description),
      stimulus: fileRef(s.stimulus),
      expected: fileRef(s.expected),
      maxAbsAccumulator: bigText(s.maxAbsAccumulator),
      accumulatorBound: bigText(s.accumulatorBound),
    }));
  if (!isObj(golden.expected)) return [];
  return [
    {
      name: "scenario",
      description: LEGACY_SCENARIO_DESCRIPTION,
      stimulus: fileRef(golden.stimulus),
      expected: fileRef(golden.expected),
      maxAbsAccumulator: null,
      accumulatorBound: null,
    },
  ];
}

/** Per-table summary of a manifest: length, W/F, signedness, gain, rounding, overflow, datapath if any. */
export function tableSummariesOf(manifest: unknown): TableSummary[] {
  const tables = isObj(manifest) && Array.isArray(manifest.tables) ? manifest.tables : [];
  return tables.filter(isObj).map((t) => {
    const fp = isObj(t.fixedPoint) ? t.fixedPoint : {};
    const dp = isObj(t.datapath) ? t.datapath : null;
    return {
      role: str(t.role),
      complex: t.complex === true,
      length: num(t.length),
      wordLength: num(fp.wordLength),
      fractionLength: num(fp.fractionLength),
      signed: fp.signed !== false,
      gain: num(t.gain, 1),
      rounding: str(fp.rounding, "nearest"),
      overflow: str(fp.overflow, "saturate"),
      overflowCount: num(t.overflowCount),
      datapath: dp
        ? Object.fromEntries(
            Object.entries(dp).filter(
              (e): e is [string, string | number | boolean | null] =>
                e[1] === null || ["string", "number", "boolean"].includes(typeof e[1]),
            ),
          )
        : null,
    };
  });
}

async function storedRelease(db: Db, releaseId: number) {
  const [row] = await db
    .select({ bundle: releases.bundle, sha256: releases.bundleSha256, manifest: releases.manifest })
    .from(releases)
    .where(eq(releases.id, releaseId));
  if (!row) throw new HttpError("not_found", "No such release");
  return row;
}

const sha256Hex = (b: Uint8Array) => createHash("sha256").update(b).digest("hex");

/** The expected output text of a set, from the stored zip after checking the zip and the file's digests. */
export async function expectedOutputOf(
  bundle: Buffer | null,
  bundleSha256: string | null,
  manifest: unknown,
  set: VectorSet,
): Promise<Uint8Array> {
  if (!bundle || !bundleSha256) throw new HttpError("not_found", "This release has no stored bundle");
  if (sha256Hex(bundle) !== bundleSha256)
    throw new HttpError(
      "bundle_corrupt",
      "The stored bundle does not match its recorded SHA-256; nothing was compared. Tell an administrator.",
    );
  const files = isObj(manifest) && Array.isArray(manifest.files) ? manifest.files.filter(isObj) : [];
  const listed = files.find((f) => f.path === set.expected.text);
  const zip = await JSZip.loadAsync(bundle);
  const entry = zip.file(set.expected.text);
  if (!entry || !listed)
    throw new HttpError("internal", `The bundle lacks ${set.expected.text}, which its manifest names`);
  const bytes = await entry.async("uint8array");
  if (sha256Hex(bytes) !== listed.sha256)
    throw new HttpError("internal", `${set.expected.text} in the stored bundle does not match its manifest`);
  return bytes;
}

const runColumns = {
  id: verificationRuns.id,
  releaseId: verificationRuns.releaseId,
  vectorSet: verificationRuns.vectorSet,
  verdict: verificationRuns.verdict,
  compared: verificationRuns.compared,
  mismatches: verificationRuns.mismatches,
  latencySamples: verificationRuns.latencySamples,
  latencySource: verificationRuns.latencySource,
  result: verificationRuns.result,
  outputBits: verificationRuns.outputBits,
  format: verificationRuns.format,
  fileName: verificationRuns.fileName,
  uploadSha256: verificationRuns.uploadSha256,
  uploadSize: verificationRuns.uploadSize,
  simulator: verificationRuns.simulator,
  rtlRevision: verificationRuns.rtlRevision,
  releaseWithdrawn: verificationRuns.releaseWithdrawn,
  byId: users.id,
  byName: users.displayName,
  at: verificationRuns.at,
};
type RunRow = Omit<
  { [K in keyof typeof runColumns]: (typeof runColumns)[K]["_"]["data"] },
  "simulator" | "rtlRevision"
> & { simulator: string | null; rtlRevision: string | null };

function toVerification(r: RunRow): Verification {
  const x = r.result as Partial<Comparison>;
  return {
    id: r.id,
    releaseId: r.releaseId,
    vectorSet: r.vectorSet,
    verdict: r.verdict,
    compared: r.compared,
    mismatches: r.mismatches,
    firstMismatch: x.firstMismatch ?? null,
    latencySamples: r.latencySamples,
    latencySource: r.latencySource,
    maxAbsErrorLsb: x.maxAbsErrorLsb ?? 0,
    missingSamples: x.missingSamples ?? 0,
    extraSamples: x.extraSamples ?? 0,
    uploadedSamples: x.uploadedSamples ?? 0,
    outputBits: r.outputBits,
    format: r.format,
    fileName: r.fileName,
    uploadSize: r.uploadSize,
    uploadSha256: r.uploadSha256,
    simulator: r.simulator,
    rtlRevision: r.rtlRevision,
    releaseWithdrawn: r.releaseWithdrawn,
    errorEnvelope: x.errorEnvelope ?? { bucket: 1, maxAbsLsb: [] },
    by: { id: r.byId, displayName: r.byName },
    at: r.at.toISOString(),
  };
}

/** GET /api/releases/:id/verifications: newest first (404 outside my projects). */
export async function listVerifications(db: Db, viewer: Viewer, releaseId: number): Promise<Verification[]> {
  await getRelease(db, viewer, releaseId);
  const rows = await db
    .select(runColumns)
    .from(verificationRuns)
    .innerJoin(users, eq(users.id, verificationRuns.uploadedById))
    .where(eq(verificationRuns.releaseId, releaseId))
    .orderBy(desc(verificationRuns.at), desc(verificationRuns.id));
  return rows.map(toVerification);
}

/** GET /api/releases/:id/summary: tables, vector sets and approvals as the stored manifest states them. */
export async function releaseSummary(db: Db, viewer: Viewer, releaseId: number): Promise<ReleaseSummary> {
  const release = await getRelease(db, viewer, releaseId);
  const { manifest, bundle, sha256 } = await storedRelease(db, releaseId);
  const m = isObj(manifest) ? manifest : {};
  // The manifest lists every file but itself and SHA256SUMS: those two come from the zip (if it is intact).
  const files = [...release.files];
  if (bundle && sha256 && sha256Hex(bundle) === sha256) {
    const zip = await JSZip.loadAsync(bundle);
    for (const p of ["manifest.json", "SHA256SUMS"]) {
      const entry = zip.file(p);
      if (!entry || files.some((f) => f.path === p)) continue;
      const bytes = await entry.async("uint8array");
      files.push({ path: p, size: bytes.byteLength, sha256: sha256Hex(bytes) });
    }
  }
  files.sort((a, b) => (a.path < b.path ? -1 : a.path > b.path ? 1 : 0));
  const approvals = Array.isArray(m.approvals) ? m.approvals.filter(isObj) : [];
  return {
    schemaVersion: str(m.schemaVersion, "unknown"),
    tables: tableSummariesOf(m),
    vectorSets: vectorSetsOf(m),
    approvals: approvals.map((a) => ({
      reviewer: str(isObj(a.reviewer) ? a.reviewer.displayName : undefined),
      at: str(a.at),
      comment: str(a.comment),
    })),
    files,
  };
}

const describeSample = (s: { re: number; im: number }) => `(${s.re}, ${s.im})`;

/** "sample 17: expected (12, -3), got (13, -3)" or "" on a pass. */
export function describeFirstMismatch(c: Pick<Comparison, "firstMismatch">): string {
  const f = c.firstMismatch;
  if (!f) return "";
  return `sample ${f.index}: expected ${describeSample(f.expected)}, ${f.got ? `got ${describeSample(f.got)}` : "the upload ended before it"}`;
}

/** POST /api/releases/:id/verifications */
export async function createVerification(
  db: Db,
  viewer: Viewer,
  releaseId: number,
  fields: CreateVerificationFields,
  file: ReceivedFile,
  tokenId: number | null,
): Promise<Verification> {
  const release = await getRelease(db, viewer, releaseId);
  const stored = await storedRelease(db, releaseId);
  const sets = vectorSetsOf(stored.manifest);
  const set = sets.find((s) => s.name === fields.vectorSet);
  if (!set)
    throw new HttpError(
      "validation_failed",
      `This release has no vector set "${fields.vectorSet}"; it has ${sets.map((s) => s.name).join(", ") || "none"}`,
      [{ path: ["vectorSet"], message: `one of ${sets.map((s) => s.name).join(", ")}` }],
    );
  const expected = await expectedOutputOf(stored.bundle, stored.sha256, stored.manifest, set);
  const fileName = cleanFileName(file.originalname);
  const format = fields.format === "auto" ? formatOfName(fileName) : fields.format;
  let result: Comparison;
  try {
    result = await compare({
      expected,
      upload: new Uint8Array(file.buffer.buffer, file.buffer.byteOffset, file.buffer.byteLength),
      format,
      bits: set.expected.bits,
      latency: fields.latency,
    });
  } catch (e) {
    if (e instanceof SampleParseError)
      throw new HttpError(
        "validation_failed",
        `${fileName}, ${e.message} (read as ${format === "hex" ? `$readmemh hex words of ${set.expected.bits} bits` : "decimal `I Q` lines"})`,
        [{ path: ["file"], message: e.message, line: e.line, column: e.column }],
      );
    throw e;
  }
  const uploadSha256 = sha256Hex(file.buffer);
  const id = await db.transaction(async (tx) => {
    const r = await revisionFacts(tx, viewer, release.revisionId);
    const [row] = await tx
      .insert(verificationRuns)
      .values({
        releaseId,
        vectorSet: set.name,
        verdict: result.verdict,
        compared: result.compared,
        mismatches: result.mismatches,
        latencySamples: result.latencySamples,
        latencySource: result.latencySource,
        result: result as unknown as Json,
        outputBits: set.expected.bits,
        format,
        fileName,
        upload: file.buffer,
        uploadSha256,
        uploadSize: file.buffer.byteLength,
        simulator: fields.simulator ?? null,
        rtlRevision: fields.rtlRevision ?? null,
        releaseWithdrawn: release.withdrawn !== null,
        uploadedById: viewer.id,
        tokenId,
      })
      .returning({ id: verificationRuns.id });
    if (!row) throw new Error("verification insert returned no row");
    const firstMismatch = describeFirstMismatch(result);
    await recordAudit(tx, {
      action: "verification.create",
      projectId: release.projectId,
      subjectType: "release",
      subjectId: releaseId,
      summary: `Verification ${result.verdict.toUpperCase()} of ${release.designName} ${release.version} (${set.name}): ${result.mismatches} of ${result.compared} samples differ${release.withdrawn ? " (release withdrawn)" : ""}`,
      details: {
        verificationId: row.id,
        version: release.version,
        vectorSet: set.name,
        verdict: result.verdict,
        compared: result.compared,
        mismatches: result.mismatches,
        firstMismatch: result.firstMismatch,
        latencySamples: result.latencySamples,
        fileName,
        uploadSha256,
        uploadSize: file.buffer.byteLength,
        simulator: fields.simulator ?? null,
        rtlRevision: fields.rtlRevision ?? null,
        releaseWithdrawn: release.withdrawn !== null,
        tokenId,
      },
    });
    const approvers = await tx
      .selectDistinct({ id: reviews.reviewerId })
      .from(reviews)
      .where(and(eq(reviews.revisionId, release.revisionId), eq(reviews.decision, "approved")));
    await notify(tx, "verified", {
      ...mailBase(r, viewer.id),
      release: { id: releaseId, version: release.version },
      reviewerUserIds: approvers.map((a) => a.id),
      run: {
        vectorSet: set.name,
        verdict: result.verdict,
        compared: result.compared,
        mismatches: result.mismatches,
        firstMismatch,
        simulator: fields.simulator ?? "",
        rtlRevision: fields.rtlRevision ?? "",
        uploadSha256,
        withdrawn: release.withdrawn !== null,
      },
    });
    return row.id;
  });
  const [row] = await db
    .select(runColumns)
    .from(verificationRuns)
    .innerJoin(users, eq(users.id, verificationRuns.uploadedById))
    .where(eq(verificationRuns.id, id));
  if (!row) throw new Error(`verification ${id} vanished`);
  return toVerification(row);
}

/** GET /api/releases/:id/verifications/:runId/upload: the bytes as uploaded. */
export async function verificationUpload(
  db: Db,
  viewer: Viewer,
  releaseId: number,
  runId: number,
): Promise<{ fileName: string; sha256: string; bytes: Buffer }> {
  await getRelease(db, viewer, releaseId);
  const [row] = await db
    .select({
      fileName: verificationRuns.fileName,
      sha256: verificationRuns.uploadSha256,
      bytes: verificationRuns.upload,
    })
    .from(verificationRuns)
    .where(and(eq(verificationRuns.id, runId), eq(verificationRuns.releaseId, releaseId)));
  if (!row) throw new HttpError("not_found", "No such verification run");
  return row;
}

/** Each release's newest run and the sets with a passing run, for release lists (two small queries). */
export async function verificationStates(
  db: Db | Tx,
  releaseIds: readonly number[],
): Promise<Map<number, Omit<ReleaseVerification, "sets">>> {
  const out = new Map<number, Omit<ReleaseVerification, "sets">>();
  if (releaseIds.length === 0) return out;
  const ids = [...new Set(releaseIds)];
  const latest = await db
    .selectDistinctOn([verificationRuns.releaseId], {
      releaseId: verificationRuns.releaseId,
      verdict: verificationRuns.verdict,
      vectorSet: verificationRuns.vectorSet,
      at: verificationRuns.at,
    })
    .from(verificationRuns)
    .where(inArray(verificationRuns.releaseId, ids))
    .orderBy(asc(verificationRuns.releaseId), desc(verificationRuns.at), desc(verificationRuns.id));
  const passed = await db
    .select({
      releaseId: verificationRuns.releaseId,
      sets: sql<
        string[]
      >`array_agg(distinct ${verificationRuns.vectorSet} order by ${verificationRuns.vectorSet})`,
    })
    .from(verificationRuns)
    .where(and(inArray(verificationRuns.releaseId, ids), eq(verificationRuns.verdict, "pass")))
    .groupBy(verificationRuns.releaseId);
  for (const l of latest)
    out.set(l.releaseId, {
      latest: { verdict: l.verdict, vectorSet: l.vectorSet, at: l.at.toISOString() },
      passedSets: [],
    });
  for (const p of passed) {
    const s = out.get(p.releaseId);
    if (s) s.passedSets = p.sets;
  }
  return out;
}
