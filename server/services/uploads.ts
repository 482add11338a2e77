import { createHash } from "node:crypto";
import { and, eq, inArray } from "drizzle-orm";
import {
  CoefficientParseError,
  parseCoefficients,
  type ParsedCoefficients,
} from "../../shared/coefficients/parse";
import type { Upload } from "../../shared/schemas/designs";
import type { Db } from "../db/client";
import { uploads } from "../db/schema";
import { HttpError } from "../http/errors";
import { cpuPool } from "../jobs/cpu-pool";
import type { ParsedUpload } from "./materialize";
import { projectAccess } from "./designs";
import { recordAudit } from "./audit";
import type { Viewer } from "./projects";

/** A file as multer hands it over. */
export interface ReceivedFile {
  originalname: string;
  mimetype: string;
  buffer: Buffer;
}

const uploadColumns = {
  id: uploads.id,
  projectId: uploads.projectId,
  fileName: uploads.fileName,
  sizeBytes: uploads.sizeBytes,
  sha256: uploads.sha256,
  format: uploads.format,
  complex: uploads.complex,
  count: uploads.count,
  createdAt: uploads.createdAt,
};
type UploadRow = { [K in keyof typeof uploadColumns]: (typeof uploadColumns)[K]["_"]["data"] };

function toUpload(r: UploadRow): Upload {
  return {
    id: r.id,
    fileName: r.fileName,
    sizeBytes: r.sizeBytes,
    sha256: r.sha256,
    format: r.format as Upload["format"],
    complex: r.complex,
    count: r.count,
    createdAt: r.createdAt.toISOString(),
  };
}

/** Keep only the last path segment and printable characters of a client-supplied file name. */
export function cleanFileName(name: string): string {
  const base = name.normalize("NFC").split(/[\\/]/).pop() ?? "";
  // eslint-disable-next-line no-control-regex
  const printable = base.replace(/[\u0000-\u001f\u007f]/g, "").trim();
  return (printable || "upload").slice(0, 255);
}

// Files up to this size parse on the calling thread (well under a millisecond); larger ones in a CPU thread.
const INLINE_PARSE_BYTES = 64 * 1024;

/** Parse coefficient bytes, in a CPU thread unless the file is small. */
export async function parseOffThread(bytes: Uint8Array, fileName: string): Promise<ParsedCoefficients> {
  if (bytes.byteLength <= INLINE_PARSE_BYTES) return parseCoefficients(bytes, { fileName });
  // A copy goes to the thread; the caller keeps its buffer (it is stored as uploaded).
  const copy = new Uint8Array(bytes);
  return cpuPool().run("parseCoefficients", { bytes: copy, fileName }, [copy.buffer]);
}

/** Parse and store an upload (parse first: a bad file leaves no row). */
export async function createUpload(
  db: Db,
  viewer: Viewer,
  projectId: number,
  file: ReceivedFile,
): Promise<Upload> {
  await projectAccess(db, viewer, projectId);
  const fileName = cleanFileName(file.originalname);
  let parsed;
  try {
    parsed = await parseOffThread(file.buffer, fileName);
  } catch (e) {
    if (e instanceof CoefficientParseError)
      throw new HttpError("validation_failed", `${fileName}: ${e.message}`, {
        line: e.line,
        column: e.column,
      });
    throw e;
  }
  const sha256 = createHash("sha256").update(file.buffer).digest("hex");
  const row = await db.transaction(async (tx) => {
    const [inserted] = await tx
      .insert(uploads)
      .values({
        projectId,
        uploadedById: viewer.id,
        fileName,
        mediaType: (file.mimetype || "application/octet-stream").slice(0, 255),
        sizeBytes: file.buffer.byteLength,
        sha256,
        content: file.buffer,
        format: parsed.format,
        complex: parsed.complex,
        count: parsed.re.length,
      })
      .returning(uploadColumns);
    if (!inserted) throw new Error("upload insert returned no row");
    await recordAudit(tx, {
      action: "upload.create",
      projectId,
      subjectType: "upload",
      subjectId: inserted.id,
      summary: `Uploaded ${fileName} (${file.buffer.byteLength} bytes, ${parsed.re.length} values)`,
      details: { fileName, sha256, sizeBytes: file.buffer.byteLength, format: parsed.format },
    });
    return inserted;
  });
  return toUpload(row);
}

async function visibleUpload(db: Db, viewer: Viewer, id: number): Promise<UploadRow> {
  const [row] = await db.select(uploadColumns).from(uploads).where(eq(uploads.id, id));
  if (!row) throw new HttpError("not_found", "No such upload");
  await projectAccess(db, viewer, row.projectId, "No such upload");
  return row;
}

/** One upload's description, if the viewer may see its project. */
export async function getUpload(db: Db, viewer: Viewer, id: number): Promise<Upload> {
  return toUpload(await visibleUpload(db, viewer, id));
}

/** The original bytes of an upload, with its name and SHA-256. */
export async function getUploadRaw(
  db: Db,
  viewer: Viewer,
  id: number,
): Promise<{ upload: Upload; content: Buffer }> {
  const row = await visibleUpload(db, viewer, id);
  const [c] = await db.select({ content: uploads.content }).from(uploads).where(eq(uploads.id, id));
  if (!c) throw new HttpError("not_found", "No such upload");
  return { upload: toUpload(row), content: c.content };
}

/** Uploads of a project by id (others are left out), as stored descriptions. */
export async function uploadsByIds(db: Db, projectId: number, ids: number[]): Promise<Upload[]> {
  if (ids.length === 0) return [];
  const rows = await db
    .select(uploadColumns)
    .from(uploads)
    .where(and(eq(uploads.projectId, projectId), inArray(uploads.id, ids)));
  return rows.map(toUpload);
}

/** Uploads of a project by id, re-parsed from their stored bytes for materialization. */
export async function parsedUploads(
  db: Db,
  projectId: number,
  ids: number[],
): Promise<Map<number, ParsedUpload>> {
  const out = new Map<number, ParsedUpload>();
  if (ids.length === 0) return out;
  const rows = await db
    .select({ ...uploadColumns, content: uploads.content })
    .from(uploads)
    .where(and(eq(uploads.projectId, projectId), inArray(uploads.id, ids)));
  for (const r of rows) {
    const p = await parseOffThread(r.content, r.fileName);
    out.set(r.id, {
      id: r.id,
      fileName: r.fileName,
      sha256: r.sha256,
      format: r.format,
      complex: p.complex,
      re: p.re,
      im: p.im,
    });
  }
  return out;
}
