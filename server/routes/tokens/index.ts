import { Router } from "express";
import { z } from "zod";
import { CreateTokenSchema } from "../../../shared/schemas/tokens";
import { requireSession } from "../../auth/bearer";
import { currentUser, requireUser } from "../../auth/guards";
import { parseInput } from "../../http/errors";
import { createToken, listTokens, revokeToken } from "../../services/tokens";
import type { RouteContext } from "../context";
import { IdParamSchema } from "../params";

const ListQuerySchema = z.strictObject({ all: z.enum(["0", "1"]).optional() });

/** /api/tokens: my API tokens (create shows the secret once; revoke). Session only, never by token. */
export function tokenRoutes(ctx: RouteContext): Router {
  const r = Router();
  r.use(requireUser, requireSession);
  r.get("/", async (req, res) => {
    const { all } = parseInput(ListQuerySchema, req.query);
    res.json({ tokens: await listTokens(ctx.db, currentUser(req), all === "1") });
  });
  r.post("/", async (req, res) => {
    const input = parseInput(CreateTokenSchema, req.body);
    // The secret must never sit in a cache or a proxy log.
    res.setHeader("Cache-Control", "no-store");
    res.status(201).json(await createToken(ctx.db, currentUser(req), input));
  });
  r.post("/:id/revoke", async (req, res) => {
    const { id } = parseInput(IdParamSchema, req.params);
    res.json({ token: await revokeToken(ctx.db, currentUser(req), id) });
  });
  return r;
}
