import { z } from "zod";
import { nameSchema } from "./names";
import { RoleSchema, SessionUserSchema } from "./auth";
import { HealthSchema } from "./health";
import { HomeWorkSchema } from "./reviews";

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
  name: nameSchema(120),
  description: z.string().trim().max(2000).default(""),
});
export type CreateProjectInput = z.infer<typeof CreateProjectSchema>;

export const SetMembersSchema = z.object({ userIds: z.array(z.number().int().positive()) });

/** A project member as GET /api/projects/:id lists them. */
export const ProjectMemberSchema = z.object({
  id: z.number().int(),
  username: z.string(),
  displayName: z.string(),
  roles: z.array(RoleSchema),
});
export type ProjectMember = z.infer<typeof ProjectMemberSchema>;

/** GET /api/projects/:id and PUT /api/projects/:id/members answer with this. */
export const ProjectDetailSchema = z.object({
  project: ProjectSchema,
  members: z.array(ProjectMemberSchema),
});
export type ProjectDetail = z.infer<typeof ProjectDetailSchema>;

/** GET /api/home: the signed-in user's start page, real data only. */
export const HomeSchema = z.object({
  user: SessionUserSchema,
  projects: z.array(ProjectSchema),
  stats: z.object({
    projectCount: z.number().int(),
    /** Admin only. */
    userCount: z.number().int().optional(),
    /** Admin only: unexpired sessions of signed-in users. */
    activeSessions: z.number().int().optional(),
  }),
  /** Admin only. */
  health: HealthSchema.optional(),
  /** What waits for me, per role (drafts, changes requested, review queue, newest releases). */
  work: HomeWorkSchema.optional(),
});
export type Home = z.infer<typeof HomeSchema>;
