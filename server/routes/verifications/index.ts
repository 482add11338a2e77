import { Router, type RequestHandler } from "express";
import multer from "multer";
import { z } from "zod";
import {
  CreateVerificationFieldsSchema,
  MAX_VERIFICATION_UPLOAD_BYTES,
} from "../../../shared/schemas/verifications";
import { currentUser, requireRole, requireUser } from "../../auth/guards";
import { errorBody, HttpError, parseInput } from "../../http/errors";
import { getRelease } from "../../services/releases";
import {
  createVerification,
  listVerifications,
  releaseSummary,
  verificationUpload,
} from "../../services/verifications";
import type { RouteContext } from "../context";
import { IdParamSchema } from "../params";

const RunParamsSchema = IdParamSchema.extend({ runId: z.coerce.number().int().positive() });

// Memory storage: the file is compared and stored in one go, and never touches the disk.
const receive = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: MAX_VERIFICATION_UPLOAD_BYTES, files: 1, fields: 10, fieldSize: 4 * 1024 },
}).single("file");

const MIB = MAX_VERIFICATION_UPLOAD_BYTES / (1024 * 1024);

/** multer with its errors as the API's JSON errors (413 over the limit). */
const receiveFile: RequestHandler = (req, res, next) => {
  receive(req, res, (err: unknown) => {
    if (!err) return next();
    if (err instanceof multer.MulterError) {
      if (err.code === "LIMIT_FILE_SIZE") {
        res
          .status(413)
          .json(
            errorBody(
              "bad_request",
              `The simulation output is larger than ${MIB} MiB (${MAX_VERIFICATION_UPLOAD_BYTES} bytes), the limit`,
              { field: "file" },
            ),
          );
        return;
      }
      return next(new HttpError("bad_request", `Upload refused: ${err.message}`));
    }
    next(err);
  });
};

/** /api/releases/:id/{verifications,summary}: runs of a release and what its manifest states. */
export function verificationRoutes(ctx: RouteContext): Router {
  const r = Router();
  r.use("/:id/verifications", requireUser);
  // Membership before the body is read, so nobody outside the project can push 64 MiB at us.
  const member: RequestHandler = async (req, _res, next) => {
    const { id } = parseInput(IdParamSchema, req.params);
    await getRelease(ctx.db, currentUser(req), id);
    next();
  };
  r.get("/:id/summary", requireUser, async (req, res) => {
    const { id } = parseInput(IdParamSchema, req.params);
    res.json({ summary: await releaseSummary(ctx.db, currentUser(req), id) });
  });
  r.get("/:id/verifications", async (req, res) => {
    const { id } = parseInput(IdParamSchema, req.params);
    res.json({ verifications: await listVerifications(ctx.db, currentUser(req), id) });
  });
  r.post("/:id/verifications", member, requireRole("firmware", "admin"), receiveFile, async (req, res) => {
    const { id } = parseInput(IdParamSchema, req.params);
    const fields = parseInput(CreateVerificationFieldsSchema, req.body ?? {});
    if (!req.file)
      throw new HttpError(
        "validation_failed",
        "Send the simulation output as multipart/form-data in a field named file",
        [{ path: ["file"], message: "attach the simulation output" }],
      );
    const verification = await createVerification(
      ctx.db,
      currentUser(req),
      id,
      fields,
      req.file,
      req.apiToken?.id ?? null,
    );
    res.status(201).json({ verification });
  });
  r.get("/:id/verifications/:runId/upload", async (req, res) => {
    const { id, runId } = parseInput(RunParamsSchema, req.params);
    const up = await verificationUpload(ctx.db, currentUser(req), id, runId);
    res.setHeader("Content-Type", "application/octet-stream");
    res.setHeader("X-Content-SHA256", up.sha256);
    res.attachment(up.fileName);
    res.send(up.bytes);
  });
  return r;
}
