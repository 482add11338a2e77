import { Router } from "express";
import { CreateProjectSchema, SetMembersSchema } from "../../../shared/schemas/projects";
import { currentUser, requireRole, requireUser } from "../../auth/guards";
import { parseInput } from "../../http/errors";
import { createProject, getProject, listProjects, setMembers } from "../../services/projects";
import type { RouteContext } from "../context";
import { IdParamSchema } from "../params";

/** Projects: members see theirs, admins see and manage all. */
export function projectRoutes(ctx: RouteContext): Router {
  const r = Router();
  r.use(requireUser);
  r.get("/", async (req, res) => {
    res.json({ projects: await listProjects(ctx.db, currentUser(req)) });
  });
  r.get("/:id", async (req, res) => {
    const { id } = parseInput(IdParamSchema, req.params);
    res.json(await getProject(ctx.db, currentUser(req), id));
  });
  r.post("/", requireRole("admin"), async (req, res) => {
    const input = parseInput(CreateProjectSchema, req.body);
    res.status(201).json({ project: await createProject(ctx.db, input) });
  });
  r.put("/:id/members", requireRole("admin"), async (req, res) => {
    const { id } = parseInput(IdParamSchema, req.params);
    const { userIds } = parseInput(SetMembersSchema, req.body);
    res.status(200).json(await setMembers(ctx.db, id, userIds));
  });
  return r;
}
