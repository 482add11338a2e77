/**
 * Release contracts (issues 6 and 7): a semantic version of an approved revision with its immutable bundle.
 * The release JSON below is what every release route answers (list items, detail, by version, latest).
 */
import { z } from "zod";

/** Plain semantic version MAJOR.MINOR.PATCH (SemVer 2.0.0 §2: non-negative integers, no leading zeros). */
export const SEMVER_PATTERN = /^(0|[1-9]\d{0,8})\.(0|[1-9]\d{0,8})\.(0|[1-9]\d{0,8})$/;

/** A version as the author types it: "2.1.0" (no pre-release or build suffix: bundles are final). */
export const VersionSchema = z
  .string()
  .trim()
  .regex(SEMVER_PATTERN, "use MAJOR.MINOR.PATCH, e.g. 1.0.0 (no leading zeros)");

/** MAJOR.MINOR.PATCH as three integers; call only with a string that passed VersionSchema. */
export function parseVersion(version: string): { major: number; minor: number; patch: number } {
  const m = SEMVER_PATTERN.exec(version.trim());
  if (!m) throw new RangeError(`not a MAJOR.MINOR.PATCH version: ${version}`);
  return { major: Number(m[1]), minor: Number(m[2]), patch: Number(m[3]) };
}

/** Negative, zero or positive as a orders before, equal to, or after b (SemVer 2.0.0 §11, numeric parts only). */
export function compareVersions(a: string, b: string): number {
  const x = parseVersion(a);
  const y = parseVersion(b);
  return x.major - y.major || x.minor - y.minor || x.patch - y.patch;
}

/** POST /api/revisions/:id/release */
export const CreateReleaseSchema = z.object({
  version: VersionSchema,
  notes: z.string().trim().min(1, "write release notes").max(20_000, "at most 20000 characters"),
});
export type CreateReleaseInput = z.input<typeof CreateReleaseSchema>;

/** POST /api/releases/:id/withdraw */
export const WithdrawReleaseSchema = z.object({
  reason: z.string().trim().min(1, "give a reason").max(4000, "at most 4000 characters"),
});
export type WithdrawReleaseInput = z.input<typeof WithdrawReleaseSchema>;

/** A user as releases and reviews name them. */
export const PersonSchema = z.object({ id: z.number().int(), displayName: z.string() });

/** One file of a bundle, as listed in its manifest. */
export const ReleaseFileSchema = z.object({ path: z.string(), size: z.number().int(), sha256: z.string() });
export type ReleaseFile = z.infer<typeof ReleaseFileSchema>;

/** A release's verification state for lists: its newest run, and the vector sets with a passing run. */
export const ReleaseVerificationSchema = z.object({
  latest: z.object({ verdict: z.enum(["pass", "fail"]), vectorSet: z.string(), at: z.string() }).nullable(),
  passedSets: z.array(z.string()),
  /** The vector sets of the release's bundle (format 1.x bundles: `scenario`). */
  sets: z.array(z.string()),
});
export type ReleaseVerification = z.infer<typeof ReleaseVerificationSchema>;

/** The release JSON of every release route. */
export const ReleaseSchema = z.object({
  id: z.number().int(),
  designId: z.number().int(),
  designName: z.string(),
  designKind: z.enum(["waveform", "filter"]),
  projectId: z.number().int(),
  projectSlug: z.string(),
  revisionId: z.number().int(),
  revisionNumber: z.number().int(),
  version: z.string(),
  notes: z.string(),
  releasedBy: PersonSchema,
  releasedAt: z.string(),
  contentHash: z.string(),
  /** Null only for a release written without a bundle (never in normal operation). */
  bundleSha256: z.string().nullable(),
  bundleSize: z.number().int().nullable(),
  files: z.array(ReleaseFileSchema),
  withdrawn: z.object({ at: z.string(), by: PersonSchema, reason: z.string() }).nullable(),
  /** A transmit waveform: the UI shows the dummy-load / spectrum-rules caution of DESIGN.md. */
  transmit: z.boolean(),
  /** Verification runs recorded against it (docs/verification.md). */
  verification: ReleaseVerificationSchema.default({ latest: null, passedSets: [], sets: [] }),
});
export type Release = z.infer<typeof ReleaseSchema>;

/** GET /api/releases/:id, …/releases/:version, …/releases/latest; POST …/release (201), POST …/withdraw. */
export const ReleaseResponseSchema = z.object({ release: ReleaseSchema });

export const RELEASE_STATUSES = ["active", "withdrawn"] as const;
/** Filter of GET /api/releases. */
export const ReleaseStatusSchema = z.enum(RELEASE_STATUSES);

/** Query of GET /api/releases (all optional; always limited to my projects). */
export const ReleaseListQuerySchema = z.strictObject({
  project: z.string().trim().min(1).optional(),
  design: z.coerce.number().int().positive().optional(),
  status: ReleaseStatusSchema.optional(),
});
export type ReleaseListQuery = z.infer<typeof ReleaseListQuerySchema>;

/** GET /api/releases and GET /api/designs/:id/releases: newest first. */
export const ReleaseListSchema = z.object({ releases: z.array(ReleaseSchema) });

/** GET /api/designs/:id/next-versions: the next patch/minor/major after the highest version ever used. */
export const NextVersionsSchema = z.object({
  /** Highest version ever used for the design (withdrawn included), or null before the first release. */
  highest: z.string().nullable(),
  patch: z.string(),
  minor: z.string(),
  major: z.string(),
});
export type NextVersions = z.infer<typeof NextVersionsSchema>;
