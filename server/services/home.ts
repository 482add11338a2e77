import type { SessionUser } from "../../shared/schemas/auth";
import type { Home } from "../../shared/schemas/projects";
import type { Db } from "../db/client";
import { checkHealth } from "./health";
import { listProjects } from "./projects";
import { countActiveSessions, countUsers } from "./users";

/** The start page data for one user; admins also get user, session and health figures. */
export async function homeFor(db: Db, user: SessionUser, version: string): Promise<Home> {
  const projects = await listProjects(db, user);
  if (!user.roles.includes("admin")) return { user, projects, stats: { projectCount: projects.length } };
  const [userCount, activeSessions, health] = await Promise.all([
    countUsers(db),
    countActiveSessions(db),
    checkHealth(db, version),
  ]);
  return { user, projects, stats: { projectCount: projects.length, userCount, activeSessions }, health };
}
