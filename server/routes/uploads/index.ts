import { Router, type RequestHandler } from "express";
import multer from "multer";
import { MAX_UPLOAD_BYTES } from "../../../shared/coefficients/parse";
import { currentUser, requireRole, requireUser } from "../../auth/guards";
import { errorBody, HttpError, parseInput, validationFailed } from "../../http/errors";
import { hasNul } from "../../http/nul";
import { projectAccess } from "../../services/designs";
import { createUpload, getUpload, getUploadRaw } from "../../services/uploads";
import type { RouteContext } from "../context";
import { ProjectIdParamSchema } from "../designs";
import { IdParamSchema } from "../params";

// Memory storage: the file is parsed and stored in one go, and never touches the disk.
const receive = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: MAX_UPLOAD_BYTES, files: 1, fields: 10, fieldSize: 64 * 1024 },
  // Browsers send file names as UTF-8 bytes without a charset; multer's default would read them as Latin-1.
  defParamCharset: "utf8",
}).single("file");

/** multer with its errors turned into the API's JSON errors (413 for a file over the limit). */
const receiveFile: RequestHandler = (req, res, next) => {
  receive(req, res, (err: unknown) => {
    if (!err) return next();
    if (err instanceof multer.MulterError) {
      if (err.code === "LIMIT_FILE_SIZE") {
        const name = req.file?.originalname ?? err.field ?? "file";
        res
          .status(413)
          .json(
            errorBody(
              "bad_request",
              `The file is larger than 32 MiB (${MAX_UPLOAD_BYTES} bytes), the limit`,
              { field: name },
            ),
          );
        return;
      }
      return next(new HttpError("bad_request", `Upload refused: ${err.message}`));
    }
    // busboy's own refusals of a broken body (a NUL or line break in a part header, a cut-off form).
    if (err instanceof Error && /^(Malformed|Unexpected end|Multipart:)/.test(err.message))
      return next(new HttpError("bad_request", `The multipart body could not be read: ${err.message}`));
    next(err);
  });
};

/** /api/projects/:projectId/uploads: receive one coefficient file. */
export function projectUploadRoutes(ctx: RouteContext): Router {
  const r = Router({ mergeParams: true });
  r.use(requireUser);
  // Membership is checked before the body is read, so nobody outside the project can push 32 MiB at us.
  const member: RequestHandler = async (req, _res, next) => {
    const { projectId } = parseInput(ProjectIdParamSchema, req.params);
    await projectAccess(ctx.db, currentUser(req), projectId);
    next();
  };
  r.post("/", requireRole("author"), member, receiveFile, async (req, res) => {
    const { projectId } = parseInput(ProjectIdParamSchema, req.params);
    if (!req.file)
      throw new HttpError("bad_request", "Send the file as multipart/form-data in a field named file");
    if (hasNul(req.file.originalname))
      throw validationFailed(
        [
          {
            path: ["file"],
            message: "the file name contains a NUL character (U+0000), which is not allowed",
          },
        ],
        "The file name contains a NUL character (U+0000), which is not allowed",
      );
    const upload = await createUpload(ctx.db, currentUser(req), projectId, req.file);
    res.status(201).json({ upload });
  });
  return r;
}

/** /api/uploads/:id and its original bytes. */
export function uploadRoutes(ctx: RouteContext): Router {
  const r = Router();
  r.use(requireUser);
  r.get("/:id", async (req, res) => {
    const { id } = parseInput(IdParamSchema, req.params);
    res.json({ upload: await getUpload(ctx.db, currentUser(req), id) });
  });
  r.get("/:id/raw", async (req, res) => {
    const { id } = parseInput(IdParamSchema, req.params);
    const { upload, content } = await getUploadRaw(ctx.db, currentUser(req), id);
    // Always octet-stream: the stored media type came from the client and must not be rendered.
    res.setHeader("Content-Type", "application/octet-stream");
    res.setHeader("X-Content-SHA256", upload.sha256);
    res.attachment(upload.fileName);
    res.send(content);
  });
  return r;
}
