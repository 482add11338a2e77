import type { SessionUser } from "../../shared/schemas/auth";
import type { Home } from "../../shared/schemas/projects";
import type { Db } from "../db/client";
import type { HomeWork } from "../../shared/schemas/reviews";
import { checkHealth } from "./health";
import { newestReleases, unverifiedReleases } from "./releases";
import { myRevisionsIn, reviewQueue } from "./reviews";
import { listProjects } from "./projects";
import { countActiveSessions, countUsers } from "./users";

/** The start page data for one user; admins also get user, session and health figures. */
export async function homeFor(
  db: Db,
  user: SessionUser,
  version: string,
): Promise<Home & { work: HomeWork }> {
  const projects = await listProjects(db, user);
  const work = await workFor(db, user);
  if (!user.roles.includes("admin"))
    return { user, projects, stats: { projectCount: projects.length }, work };
  const [userCount, activeSessions, health] = await Promise.all([
    countUsers(db),
    countActiveSessions(db),
    checkHealth(db, version),
  ]);
  return {
    user,
    projects,
    stats: { projectCount: projects.length, userCount, activeSessions },
    health,
    work,
  };
}

/** The review/release part of the home page, per role held (issue 6). */
async function workFor(db: Db, user: SessionUser): Promise<HomeWork> {
  const work: HomeWork = {};
  if (user.roles.includes("author")) {
    work.myDrafts = await myRevisionsIn(db, user, "draft");
    work.changesRequested = await myRevisionsIn(db, user, "changes_requested");
    work.lastReleases = await newestReleases(db, user, 5, false);
  }
  if (user.roles.includes("reviewer")) work.queueCount = (await reviewQueue(db, user)).length;
  if (user.roles.includes("firmware")) {
    work.newestReleases = await newestReleases(db, user, 5, true);
    work.unverifiedReleases = await unverifiedReleases(db, user, 10);
  }
  return work;
}
