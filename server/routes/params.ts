import { z } from "zod";

/** `:id` path parameters: positive integers only. */
export const IdParamSchema = z.object({ id: z.coerce.number().int().positive("must be a positive integer") });
