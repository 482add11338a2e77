import { Router } from "express";
import { CommentInputSchema, DecisionInputSchema } from "../../../shared/schemas/reviews";
import { CreateReleaseSchema } from "../../../shared/schemas/releases";
import { currentUser, requireUser } from "../../auth/guards";
import { parseInput } from "../../http/errors";
import { createRelease } from "../../services/releases";
import { addComment, decide, reviewPage, reviewQueue } from "../../services/reviews";
import { submitRevision } from "../../services/revisions";
import type { RouteContext } from "../context";
import { IdParamSchema } from "../params";

/** /api/reviews: the reviewer's queue. */
export function reviewQueueRoutes(ctx: RouteContext): Router {
  const r = Router();
  r.get("/queue", requireUser, async (req, res) => {
    res.json({ items: await reviewQueue(ctx.db, currentUser(req)) });
  });
  return r;
}

/**
 * /api/revisions/:id/{submit,review,comments,decision,release}. Mounted before the authoring revision routes,
 * so submit goes through the lifecycle table here: membership (404) first, then role, state, self-review.
 */
export function revisionReviewRoutes(ctx: RouteContext): Router {
  const r = Router();
  r.post("/:id/submit", requireUser, async (req, res) => {
    const { id } = parseInput(IdParamSchema, req.params);
    res.json(await submitRevision(ctx.db, currentUser(req), id));
  });
  r.get("/:id/review", requireUser, async (req, res) => {
    const { id } = parseInput(IdParamSchema, req.params);
    res.json(await reviewPage(ctx.db, currentUser(req), id));
  });
  r.post("/:id/comments", requireUser, async (req, res) => {
    const { id } = parseInput(IdParamSchema, req.params);
    const { body } = parseInput(CommentInputSchema, req.body);
    res.status(201).json({ comment: await addComment(ctx.db, currentUser(req), id, body) });
  });
  r.post("/:id/decision", requireUser, async (req, res) => {
    const { id } = parseInput(IdParamSchema, req.params);
    const input = parseInput(DecisionInputSchema, req.body);
    res.status(201).json(await decide(ctx.db, currentUser(req), id, input));
  });
  r.post("/:id/release", requireUser, async (req, res) => {
    const { id } = parseInput(IdParamSchema, req.params);
    const input = parseInput(CreateReleaseSchema, req.body);
    res.status(201).json({ release: await createRelease(ctx.db, currentUser(req), id, input) });
  });
  return r;
}
