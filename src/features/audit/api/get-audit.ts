import { keepPreviousData, queryOptions, useQuery } from "@tanstack/react-query";
import { z } from "zod";
import { AuditPageSchema, type AuditFilter } from "@shared/schemas/audit";
import { api } from "@/lib/api-client";
import { apiQuery } from "../lib/filters";

/** Query keys for the audit trail. */
export const auditKeys = {
  all: ["audit"] as const,
  page: (f: AuditFilter, before: number | undefined) =>
    [...auditKeys.all, "page", f, before ?? null] as const,
  options: () => [...auditKeys.all, "options"] as const,
};

/** Rows per page. */
export const AUDIT_PAGE_SIZE = 50;

/** GET /api/admin/audit: one keyset page, newest first. */
export const auditPageQueryOptions = (f: AuditFilter, before: number | undefined) =>
  queryOptions({
    queryKey: auditKeys.page(f, before),
    queryFn: ({ signal }) =>
      api(`/admin/audit?${apiQuery(f, { before, limit: AUDIT_PAGE_SIZE })}`, {
        schema: AuditPageSchema,
        signal,
      }),
    placeholderData: keepPreviousData,
  });

/** One page of the audit trail. */
export function useAuditPage(f: AuditFilter, before: number | undefined) {
  return useQuery(auditPageQueryOptions(f, before));
}

/** The CSV export's URL for the same filters (a plain link: the browser downloads it). */
export function auditCsvHref(f: AuditFilter): string {
  const q = apiQuery(f);
  return `/api/admin/audit.csv${q ? `?${q}` : ""}`;
}

const OptionsSchema = z.object({
  users: z.array(z.object({ id: z.number().int(), username: z.string() })),
  projects: z.array(z.object({ id: z.number().int(), slug: z.string(), name: z.string() })),
  actions: z.array(z.string()),
});
/** Choices for the filter selects. */
export type AuditFilterOptions = z.infer<typeof OptionsSchema>;

/** Users, projects and known actions for the filter selects (three admin reads, combined). */
export const auditOptionsQueryOptions = () =>
  queryOptions({
    queryKey: auditKeys.options(),
    queryFn: async ({ signal }) => {
      const [u, p, a] = await Promise.all([
        api("/admin/users", { schema: z.object({ users: OptionsSchema.shape.users }), signal }),
        api("/projects", { schema: z.object({ projects: OptionsSchema.shape.projects }), signal }),
        api("/admin/audit/actions", { schema: z.object({ actions: OptionsSchema.shape.actions }), signal }),
      ]);
      return OptionsSchema.parse({ users: u.users, projects: p.projects, actions: a.actions });
    },
    staleTime: 60_000,
  });

/** The filter choices. */
export function useAuditOptions() {
  return useQuery(auditOptionsQueryOptions());
}
