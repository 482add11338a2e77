import { asc, eq, sql } from "drizzle-orm";
import type { Role } from "../../shared/schemas/auth";
import type {
  CreateProjectInput,
  Project,
  ProjectDetail,
  ProjectMember,
} from "../../shared/schemas/projects";
import type { Db } from "../db/client";
import { projectMembers, projects, users } from "../db/schema";
import { HttpError, validationFailed } from "../http/errors";
import { recordAudit } from "./audit";
import { projectAccess } from "./designs";
import { missingUserIds, rolesByUser } from "./users";

/** Who is asking: admins see every project, everyone else only their own. */
export interface Viewer {
  id: number;
  roles: Role[];
}

const memberCount = sql<number>`(select count(*)::int from ${projectMembers} where ${projectMembers.projectId} = ${projects.id})`;

const projectColumns = {
  id: projects.id,
  slug: projects.slug,
  name: projects.name,
  description: projects.description,
  createdAt: projects.createdAt,
  memberCount,
};

type ProjectRow = {
  id: number;
  slug: string;
  name: string;
  description: string;
  createdAt: Date;
  memberCount: number;
};

function toProject(r: ProjectRow): Project {
  return { ...r, createdAt: r.createdAt.toISOString() };
}

const isAdmin = (v: Viewer): boolean => v.roles.includes("admin");

/** The projects a viewer may see, by name. */
export async function listProjects(db: Db, viewer: Viewer): Promise<Project[]> {
  const base = db.select(projectColumns).from(projects);
  const rows = isAdmin(viewer)
    ? await base.orderBy(asc(projects.name))
    : await base
        .innerJoin(projectMembers, eq(projectMembers.projectId, projects.id))
        .where(eq(projectMembers.userId, viewer.id))
        .orderBy(asc(projects.name));
  return rows.map(toProject);
}

/** Is the viewer allowed to see this project? Non-members get the same answer as for a missing project. */
async function visibleProject(db: Db, viewer: Viewer, id: number): Promise<ProjectRow> {
  // The membership rule lives in one place (projectAccess: 404 rather than 403, so non-members cannot probe).
  await projectAccess(db, viewer, id);
  const [row] = await db.select(projectColumns).from(projects).where(eq(projects.id, id));
  if (!row) throw new HttpError("not_found", "No such project");
  return row;
}

/** The members of a project, with their roles, by display name. */
export async function listMembers(db: Db, projectId: number): Promise<ProjectMember[]> {
  const rows = await db
    .select({ id: users.id, username: users.username, displayName: users.displayName })
    .from(projectMembers)
    .innerJoin(users, eq(users.id, projectMembers.userId))
    .where(eq(projectMembers.projectId, projectId))
    .orderBy(asc(users.displayName));
  const roles = await rolesByUser(
    db,
    rows.map((r) => r.id),
  );
  return rows.map((r) => ({ ...r, roles: roles.get(r.id) ?? [] }));
}

/** One project with its members, if the viewer may see it. */
export async function getProject(db: Db, viewer: Viewer, id: number): Promise<ProjectDetail> {
  const row = await visibleProject(db, viewer, id);
  return { project: toProject(row), members: await listMembers(db, id) };
}

/** Create a project (admin only; checked by the route). */
export async function createProject(db: Db, input: CreateProjectInput): Promise<Project> {
  const row = await db.transaction(async (tx) => {
    const [inserted] = await tx
      .insert(projects)
      .values(input)
      // Unique keys: the slug and lower(name); a conflict on either inserts nothing.
      .onConflictDoNothing()
      .returning({ id: projects.id });
    if (!inserted) {
      const [slugTaken] = await tx
        .select({ id: projects.id })
        .from(projects)
        .where(eq(projects.slug, input.slug));
      throw validationFailed([
        slugTaken
          ? { path: ["slug"], message: "this slug is taken" }
          : { path: ["name"], message: "a project with this name exists (names are compared in any case)" },
      ]);
    }
    await recordAudit(tx, {
      action: "project.create",
      projectId: inserted.id,
      subjectType: "project",
      subjectId: inserted.id,
      summary: `Created project ${input.slug}`,
      details: { slug: input.slug, name: input.name },
    });
    return inserted;
  });
  const [created] = await db.select(projectColumns).from(projects).where(eq(projects.id, row.id));
  if (!created) throw new Error(`project ${row.id} vanished after insert`);
  return toProject(created);
}

/** Replace a project's member list. */
export async function setMembers(db: Db, projectId: number, userIds: number[]): Promise<ProjectDetail> {
  const [exists] = await db.select({ id: projects.id }).from(projects).where(eq(projects.id, projectId));
  if (!exists) throw new HttpError("not_found", "No such project");
  const unique = [...new Set(userIds)];
  const missing = await missingUserIds(db, unique);
  if (missing.length > 0) {
    throw validationFailed(
      missing.map((id) => ({ path: ["userIds", unique.indexOf(id)], message: `no user with id ${id}` })),
    );
  }
  await db.transaction(async (tx) => {
    await tx.delete(projectMembers).where(eq(projectMembers.projectId, projectId));
    if (unique.length > 0)
      await tx.insert(projectMembers).values(unique.map((userId) => ({ projectId, userId })));
    await recordAudit(tx, {
      action: "project.members",
      projectId,
      subjectType: "project",
      subjectId: projectId,
      summary: `Set ${unique.length} member${unique.length === 1 ? "" : "s"} of the project`,
      details: { userIds: unique },
    });
  });
  const [row] = await db.select(projectColumns).from(projects).where(eq(projects.id, projectId));
  if (!row) throw new HttpError("not_found", "No such project");
  return { project: toProject(row), members: await listMembers(db, projectId) };
}
