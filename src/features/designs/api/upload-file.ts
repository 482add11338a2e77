import { useMutation } from "@tanstack/react-query";
import { z } from "zod";
import { ApiErrorBodySchema } from "@shared/schemas/errors";
import { UploadSchema } from "@shared/schemas/designs";
import { ApiError } from "@/lib/api-client";

const UploadedSchema = z.object({ upload: UploadSchema });

/** The 32 MiB cap of the server (shared/coefficients/parse.ts MAX_UPLOAD_BYTES), checked before sending. */
export const MAX_UPLOAD_BYTES = 32 * 1024 * 1024;

/**
 * POST /api/projects/:projectId/uploads as multipart (field `file`). The JSON client cannot send a body that is
 * not JSON, so this one request uses fetch directly, with the same error mapping (ApiError from the error body).
 */
export async function uploadFile(projectId: number, file: File, signal?: AbortSignal) {
  if (file.size > MAX_UPLOAD_BYTES)
    throw new ApiError(
      413,
      "bad_request",
      `${file.name} is ${(file.size / 1048576).toFixed(1)} MiB; files up to 32 MiB are accepted`,
    );
  const form = new FormData();
  form.append("file", file, file.name);
  let res: Response;
  try {
    res = await fetch(`/api/projects/${projectId}/uploads`, {
      method: "POST",
      body: form,
      credentials: "same-origin",
      signal,
    });
  } catch (err) {
    if (err instanceof DOMException && err.name === "AbortError") throw err;
    throw new ApiError(0, "network", "The server could not be reached");
  }
  const json: unknown = await res.json().catch(() => undefined);
  if (!res.ok) {
    const body = ApiErrorBodySchema.safeParse(json);
    if (body.success)
      throw new ApiError(res.status, body.data.error.code, body.data.error.message, body.data.error.details);
    throw new ApiError(res.status, "internal", `The server answered ${res.status} ${res.statusText}`.trim());
  }
  const parsed = UploadedSchema.safeParse(json);
  if (!parsed.success)
    throw new ApiError(res.status, "bad_response", "Unexpected answer from the upload", parsed.error.issues);
  return parsed.data.upload;
}

/** Sends one coefficient file; the answer is the stored upload (format, count, SHA-256) or the parser's line/column error. */
export function useUploadFile(projectId: number) {
  return useMutation({ mutationFn: (file: File) => uploadFile(projectId, file) });
}
