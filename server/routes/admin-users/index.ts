import { Router } from "express";
import { CreateUserSchema, UpdateUserSchema } from "../../../shared/schemas/users";
import { currentUser, requireRole } from "../../auth/guards";
import { parseInput } from "../../http/errors";
import { createUser, listUsers, updateUser } from "../../services/users";
import type { RouteContext } from "../context";
import { IdParamSchema } from "../params";

/** User management, admin only. */
export function adminUserRoutes(ctx: RouteContext): Router {
  const r = Router();
  r.use(requireRole("admin"));
  r.get("/", async (_req, res) => {
    res.json({ users: await listUsers(ctx.db) });
  });
  r.post("/", async (req, res) => {
    const input = parseInput(CreateUserSchema, req.body);
    res.status(201).json(await createUser(ctx.db, input));
  });
  r.patch("/:id", async (req, res) => {
    const { id } = parseInput(IdParamSchema, req.params);
    const input = parseInput(UpdateUserSchema, req.body);
    res.json({ user: await updateUser(ctx.db, currentUser(req).id, id, input) });
  });
  return r;
}
