/**
 * Release diff (issue 7): what a firmware engineer must know before moving from one release of a design to
 * another — the fixed-point spec fields that changed, how far each coefficient word moved (in LSB), and the
 * report's figures side by side. Computed from the stored tables, specs and reports; nothing is rebuilt.
 */
import { and, asc, eq } from "drizzle-orm";
import type { AnalysisReport } from "../../shared/dsp/analysis";
import { quantize } from "../../shared/dsp/quantize";
import type { FixedPointSpec, QuantizedTable } from "../../shared/dsp/types";
import { RevisionContentSchema } from "../../shared/schemas/designs";
import type { MetricChange, ReleaseDiff, SpecChange, TableChange } from "../../shared/schemas/release-diff";
import type { Release } from "../../shared/schemas/releases";
import type { Db } from "../db/client";
import { analysisReports, coefficientTables, revisions } from "../db/schema";
import { HttpError } from "../http/errors";
import { decodeValues } from "./materialize";
import type { Viewer } from "./projects";
import { getRelease } from "./releases";

/** One release as the comparison needs it: its identity, quantized tables and report. */
export interface DiffInput {
  release: Pick<Release, "id" | "version" | "revisionNumber" | "contentHash" | "designKind">;
  /** Quantized tables by role, in table order. */
  tables: ReadonlyMap<string, QuantizedTable>;
  /** The finished report of the release's content (null if none is stored). */
  report: Pick<AnalysisReport, "float" | "fixed" | "tables"> | null;
}

const SPEC_FIELDS: readonly (keyof FixedPointSpec)[] = [
  "wordLength",
  "fractionLength",
  "signed",
  "scaling",
  "rounding",
  "overflow",
];

/** Roles of both sides: `to`'s order first, then any role only `from` has. */
function rolesOf(from: DiffInput, to: DiffInput): string[] {
  return [...new Set([...to.tables.keys(), ...from.tables.keys()])];
}

/** Spec fields (and the applied gain) that differ, per table; a table on one side only lists every field. */
export function specChanges(from: DiffInput, to: DiffInput): SpecChange[] {
  const out: SpecChange[] = [];
  for (const role of rolesOf(from, to)) {
    const a = from.tables.get(role);
    const b = to.tables.get(role);
    for (const field of SPEC_FIELDS) {
      const x = a?.spec[field] ?? null;
      const y = b?.spec[field] ?? null;
      if (x !== y) out.push({ table: role, field, from: x, to: y });
    }
    // Full-scale and normalize gains follow the float peak: a changed gain changes every word.
    const ga = a?.gain ?? null;
    const gb = b?.gain ?? null;
    if (ga !== gb) out.push({ table: role, field: "gain", from: ga, to: gb });
  }
  return out;
}

/**
 * Largest change of the represented values in LSB of `to`: |code_to − code_from·2^(F_to − F_from)|, i.e.
 * |v_to − v_from|·2^F_to with v = code·2^−F. Exact in float64 while the scaled codes stay below 2^53.
 */
export function tableChange(
  role: string,
  a: QuantizedTable | undefined,
  b: QuantizedTable | undefined,
): TableChange {
  const base = { table: role, lengthFrom: a?.re.length ?? null, lengthTo: b?.re.length ?? null };
  if (!a || !b) return { ...base, changedWords: null, maxChangeLsb: null, atIndex: null };
  const shift = 2 ** (b.spec.fractionLength - a.spec.fractionLength);
  const n = Math.min(a.re.length, b.re.length);
  let changed = 0;
  let max = 0;
  let at: number | null = null;
  for (let i = 0; i < n; i++) {
    for (const [ca, cb] of [
      [a.re[i]!, b.re[i]!],
      [a.im[i]!, b.im[i]!],
    ] as const) {
      const d = Math.abs(cb - ca * shift);
      if (d === 0) continue;
      changed++;
      if (d > max) {
        max = d;
        at = i;
      }
    }
  }
  return { ...base, changedWords: changed, maxChangeLsb: max, atIndex: at };
}

/** Report figures of both sides in `to`'s order, plus each table's coefficient SQNR (fixed only). */
export function metricChanges(from: DiffInput["report"], to: DiffInput["report"]): MetricChange[] {
  const flat = (r: DiffInput["report"]) => {
    const m = new Map<string, { float: number | null; fixed: number | null }>();
    if (!r) return m;
    for (const k of new Set([...Object.keys(r.float), ...Object.keys(r.fixed)]))
      m.set(k, { float: r.float[k] ?? null, fixed: r.fixed[k] ?? null });
    // The float table is the reference itself: its SQNR is not a figure, only the fixed one is.
    for (const t of r.tables)
      m.set(`coefficientSqnrDb.${t.role}`, { float: null, fixed: t.coefficientSqnrDb });
    return m;
  };
  const a = flat(from);
  const b = flat(to);
  const none = { float: null, fixed: null };
  return [...new Set([...b.keys(), ...a.keys()])].map((key) => {
    const x = a.get(key) ?? none;
    const y = b.get(key) ?? none;
    return {
      key,
      from: x,
      to: y,
      deltaFixed: x.fixed !== null && y.fixed !== null ? y.fixed - x.fixed : null,
    };
  });
}

/** The diff of two loaded releases (pure). */
export function compareReleases(from: DiffInput, to: DiffInput): ReleaseDiff {
  const side = (d: DiffInput) => ({
    id: d.release.id,
    version: d.release.version,
    revisionNumber: d.release.revisionNumber,
    contentHash: d.release.contentHash,
  });
  return {
    kind: to.release.designKind,
    from: side(from),
    to: side(to),
    sameContent: from.release.contentHash === to.release.contentHash,
    spec: specChanges(from, to),
    tables: rolesOf(from, to).map((role) => tableChange(role, from.tables.get(role), to.tables.get(role))),
    metrics: metricChanges(from.report, to.report),
  };
}

/** Quantized tables and the finished report of a release's revision, from the stored rows. */
async function load(db: Db, release: Release): Promise<DiffInput> {
  const [rev] = await db
    .select({ content: revisions.content })
    .from(revisions)
    .where(eq(revisions.id, release.revisionId));
  if (!rev) throw new HttpError("not_found", "No such release");
  const specs = RevisionContentSchema.parse(rev.content).fixedPoint as Record<
    string,
    FixedPointSpec | undefined
  >;
  const rows = await db
    .select({ role: coefficientTables.role, values: coefficientTables.values })
    .from(coefficientTables)
    .where(eq(coefficientTables.revisionId, release.revisionId))
    .orderBy(asc(coefficientTables.position));
  const tables = new Map<string, QuantizedTable>();
  for (const row of rows) {
    const spec = specs[row.role];
    // Same quantizer and stored values as the bundle builder, so the words match the released files.
    if (spec) tables.set(row.role, quantize(decodeValues(row.values), spec));
  }
  const [report] = await db
    .select({ report: analysisReports.report })
    .from(analysisReports)
    .where(
      and(
        eq(analysisReports.projectId, release.projectId),
        eq(analysisReports.contentHash, release.contentHash),
        eq(analysisReports.state, "done"),
      ),
    );
  return { release, tables, report: (report?.report as AnalysisReport | null | undefined) ?? null };
}

/** GET /api/releases/:id/diff?against=:otherId — 404 unless both are visible; 400 across designs. */
export async function releaseDiff(
  db: Db,
  viewer: Viewer,
  id: number,
  againstId: number,
): Promise<ReleaseDiff> {
  const to = await getRelease(db, viewer, id);
  const from = await getRelease(db, viewer, againstId);
  if (from.designId !== to.designId)
    throw new HttpError("bad_request", "Only releases of the same design can be compared", {
      reason: "different_design",
    });
  return compareReleases(await load(db, from), await load(db, to));
}
