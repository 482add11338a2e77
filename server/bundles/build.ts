/**
 * Builds a release bundle inside the release transaction: reads the revision, its stored tables, its
 * finished analysis report and approvals, renders every table with every selected export template,
 * computes the golden vectors, and zips it all deterministically (same input → same bytes).
 * Anything missing (no report, a template that fails) throws, so the release is not written.
 */
import { and, asc, eq } from "drizzle-orm";
import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import type { AnalysisReport } from "../../shared/dsp/analysis";
import { codeRange, quantize } from "../../shared/dsp/quantize";
import type { FixedPointSpec } from "../../shared/dsp/types";
import { buildExportContext, quantizedTableFields, TAP_ORDER } from "../../shared/exports/context";
import { RevisionContentSchema } from "../../shared/schemas/designs";
import type { Db } from "../db/client";
import {
  analysisReports,
  coefficientTables,
  designs,
  exportTemplates,
  projects,
  reviews,
  revisions,
  users,
} from "../db/schema";
import { builtinTemplate, builtinTemplates } from "../exports/builtins";
import { renderExport, type RenderableTemplate } from "../exports/render";
import { renderReportHtml } from "../reports/render-html";
import { decodeValues } from "../services/materialize";
import type { Tx } from "../services/designs";
import { buildGolden } from "./golden";
import { buildHdl, HDL_PATHS } from "./hdl";
import {
  BUNDLE_SCHEMA,
  BUNDLE_SCHEMA_VERSION,
  manifestDatapath,
  provenanceOf,
  TRANSMIT_CAUTION,
  type BundleManifest,
  type ManifestPerson,
  type ManifestTable,
} from "./manifest";
import { renderReadme } from "./readme";
import { comparePaths, sha256Hex, sha256sums, zipFiles, type BundleFile } from "./zip";

/** The JSON Schema of manifest.json, as committed in docs/ and copied byte for byte into each bundle. */
export const MANIFEST_SCHEMA_PATH = fileURLToPath(
  new URL("../../docs/schemas/manifest.schema.json", import.meta.url),
);

/** What a release passes to the builder. */
export interface BuildReleaseInput {
  revisionId: number;
  version: string;
  notes: string;
  /** User id of the releasing author. */
  releasedBy: number;
  releasedAt: Date;
  /** Export template ids (built-in word ids or custom numeric ids); default: every built-in. */
  templateIds?: readonly string[];
}

/** The built bundle. */
export interface BuiltBundle {
  zip: Buffer;
  sha256: string;
  size: number;
  manifest: BundleManifest;
}

/** A bundle could not be built (missing report, bad template, …): the release must not happen. */
export class BundleBuildError extends Error {
  constructor(message: string) {
    super(message);
    this.name = "BundleBuildError";
  }
}

type Executor = Db | Tx;

async function person(tx: Executor, id: number): Promise<ManifestPerson> {
  const [u] = await tx
    .select({ username: users.username, displayName: users.displayName })
    .from(users)
    .where(eq(users.id, id));
  if (!u) throw new BundleBuildError(`no user ${id}`);
  return u;
}

async function templatesFor(tx: Executor, ids: readonly string[]): Promise<RenderableTemplate[]> {
  const out: RenderableTemplate[] = [];
  for (const id of ids) {
    const builtin = builtinTemplate(id);
    if (builtin) {
      out.push(builtin);
      continue;
    }
    const [row] = /^\d+$/.test(id)
      ? await tx
          .select()
          .from(exportTemplates)
          .where(eq(exportTemplates.id, Number(id)))
      : [];
    if (!row) throw new BundleBuildError(`no export template "${id}"`);
    out.push({
      id: String(row.id),
      name: row.name,
      version: row.version,
      extension: row.extension,
      kind: "text",
      body: row.body,
    });
  }
  return out;
}

const enc = new TextEncoder();
const jsonBytes = (v: unknown) => enc.encode(`${JSON.stringify(v, null, 2)}\n`);

/** Build the release bundle of a revision (call inside the release transaction). */
export async function buildReleaseBundle(tx: Executor, input: BuildReleaseInput): Promise<BuiltBundle> {
  const [rev] = await tx
    .select({
      id: revisions.id,
      number: revisions.number,
      content: revisions.content,
      contentHash: revisions.contentHash,
      designId: designs.id,
      designName: designs.name,
      designKind: designs.kind,
      projectId: projects.id,
      projectSlug: projects.slug,
      projectName: projects.name,
    })
    .from(revisions)
    .innerJoin(designs, eq(designs.id, revisions.designId))
    .innerJoin(projects, eq(projects.id, designs.projectId))
    .where(eq(revisions.id, input.revisionId));
  if (!rev) throw new BundleBuildError(`no revision ${input.revisionId}`);
  if (!rev.contentHash)
    throw new BundleBuildError(`revision ${rev.id} is a draft: it has no content hash yet`);
  const contentHash = rev.contentHash;
  const content = RevisionContentSchema.parse(rev.content);

  const [reportRow] = await tx
    .select()
    .from(analysisReports)
    .where(
      and(
        eq(analysisReports.projectId, rev.projectId),
        eq(analysisReports.contentHash, contentHash),
        eq(analysisReports.state, "done"),
      ),
    );
  if (!reportRow?.report || !reportRow.finishedAt)
    throw new BundleBuildError(`revision r${rev.number} has no finished analysis report for its content`);
  const report = reportRow.report as AnalysisReport;

  const approvalRows = await tx
    .select({
      at: reviews.at,
      contentHash: reviews.contentHash,
      reportHash: reviews.reportHash,
      comment: reviews.comment,
      username: users.username,
      displayName: users.displayName,
    })
    .from(reviews)
    .innerJoin(users, eq(users.id, reviews.reviewerId))
    .where(
      and(
        eq(reviews.revisionId, rev.id),
        eq(reviews.decision, "approved"),
        eq(reviews.contentHash, contentHash),
      ),
    )
    .orderBy(asc(reviews.at), asc(reviews.id));

  const tableRows = await tx
    .select()
    .from(coefficientTables)
    .where(eq(coefficientTables.revisionId, rev.id))
    .orderBy(asc(coefficientTables.position));
  if (tableRows.length === 0) throw new BundleBuildError(`revision r${rev.number} has no coefficient tables`);

  const templates = await templatesFor(tx, input.templateIds ?? builtinTemplates().map((t) => t.id));
  const fixedPoint = content.fixedPoint as Record<string, FixedPointSpec | undefined>;
  const files: BundleFile[] = [];
  const tables: ManifestTable[] = [];
  const quantized = new Map<
    string,
    { signal: ReturnType<typeof decodeValues>; q: ReturnType<typeof quantize> }
  >();

  for (const t of tableRows) {
    const spec = fixedPoint[t.role];
    if (!spec) throw new BundleBuildError(`table ${t.role} has no fixed-point spec`);
    const signal = decodeValues(t.values);
    const q = quantize(signal, spec);
    quantized.set(t.role, { signal, q });
    const ctx = buildExportContext({
      project: { name: rev.projectName, slug: rev.projectSlug },
      design: { name: rev.designName, kind: rev.designKind },
      version: input.version,
      revision: rev.number,
      contentHash,
      role: t.role,
      sampleRateHz: t.sampleRateHz,
      complex: t.complex,
      ...quantizedTableFields(signal, q),
    });
    const exports: ManifestTable["exports"] = [];
    for (const template of templates) {
      let rendered;
      try {
        rendered = await renderExport(template, ctx);
      } catch (err) {
        throw new BundleBuildError(
          `template ${template.name} failed on table ${t.role}: ${(err as Error).message}`,
        );
      }
      const path = `tables/${t.role}/${rendered.fileName}`;
      files.push({ path, bytes: rendered.bytes });
      exports.push({ template: template.id, path });
    }
    tables.push({
      role: t.role,
      position: t.position,
      complex: t.complex,
      length: t.length,
      sampleRateHz: t.sampleRateHz,
      valuesSha256: t.valuesSha256,
      fixedPoint: { ...q.spec },
      gain: q.gain,
      codeRange: codeRange(q.spec),
      overflowCount: q.overflowCount,
      tapOrder: TAP_ORDER,
      provenance: provenanceOf(t.source as Record<string, unknown>),
      exports,
      datapath: null,
    });
  }

  // Golden vectors: waveforms echo tx and filter with rx; filters echo an impulse and filter with fir.
  const filterRole = content.kind === "waveform" ? "rx" : "fir";
  const filt = quantized.get(filterRole);
  if (!filt) throw new BundleBuildError(`the revision has no ${filterRole} table for the golden vectors`);
  const golden = buildGolden({
    kind: content.kind,
    waveform: quantized.get("tx")?.signal,
    filterRole,
    codes: { re: filt.q.re, im: filt.q.im },
    wordLength: filt.q.spec.wordLength,
    signed: filt.q.spec.signed,
    datapath: content.datapath,
    inputBits: content.inputBits,
    contentHash,
  });
  files.push(...golden.files);
  const dp = golden.summary.datapath;
  const filterTable = tables.find((x) => x.role === filterRole);
  if (filterTable) filterTable.datapath = manifestDatapath(dp);
  for (const f of buildHdl({
    title: `${rev.projectSlug}/${rev.designName} ${input.version}, table ${filterRole}`,
    contentHash,
    codes: { re: filt.q.re, im: filt.q.im },
    datapath: dp,
    sets: golden.summary.sets,
  }))
    files.push({ path: f.path, bytes: enc.encode(f.text) });

  const header = {
    project: rev.projectName,
    design: rev.designName,
    revision: `r${rev.number}`,
    contentHash,
    // The analysis finish time, so the report renders to the same bytes whenever it is built.
    generatedAt: reportRow.finishedAt.toISOString(),
    softwareVersion: reportRow.softwareVersion ?? "unknown",
  };
  files.push({ path: "report/report.html", bytes: enc.encode(renderReportHtml(header, report)) });
  files.push({ path: "report/report.json", bytes: jsonBytes({ header, report }) });
  files.push({ path: "manifest.schema.json", bytes: readFileSync(MANIFEST_SCHEMA_PATH) });

  const manifestBase: Omit<BundleManifest, "files"> = {
    schema: BUNDLE_SCHEMA,
    schemaVersion: BUNDLE_SCHEMA_VERSION,
    project: { slug: rev.projectSlug, name: rev.projectName },
    design: { id: rev.designId, name: rev.designName, kind: rev.designKind },
    version: input.version,
    notes: input.notes,
    revision: { id: rev.id, number: rev.number },
    contentHash,
    released: { at: input.releasedAt.toISOString(), by: await person(tx, input.releasedBy) },
    approvals: approvalRows.map((a) => ({
      reviewer: { username: a.username, displayName: a.displayName },
      at: a.at.toISOString(),
      contentHash: a.contentHash,
      reportHash: a.reportHash,
      comment: a.comment,
    })),
    conventions: {
      tapOrder: TAP_ORDER,
      codes:
        "Every coefficient is an integer code of the table's word length W; the value it stands for is code × 2^−F (F = fraction length), which is gain × the float coefficient up to rounding.",
      complex:
        "Complex tables carry I (real part) and Q (imaginary part) codes per tap; a real table has Q = 0 and its export files hold I only where the template says so.",
      checksums: "SHA-256, lower-case hex; SHA256SUMS is in GNU coreutils format (sha256sum -c SHA256SUMS).",
    },
    tables,
    templates: templates.map((t) => ({ id: t.id, name: t.name, version: t.version, kind: t.kind })),
    golden: {
      summary: "golden/sets.json",
      filterTable: filterRole,
      seed: golden.summary.scenario.seed,
      sets: golden.summary.sets,
    },
    hdl: HDL_PATHS,
    report: {
      html: "report/report.html",
      json: "report/report.json",
      generatedAt: header.generatedAt,
      softwareVersion: header.softwareVersion,
    },
    transmitCaution: content.kind === "waveform" ? TRANSMIT_CAUTION : null,
  };
  // README.txt is listed in the manifest, so it is rendered from the manifest before the file list.
  const readme = { path: "README.txt", bytes: enc.encode(renderReadme({ ...manifestBase, files: [] })) };
  files.push(readme);
  const manifest: BundleManifest = {
    ...manifestBase,
    files: [...files]
      .sort((a, b) => comparePaths(a.path, b.path))
      .map((f) => ({ path: f.path, size: f.bytes.byteLength, sha256: sha256Hex(f.bytes) })),
  };
  files.push({ path: "manifest.json", bytes: jsonBytes(manifest) });
  files.push({ path: "SHA256SUMS", bytes: enc.encode(sha256sums(files)) });

  const zip = await zipFiles(files, input.releasedAt);
  return { zip, sha256: sha256Hex(zip), size: zip.byteLength, manifest };
}
