import { z } from "zod";

export const HealthSchema = z.object({
  status: z.enum(["ok", "degraded"]),
  version: z.string(),
  database: z.object({ ok: z.boolean(), latencyMs: z.number().nullable(), error: z.string().optional() }),
  uptimeSeconds: z.number(),
});
export type Health = z.infer<typeof HealthSchema>;
