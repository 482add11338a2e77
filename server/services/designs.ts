import { and, asc, desc, eq, inArray, sql, type SQL } from "drizzle-orm";
import { alias } from "drizzle-orm/pg-core";
import type {
  CreateDesignSchema,
  DesignSummary,
  RevisionContent,
  RevisionSummary,
} from "../../shared/schemas/designs";
import type { z } from "zod";
import type { Db } from "../db/client";
import {
  coefficientTables,
  designs,
  projectMembers,
  projects,
  releases,
  revisions,
  users,
} from "../db/schema";
import { HttpError, validationFailed } from "../http/errors";
import { unreleasableTable } from "../bundles/limits";
import { recordContentAuthors } from "./authorship";
import { MaterializeError, materializeOffThread, uploadIdsOf, type MaterializedTable } from "./materialize";
import type { Viewer } from "./projects";
import { recordAudit } from "./audit";
import { parsedUploads } from "./uploads";

/** A transaction handle (same query API as Db). */
export type Tx = Parameters<Parameters<Db["transaction"]>[0]>[0];

/** What pages show of a project next to a design. */
export interface ProjectRef {
  id: number;
  slug: string;
  name: string;
}

/** The project if the viewer may see it; 404 otherwise (non-members cannot tell it exists). */
export async function projectAccess(
  db: Db | Tx,
  viewer: Viewer,
  projectId: number,
  notFound = "No such project",
): Promise<ProjectRef> {
  const [row] = await db
    .select({
      id: projects.id,
      slug: projects.slug,
      name: projects.name,
      member: sql<boolean>`exists (select 1 from ${projectMembers} where ${projectMembers.projectId} = ${projects.id} and ${projectMembers.userId} = ${viewer.id})`,
    })
    .from(projects)
    .where(eq(projects.id, projectId));
  if (!row || (!row.member && !viewer.roles.includes("admin"))) throw new HttpError("not_found", notFound);
  return { id: row.id, slug: row.slug, name: row.name };
}

/** Authors may create and edit inside the projects they can see. */
export const canAuthor = (viewer: Viewer): boolean => viewer.roles.includes("author");

const creator = alias(users, "creator");

const revisionColumns = {
  id: revisions.id,
  designId: revisions.designId,
  number: revisions.number,
  state: revisions.state,
  contentHash: revisions.contentHash,
  createdAt: revisions.createdAt,
  createdById: revisions.createdById,
  createdByName: creator.displayName,
  submittedAt: revisions.submittedAt,
};
interface RevisionRow {
  id: number;
  number: number;
  state: RevisionSummary["state"];
  contentHash: string | null;
  createdAt: Date;
  createdById: number;
  createdByName: string;
  submittedAt: Date | null;
}

function toRevisionSummary(r: RevisionRow): RevisionSummary {
  return {
    id: r.id,
    number: r.number,
    state: r.state,
    contentHash: r.contentHash,
    createdAt: r.createdAt.toISOString(),
    createdBy: { id: r.createdById, displayName: r.createdByName },
    submittedAt: r.submittedAt?.toISOString() ?? null,
  };
}

/** Revision summaries matching a condition, newest number first. */
export async function revisionSummaries(
  db: Db | Tx,
  where: SQL | undefined,
): Promise<(RevisionSummary & { designId: number })[]> {
  const rows = await db
    .select(revisionColumns)
    .from(revisions)
    .innerJoin(creator, eq(creator.id, revisions.createdById))
    .where(where)
    .orderBy(desc(revisions.number));
  return rows.map((r) => ({ ...toRevisionSummary(r), designId: r.designId }));
}

/** Design summaries matching a condition, by name, each with its latest revision. */
export async function designSummaries(db: Db | Tx, where: SQL | undefined): Promise<DesignSummary[]> {
  const rows = await db
    .select({
      id: designs.id,
      projectId: designs.projectId,
      name: designs.name,
      kind: designs.kind,
      description: designs.description,
      ownerId: designs.ownerId,
      ownerName: users.displayName,
      createdAt: designs.createdAt,
      updatedAt: designs.updatedAt,
    })
    .from(designs)
    .innerJoin(users, eq(users.id, designs.ownerId))
    .where(where)
    .orderBy(asc(designs.name));
  const ids = rows.map((r) => r.id);
  const latest = new Map<number, RevisionSummary>();
  const latestRelease = new Map<number, DesignSummary["latestRelease"]>();
  if (ids.length > 0) {
    const revs = await db
      .selectDistinctOn([revisions.designId], revisionColumns)
      .from(revisions)
      .innerJoin(creator, eq(creator.id, revisions.createdById))
      .where(inArray(revisions.designId, ids))
      .orderBy(revisions.designId, desc(revisions.number));
    for (const r of revs) latest.set(r.designId, toRevisionSummary(r));
    // The latest release a build should take: the highest version still in force, else the highest withdrawn one.
    const rels = await db
      .selectDistinctOn([releases.designId], {
        designId: releases.designId,
        id: releases.id,
        version: releases.version,
        withdrawnAt: releases.withdrawnAt,
      })
      .from(releases)
      .where(inArray(releases.designId, ids))
      .orderBy(
        releases.designId,
        sql`${releases.withdrawnAt} is null desc`,
        desc(releases.major),
        desc(releases.minor),
        desc(releases.patch),
      );
    for (const r of rels)
      latestRelease.set(r.designId, { id: r.id, version: r.version, withdrawn: r.withdrawnAt !== null });
  }
  return rows.map((r) => ({
    id: r.id,
    projectId: r.projectId,
    name: r.name,
    kind: r.kind,
    description: r.description,
    owner: { id: r.ownerId, displayName: r.ownerName },
    latestRevision: latest.get(r.id) ?? null,
    latestRelease: latestRelease.get(r.id) ?? null,
    createdAt: r.createdAt.toISOString(),
    updatedAt: r.updatedAt.toISOString(),
  }));
}

/** Run the generators (or read the uploads) of a content; bad parameters become a 400 with the content path. */
export async function tablesFor(
  db: Db | Tx,
  projectId: number,
  content: RevisionContent,
): Promise<MaterializedTable[]> {
  const uploaded = await parsedUploads(db, projectId, uploadIdsOf(content));
  let tables: MaterializedTable[];
  try {
    tables = await materializeOffThread(content, [...uploaded.values()]);
  } catch (e) {
    if (e instanceof MaterializeError) throw validationFailed([{ path: e.path, message: e.message }]);
    throw e;
  }
  // What could never be released is refused now, not after analysis and review (server/bundles/limits.ts).
  const unreleasable = unreleasableTable(tables);
  if (unreleasable)
    throw validationFailed([
      { path: ["content", content.kind === "waveform" ? "tx" : "fir"], message: unreleasable },
    ]);
  return tables;
}

/** Insert a revision's materialized tables. */
export async function insertTables(tx: Tx, revisionId: number, tables: MaterializedTable[]): Promise<void> {
  if (tables.length === 0) return;
  await tx.insert(coefficientTables).values(tables.map((t) => ({ ...t, revisionId })));
}

/** The designs of a project the viewer may see. */
export async function listDesigns(db: Db, viewer: Viewer, projectId: number): Promise<DesignSummary[]> {
  await projectAccess(db, viewer, projectId);
  return designSummaries(db, eq(designs.projectId, projectId));
}

/** Create a design with its r1 draft and the draft's tables, in one transaction. */
export async function createDesign(
  db: Db,
  viewer: Viewer,
  projectId: number,
  input: z.infer<typeof CreateDesignSchema>,
): Promise<{ design: DesignSummary; revision: RevisionSummary }> {
  await projectAccess(db, viewer, projectId);
  const tables = await tablesFor(db, projectId, input.content);
  const nameTaken = () =>
    new HttpError("conflict", `A design named "${input.name}" already exists in this project (in any case)`, [
      { path: ["name"], message: "this name is taken in the project" },
    ]);
  const ids = await db.transaction(async (tx) => {
    const [design] = await tx
      .insert(designs)
      .values({
        projectId,
        name: input.name,
        kind: input.content.kind,
        description: input.description,
        ownerId: viewer.id,
      })
      // The only unique key besides the id: (project, lower(name)).
      .onConflictDoNothing()
      .returning({ id: designs.id });
    if (!design) throw nameTaken();
    const [revision] = await tx
      .insert(revisions)
      .values({ designId: design.id, number: 1, content: input.content, createdById: viewer.id })
      .returning({ id: revisions.id });
    if (!revision) throw new Error("revision insert returned no row");
    await insertTables(tx, revision.id, tables);
    await recordContentAuthors(tx, revision.id, viewer.id, input.content);
    await recordAudit(tx, {
      action: "design.create",
      projectId,
      subjectType: "design",
      subjectId: design.id,
      summary: `Created ${input.content.kind} design "${input.name}" with draft r1`,
      details: { name: input.name, kind: input.content.kind, revisionId: revision.id },
    });
    return { designId: design.id, revisionId: revision.id };
  });
  const [design] = await designSummaries(db, eq(designs.id, ids.designId));
  const [revision] = await revisionSummaries(db, eq(revisions.id, ids.revisionId));
  if (!design || !revision) throw new Error(`design ${ids.designId} vanished after insert`);
  const { designId: _omit, ...summary } = revision;
  return { design, revision: summary };
}

/** A design the viewer may see, with its project; 404 otherwise. */
export async function visibleDesign(
  db: Db | Tx,
  viewer: Viewer,
  id: number,
): Promise<{ design: DesignSummary; project: ProjectRef }> {
  const [design] = await designSummaries(db, eq(designs.id, id));
  if (!design) throw new HttpError("not_found", "No such design");
  const project = await projectAccess(db, viewer, design.projectId, "No such design");
  return { design, project };
}

/** GET /api/designs/:id */
export async function getDesign(db: Db, viewer: Viewer, id: number) {
  const { design, project } = await visibleDesign(db, viewer, id);
  const revs = await revisionSummaries(db, and(eq(revisions.designId, id)));
  return {
    design,
    project,
    revisions: revs.map(({ designId: _omit, ...r }) => r),
    canEdit: canAuthor(viewer),
  };
}
