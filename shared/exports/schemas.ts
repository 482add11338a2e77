/**
 * API contract of export templates (zod): the list, one template, create/update bodies and the
 * live preview. Shared by the server's validation and the client's forms.
 */
import { z } from "zod";
import { SAMPLE_KINDS } from "./sample-kinds";

/** Longest template source accepted (characters); the engine enforces the same limit. */
export const TEMPLATE_BODY_MAX = 64 * 1024;

/** Longest preview text sent back; the rest is cut and flagged. */
export const PREVIEW_TEXT_MAX = 200_000;

/** A template's file extension: lower-case letters and digits, without the dot. */
export const TemplateExtensionSchema = z
  .string()
  .trim()
  .regex(/^[a-z0-9]{1,16}$/, "1 to 16 lower-case letters or digits, without the dot");

/** Built-ins have word ids ("readmemh"); custom templates have their row id as decimal text. */
export const TemplateSummarySchema = z.object({
  id: z.string(),
  builtin: z.boolean(),
  kind: z.enum(["text", "binary"]),
  name: z.string(),
  description: z.string(),
  extension: z.string(),
  version: z.number().int().positive(),
  updatedAt: z.string().nullable(),
  updatedBy: z.string().nullable(),
});
export type TemplateSummary = z.infer<typeof TemplateSummarySchema>;

export const TemplateListSchema = z.object({ templates: z.array(TemplateSummarySchema) });
export type TemplateList = z.infer<typeof TemplateListSchema>;

/** One template with its source (null for the binary renderer). */
export const TemplateDetailSchema = z.object({
  template: TemplateSummarySchema.extend({ body: z.string().nullable() }),
});
export type TemplateDetail = z.infer<typeof TemplateDetailSchema>["template"];

const name = z.string().trim().min(1, "enter a name").max(80, "at most 80 characters");
const description = z.string().trim().max(500, "at most 500 characters");
const body = z
  .string()
  .min(1, "the template is empty")
  .max(TEMPLATE_BODY_MAX, `at most ${TEMPLATE_BODY_MAX} characters`);

export const CreateTemplateSchema = z.object({
  name,
  description: description.default(""),
  extension: TemplateExtensionSchema,
  body,
});
export type CreateTemplateInput = z.input<typeof CreateTemplateSchema>;

/** Any subset of the fields; `version` (optional) must equal the stored one, so two editors cannot overwrite each other. */
export const UpdateTemplateSchema = z
  .object({
    name,
    description,
    extension: TemplateExtensionSchema,
    body,
    version: z.number().int().positive(),
  })
  .partial()
  .refine(
    (v) =>
      v.name !== undefined ||
      v.description !== undefined ||
      v.extension !== undefined ||
      v.body !== undefined,
    {
      message: "change at least one of name, description, extension, body",
    },
  );
export type UpdateTemplateInput = z.input<typeof UpdateTemplateSchema>;

export const PreviewRequestSchema = z.object({ body, sample: z.enum(SAMPLE_KINDS).default("complex") });
export type PreviewRequest = z.input<typeof PreviewRequestSchema>;

/** Where a template went wrong; line and column are 1-based, null when the engine gives none. */
export const TemplateProblemSchema = z.object({
  message: z.string(),
  line: z.number().int().nullable(),
  column: z.number().int().nullable(),
});
export type TemplateProblem = z.infer<typeof TemplateProblemSchema>;

export const PreviewResultSchema = z.discriminatedUnion("ok", [
  z.object({ ok: z.literal(true), text: z.string(), truncated: z.boolean(), bytes: z.number().int() }),
  z.object({ ok: z.literal(false), error: TemplateProblemSchema }),
]);
export type PreviewResult = z.infer<typeof PreviewResultSchema>;
