/**
 * Releases (issue 6): a semantic version of an approved revision, made only when the approval names exactly
 * the revision's content and report, with its bundle built in the same transaction and stored in the same
 * insert (a failed build releases nothing). Versions are unique per design and never reused: a withdrawn
 * release keeps its version and stays readable with its reason.
 */
import { and, desc, eq, inArray, isNull, sql, type SQL } from "drizzle-orm";
import { alias } from "drizzle-orm/pg-core";
import {
  parseVersion,
  type NextVersions,
  type Release,
  type ReleaseFile,
  type ReleaseListQuery,
} from "../../shared/schemas/releases";
import { buildBundleOffThread } from "../bundles/queue";
import type { Db } from "../db/client";
import { designs, projectMembers, projects, releases, reviews, revisions, users } from "../db/schema";
import { HttpError } from "../http/errors";
import { notify } from "../mail/notifications";
import { recordAudit } from "./audit";
import { projectAccess, visibleDesign, type Tx } from "./designs";
import { authorize } from "./lifecycle";
import type { Viewer } from "./projects";
import { mailBase, reportSummary, revisionFacts } from "./reviews";
import { vectorSetsOf, verificationStates } from "./verifications";

const releaser = alias(users, "releaser");
const withdrawer = alias(users, "withdrawer");

const releaseColumns = {
  id: releases.id,
  designId: releases.designId,
  designName: designs.name,
  designKind: designs.kind,
  projectId: projects.id,
  projectSlug: projects.slug,
  revisionId: releases.revisionId,
  revisionNumber: revisions.number,
  version: releases.version,
  notes: releases.notes,
  releasedById: releases.releasedById,
  releasedByName: releaser.displayName,
  releasedAt: releases.releasedAt,
  contentHash: releases.contentHash,
  bundleSha256: releases.bundleSha256,
  bundleSize: releases.bundleSize,
  manifest: releases.manifest,
  withdrawnAt: releases.withdrawnAt,
  withdrawnById: releases.withdrawnById,
  withdrawnByName: withdrawer.displayName,
  withdrawReason: releases.withdrawReason,
};

/** The bundle's file list from its manifest (kept defensive: the manifest format is the bundle's own). */
function filesOf(manifest: unknown): ReleaseFile[] {
  const files = (manifest as { files?: unknown } | null)?.files;
  if (!Array.isArray(files)) return [];
  return files.flatMap((f: unknown) => {
    const x = f as Partial<ReleaseFile>;
    return typeof x.path === "string" && typeof x.size === "number" && typeof x.sha256 === "string"
      ? [{ path: x.path, size: x.size, sha256: x.sha256 }]
      : [];
  });
}

/** Releases with their design, project, revision and people joined; add a where and an order. */
function selectReleases(db: Db | Tx) {
  return db
    .select(releaseColumns)
    .from(releases)
    .innerJoin(designs, eq(designs.id, releases.designId))
    .innerJoin(projects, eq(projects.id, designs.projectId))
    .innerJoin(revisions, eq(revisions.id, releases.revisionId))
    .innerJoin(releaser, eq(releaser.id, releases.releasedById))
    .leftJoin(withdrawer, eq(withdrawer.id, releases.withdrawnById));
}

type ReleaseRow = Awaited<ReturnType<ReturnType<typeof selectReleases>["execute"]>>[number];
type RunStates = Awaited<ReturnType<typeof verificationStates>>;

/** Release JSON for every row matching a condition, newest first. */
export async function releaseRows(db: Db | Tx, where: SQL | undefined): Promise<Release[]> {
  const rows = await selectReleases(db).where(where).orderBy(desc(releases.releasedAt), desc(releases.id));
  return withVerification(db, rows);
}

/** Rows as release JSON with each release's latest verification verdict (one query for all of them). */
async function withVerification(db: Db | Tx, rows: ReleaseRow[]): Promise<Release[]> {
  const runs = await verificationStates(
    db,
    rows.map((r) => r.id),
  );
  return rows.map((r) => toRelease(r, runs));
}

/** One joined row as release JSON. */
function toRelease(r: ReleaseRow, runs: RunStates): Release {
  return {
    id: r.id,
    designId: r.designId,
    designName: r.designName,
    designKind: r.designKind,
    projectId: r.projectId,
    projectSlug: r.projectSlug,
    revisionId: r.revisionId,
    revisionNumber: r.revisionNumber,
    version: r.version,
    notes: r.notes,
    releasedBy: { id: r.releasedById, displayName: r.releasedByName },
    releasedAt: r.releasedAt.toISOString(),
    contentHash: r.contentHash,
    bundleSha256: r.bundleSha256,
    bundleSize: r.bundleSize,
    files: filesOf(r.manifest),
    withdrawn:
      r.withdrawnAt && r.withdrawnById !== null
        ? {
            at: r.withdrawnAt.toISOString(),
            by: { id: r.withdrawnById, displayName: r.withdrawnByName ?? "" },
            reason: r.withdrawReason ?? "",
          }
        : null,
    // A waveform design's release carries its transmit table (DESIGN.md "Cautions").
    transmit: r.designKind === "waveform",
    verification: {
      ...(runs.get(r.id) ?? { latest: null, passedSets: [] }),
      sets: vectorSetsOf(r.manifest).map((s) => s.name),
    },
  };
}

/** Projects the viewer belongs to (admins: all), as a condition on projects.id. */
function myProjects(db: Db | Tx, viewer: Viewer): SQL | undefined {
  if (viewer.roles.includes("admin")) return undefined;
  return inArray(
    projects.id,
    db
      .select({ id: projectMembers.projectId })
      .from(projectMembers)
      .where(eq(projectMembers.userId, viewer.id)),
  );
}

/** GET /api/releases/:id (404 for non-members). */
export async function getRelease(db: Db | Tx, viewer: Viewer, id: number): Promise<Release> {
  const [release] = await releaseRows(db, and(eq(releases.id, id), myProjects(db, viewer)));
  if (!release) throw new HttpError("not_found", "No such release");
  return release;
}

/** GET /api/designs/:id/releases */
export async function designReleases(db: Db, viewer: Viewer, designId: number): Promise<Release[]> {
  await visibleDesign(db, viewer, designId);
  return releaseRows(db, eq(releases.designId, designId));
}

/**
 * The list as a named prepared statement (one for admins, one for members): drizzle builds its SQL once and
 * PostgreSQL plans it once per connection instead of on every request (planning the six-table join cost
 * several times its execution). Absent filters are NULL parameters.
 */
function prepareReleaseList(db: Db, member: boolean) {
  const p = sql.placeholder;
  return selectReleases(db)
    .where(
      and(
        member
          ? inArray(
              projects.id,
              db
                .select({ id: projectMembers.projectId })
                .from(projectMembers)
                .where(eq(projectMembers.userId, p("viewer"))),
            )
          : undefined,
        sql`(${p("project")}::text is null or ${projects.slug} = ${p("project")})`,
        sql`(${p("design")}::integer is null or ${releases.designId} = ${p("design")})`,
        sql`(${p("status")}::text is null or (${releases.withdrawnAt} is not null) = (${p("status")}::text = 'withdrawn'))`,
      ),
    )
    .orderBy(desc(releases.releasedAt), desc(releases.id))
    .prepare(member ? "releases_list_member" : "releases_list_all");
}
const releaseLists = new WeakMap<
  Db,
  { all: ReturnType<typeof prepareReleaseList>; member: ReturnType<typeof prepareReleaseList> }
>();

/** GET /api/releases?project&design&status, always within my projects. */
export async function listReleases(db: Db, viewer: Viewer, q: ReleaseListQuery): Promise<Release[]> {
  let lists = releaseLists.get(db);
  if (!lists) {
    lists = { all: prepareReleaseList(db, false), member: prepareReleaseList(db, true) };
    releaseLists.set(db, lists);
  }
  const statement = viewer.roles.includes("admin") ? lists.all : lists.member;
  const rows = await statement.execute({
    viewer: viewer.id,
    project: q.project ?? null,
    design: q.design ?? null,
    status: q.status === "withdrawn" || q.status === "active" ? q.status : null,
  });
  return withVerification(db, rows);
}

/**
 * A release by project slug, design name and version, or "latest" (the newest non-withdrawn by version
 * order); 404 when the viewer is not a member or nothing matches. For the download routes.
 */
export async function releaseByVersion(
  db: Db,
  viewer: Viewer,
  slug: string,
  designName: string,
  version: string,
): Promise<Release> {
  const [project] = await db.select({ id: projects.id }).from(projects).where(eq(projects.slug, slug));
  if (!project) throw new HttpError("not_found", "No such release");
  await projectAccess(db, viewer, project.id, "No such release");
  const base = and(eq(projects.id, project.id), eq(designs.name, designName));
  if (version === "latest") {
    const [newest] = await db
      .select({ id: releases.id })
      .from(releases)
      .innerJoin(designs, eq(designs.id, releases.designId))
      .innerJoin(projects, eq(projects.id, designs.projectId))
      .where(and(base, isNull(releases.withdrawnAt)))
      .orderBy(desc(releases.major), desc(releases.minor), desc(releases.patch))
      .limit(1);
    if (!newest) throw new HttpError("not_found", "This design has no release that is not withdrawn");
    return getRelease(db, viewer, newest.id);
  }
  const [release] = await releaseRows(db, and(base, eq(releases.version, version)));
  if (!release) throw new HttpError("not_found", "No such release");
  return release;
}

/** The highest version ever used for a design (withdrawn included), or null. */
async function highestVersion(db: Db | Tx, designId: number): Promise<string | null> {
  const [row] = await db
    .select({ version: releases.version })
    .from(releases)
    .where(eq(releases.designId, designId))
    .orderBy(desc(releases.major), desc(releases.minor), desc(releases.patch))
    .limit(1);
  return row?.version ?? null;
}

/** Next patch, minor and major after a version (SemVer 2.0.0 §6–8: lower parts reset to 0); 1.0.0 first. */
export function nextVersions(highest: string | null): NextVersions {
  if (highest === null) return { highest, patch: "1.0.0", minor: "1.0.0", major: "1.0.0" };
  const v = parseVersion(highest);
  return {
    highest,
    patch: `${v.major}.${v.minor}.${v.patch + 1}`,
    minor: `${v.major}.${v.minor + 1}.0`,
    major: `${v.major + 1}.0.0`,
  };
}

/** GET /api/designs/:id/next-versions */
export async function suggestVersions(db: Db, viewer: Viewer, designId: number): Promise<NextVersions> {
  await visibleDesign(db, viewer, designId);
  return nextVersions(await highestVersion(db, designId));
}

const versionTaken = (version: string) =>
  new HttpError(
    "conflict",
    `Version ${version} is already used for this design (a withdrawn release keeps its version): choose another`,
    {
      reason: "version_used",
      field: "version",
    },
  );

const isUniqueViolation = (e: unknown): boolean =>
  typeof e === "object" &&
  e !== null &&
  ((e as { code?: string }).code === "23505" || isUniqueViolation((e as { cause?: unknown }).cause));

/** The release checks (lifecycle table, approval names content and report, version unused), in a transaction. */
async function releaseChecks(
  tx: Tx,
  viewer: Viewer,
  revisionId: number,
  parts: ReturnType<typeof parseVersion>,
  version: string,
) {
  const r = await revisionFacts(tx, viewer, revisionId, true);
  const next = authorize("release", r, viewer);
  // Serialize releases per design so the version check below cannot race.
  await tx.select({ id: designs.id }).from(designs).where(eq(designs.id, r.designId)).for("update");
  const [approval] = await tx
    .select({ contentHash: reviews.contentHash, reportHash: reviews.reportHash })
    .from(reviews)
    .where(and(eq(reviews.revisionId, r.id), eq(reviews.decision, "approved")))
    .orderBy(desc(reviews.at), desc(reviews.id))
    .limit(1);
  const report = r.contentHash ? await reportSummary(tx, r.project.id, r.contentHash) : null;
  if (
    !approval ||
    approval.contentHash !== r.contentHash ||
    !report ||
    report.reportHash !== approval.reportHash
  )
    throw new HttpError(
      "conflict",
      `r${r.number}'s content or report is not what was approved: submit it for review again`,
      { reason: "not_what_was_approved" },
    );
  const [used] = await tx
    .select({ id: releases.id })
    .from(releases)
    .where(
      and(
        eq(releases.designId, r.designId),
        eq(releases.major, parts.major),
        eq(releases.minor, parts.minor),
        eq(releases.patch, parts.patch),
      ),
    );
  if (used) throw versionTaken(version);
  const approvals = await tx
    .select({ id: reviews.id })
    .from(reviews)
    .where(
      and(
        eq(reviews.revisionId, r.id),
        eq(reviews.decision, "approved"),
        eq(reviews.contentHash, r.contentHash ?? ""),
      ),
    );
  return { r, next, approvalCount: approvals.length };
}

/**
 * POST /api/revisions/:id/release. The checks run first (fast 403/409), then the bundle is built in the
 * bundle lane of the CPU pool (a worker thread with its own connection; the request thread only waits),
 * then one transaction checks again and writes the release row with the bundle and its SHA-256, the state
 * change, the audit event and the mail. A failed build releases nothing.
 */
export async function createRelease(
  db: Db,
  viewer: Viewer,
  revisionId: number,
  input: { version: string; notes: string },
): Promise<Release> {
  await revisionFacts(db, viewer, revisionId);
  const parts = parseVersion(input.version);
  await db.transaction((tx) => releaseChecks(tx, viewer, revisionId, parts, input.version));
  const releasedAt = new Date();
  const bundle = await buildBundleOffThread(db, viewer.id, {
    revisionId,
    version: input.version,
    notes: input.notes,
    releasedBy: viewer.id,
    releasedAt,
  });
  let id: number;
  try {
    id = await db.transaction(async (tx) => {
      const { r, next, approvalCount } = await releaseChecks(tx, viewer, revisionId, parts, input.version);
      if (approvalCount !== bundle.manifest.approvals.length)
        throw new HttpError(
          "conflict",
          "The approvals of this revision changed while its bundle was built: release it again",
          { reason: "changed_during_build" },
        );
      const [row] = await tx
        .insert(releases)
        .values({
          designId: r.designId,
          revisionId: r.id,
          version: input.version,
          ...parts,
          notes: input.notes,
          releasedById: viewer.id,
          releasedAt,
          contentHash: r.contentHash ?? "",
          bundle: bundle.zip,
          bundleSha256: bundle.sha256,
          bundleSize: bundle.size,
          manifest: bundle.manifest,
        })
        .returning({ id: releases.id });
      if (!row) throw new Error("release insert returned no row");
      await tx.update(revisions).set({ state: next }).where(eq(revisions.id, r.id));
      await tx
        .update(designs)
        .set({ updatedAt: sql`now()` })
        .where(eq(designs.id, r.designId));
      await recordAudit(tx, {
        action: "release.create",
        projectId: r.project.id,
        subjectType: "release",
        subjectId: row.id,
        summary: `Released r${r.number} of ${r.design.name} as ${input.version}`,
        details: {
          designId: r.designId,
          revisionId: r.id,
          version: input.version,
          contentHash: r.contentHash,
          bundleSha256: bundle.sha256,
          bundleSize: bundle.size,
        },
      });
      await notify(tx, "released", {
        ...mailBase(r, viewer.id),
        release: { id: row.id, version: input.version, notes: input.notes },
      });
      return row.id;
    });
  } catch (e) {
    if (isUniqueViolation(e)) throw versionTaken(input.version);
    throw e;
  }
  return getRelease(db, viewer, id);
}

/** POST /api/releases/:id/withdraw: flag it with the reason; it stays readable and downloadable. */
export async function withdrawRelease(
  db: Db,
  viewer: Viewer,
  releaseId: number,
  reason: string,
): Promise<Release> {
  const release = await getRelease(db, viewer, releaseId);
  await db.transaction(async (tx) => {
    const r = await revisionFacts(tx, viewer, release.revisionId, true);
    authorize("withdraw", r, viewer);
    const [row] = await tx
      .select({ withdrawnAt: releases.withdrawnAt })
      .from(releases)
      .where(eq(releases.id, releaseId))
      .for("update");
    if (!row) throw new HttpError("not_found", "No such release");
    if (row.withdrawnAt)
      throw new HttpError("conflict", `${release.version} is already withdrawn`, {
        reason: "already_withdrawn",
      });
    await tx
      .update(releases)
      .set({ withdrawnAt: new Date(), withdrawnById: viewer.id, withdrawReason: reason })
      .where(eq(releases.id, releaseId));
    await recordAudit(tx, {
      action: "release.withdraw",
      projectId: r.project.id,
      subjectType: "release",
      subjectId: releaseId,
      summary: `Withdrew ${release.version} of ${r.design.name}`,
      details: { designId: r.designId, revisionId: r.id, version: release.version, reason },
    });
    await notify(tx, "withdrawn", {
      ...mailBase(r, viewer.id),
      release: { id: releaseId, version: release.version },
      reason,
    });
  });
  return getRelease(db, viewer, releaseId);
}

/** Active releases in the viewer's projects with a vector set that no run has passed yet, newest first. */
export async function unverifiedReleases(db: Db, viewer: Viewer, limit: number) {
  const rows = await releaseRows(db, and(myProjects(db, viewer), isNull(releases.withdrawnAt)));
  return rows
    .filter((r) => r.verification.sets.some((s) => !r.verification.passedSets.includes(s)))
    .slice(0, limit)
    .map((r) => ({
      id: r.id,
      designName: r.designName,
      projectSlug: r.projectSlug,
      version: r.version,
      releasedAt: r.releasedAt,
      withdrawn: false,
      verification: {
        latest: r.verification.latest?.verdict ?? null,
        passedSets: r.verification.passedSets.length,
        sets: r.verification.sets.length,
      },
    }));
}

/** The newest releases in the viewer's projects, for the home page. */
export async function newestReleases(db: Db, viewer: Viewer, limit: number, activeOnly: boolean) {
  const rows = await releaseRows(
    db,
    and(myProjects(db, viewer), activeOnly ? isNull(releases.withdrawnAt) : undefined),
  );
  return rows.slice(0, limit).map((r) => ({
    id: r.id,
    designName: r.designName,
    projectSlug: r.projectSlug,
    version: r.version,
    releasedAt: r.releasedAt,
    withdrawn: r.withdrawn !== null,
  }));
}
