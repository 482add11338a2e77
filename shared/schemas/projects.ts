import { z } from "zod";

export const ProjectSchema = z.object({
  id: z.number().int(),
  slug: z.string(),
  name: z.string(),
  description: z.string(),
  memberCount: z.number().int(),
  createdAt: z.string(),
});
export type Project = z.infer<typeof ProjectSchema>;

export const ProjectSlugSchema = z
  .string()
  .trim()
  .min(2, "at least 2 characters")
  .max(60, "at most 60 characters")
  .regex(/^[a-z0-9][a-z0-9-]*$/, "lower-case letters, digits and dashes");

export const CreateProjectSchema = z.object({
  slug: ProjectSlugSchema,
  name: z.string().trim().min(1, "enter a name").max(120),
  description: z.string().trim().max(2000).default(""),
});
export type CreateProjectInput = z.infer<typeof CreateProjectSchema>;

export const SetMembersSchema = z.object({ userIds: z.array(z.number().int().positive()) });
