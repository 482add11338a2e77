import { useMutation, useQueryClient } from "@tanstack/react-query";
import { ApiErrorBodySchema } from "@shared/schemas/errors";
import {
  MAX_VERIFICATION_UPLOAD_BYTES,
  VerificationResponseSchema,
  type Verification,
} from "@shared/schemas/verifications";
import { homeKeys } from "@/features/home/api/get-home";
import { releaseKeys } from "@/features/releases/api/keys";
import { ApiError } from "@/lib/api-client";
import { verificationKeys } from "./keys";

/** What the upload form sends besides the file. */
export interface VerificationUpload {
  file: File;
  vectorSet: string;
  latency: string;
  simulator: string;
  rtlRevision: string;
}

/**
 * POST /api/releases/:id/verifications as multipart (the JSON client sends JSON only, so this one request
 * uses fetch directly, with the same error mapping).
 */
export async function postVerification(releaseId: number, input: VerificationUpload): Promise<Verification> {
  if (input.file.size > MAX_VERIFICATION_UPLOAD_BYTES)
    throw new ApiError(
      413,
      "bad_request",
      `${input.file.name} is ${(input.file.size / 1048576).toFixed(1)} MiB; files up to ${MAX_VERIFICATION_UPLOAD_BYTES / 1048576} MiB are accepted`,
    );
  const form = new FormData();
  form.append("vectorSet", input.vectorSet);
  if (input.latency.trim() !== "") form.append("latency", input.latency.trim());
  if (input.simulator.trim() !== "") form.append("simulator", input.simulator.trim());
  if (input.rtlRevision.trim() !== "") form.append("rtlRevision", input.rtlRevision.trim());
  form.append("file", input.file, input.file.name);
  let res: Response;
  try {
    res = await fetch(`/api/releases/${releaseId}/verifications`, {
      method: "POST",
      body: form,
      credentials: "same-origin",
    });
  } catch {
    throw new ApiError(0, "network", "The server could not be reached");
  }
  const json: unknown = await res.json().catch(() => undefined);
  if (!res.ok) {
    const body = ApiErrorBodySchema.safeParse(json);
    if (body.success)
      throw new ApiError(res.status, body.data.error.code, body.data.error.message, body.data.error.details);
    throw new ApiError(res.status, "internal", `The server answered ${res.status} ${res.statusText}`.trim());
  }
  const parsed = VerificationResponseSchema.safeParse(json);
  if (!parsed.success)
    throw new ApiError(res.status, "bad_response", "Unexpected answer from the upload", parsed.error.issues);
  return parsed.data.verification;
}

/** Upload a simulation output; refreshes the runs, the release (its latest verdict) and the home lists. */
export function useCreateVerification(releaseId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: VerificationUpload) => postVerification(releaseId, input),
    onSuccess: () => {
      for (const key of [verificationKeys.list(releaseId), releaseKeys.all, homeKeys.all])
        void qc.invalidateQueries({ queryKey: key });
    },
  });
}
