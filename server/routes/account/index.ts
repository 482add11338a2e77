import { Router } from "express";
import { ChangePasswordSchema } from "../../../shared/schemas/auth";
import { requireSession } from "../../auth/bearer";
import { currentUser } from "../../auth/guards";
import { parseInput } from "../../http/errors";
import { changePassword } from "../../services/users";
import type { RouteContext } from "../context";

/** The signed-in user's own account. */
export function accountRoutes(ctx: RouteContext): Router {
  const r = Router();
  // Credentials are changed by a person signed in with a password, never through an API token.
  r.post("/password", requireSession, async (req, res) => {
    const user = currentUser(req);
    const input = parseInput(ChangePasswordSchema, req.body);
    await changePassword(ctx.db, user.id, input.currentPassword, input.newPassword, {
      keepSessionId: req.sessionID,
      revokeTokens: input.revokeTokens ?? false,
    });
    res.status(204).end();
  });
  return r;
}
