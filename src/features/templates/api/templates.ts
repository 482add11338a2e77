import { queryOptions, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import {
  PreviewResultSchema,
  TemplateDetailSchema,
  TemplateListSchema,
  type CreateTemplateInput,
  type PreviewRequest,
  type UpdateTemplateInput,
} from "@shared/exports/schemas";
import { api } from "@/lib/api-client";

/** Query keys for export templates: the list and each template separately. */
export const templateKeys = {
  all: ["templates"] as const,
  list: () => [...templateKeys.all, "list"] as const,
  detail: (id: string) => [...templateKeys.all, "detail", id] as const,
};

/** GET /api/templates (built-ins and custom). */
export const templatesQueryOptions = () =>
  queryOptions({
    queryKey: templateKeys.list(),
    queryFn: ({ signal }) =>
      api("/templates", { schema: TemplateListSchema, signal }).then((r) => r.templates),
  });

/** Every export template. */
export function useTemplates() {
  return useQuery(templatesQueryOptions());
}

/** GET /api/templates/:id, with its body. */
export const templateQueryOptions = (id: string) =>
  queryOptions({
    queryKey: templateKeys.detail(id),
    queryFn: ({ signal }) =>
      api(`/templates/${encodeURIComponent(id)}`, { schema: TemplateDetailSchema, signal }).then(
        (r) => r.template,
      ),
  });

/** One template. */
export function useTemplate(id: string | undefined) {
  return useQuery({ ...templateQueryOptions(id ?? ""), enabled: id !== undefined });
}

/** POST /api/templates (admin). */
export function useCreateTemplate() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateTemplateInput) =>
      api("/templates", { method: "POST", body: input, schema: TemplateDetailSchema }).then(
        (r) => r.template,
      ),
    onSuccess: () => qc.invalidateQueries({ queryKey: templateKeys.list() }),
  });
}

/** PATCH /api/templates/:id (admin); each change bumps the version. */
export function useUpdateTemplate() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, patch }: { id: string; patch: UpdateTemplateInput }) =>
      api(`/templates/${encodeURIComponent(id)}`, {
        method: "PATCH",
        body: patch,
        schema: TemplateDetailSchema,
      }).then((r) => r.template),
    onSuccess: (t) => {
      qc.setQueryData(templateKeys.detail(t.id), t);
      return qc.invalidateQueries({ queryKey: templateKeys.list() });
    },
  });
}

/** POST /api/templates/preview: the rendered text, or the problem with its line and column. */
export function previewTemplate(input: PreviewRequest, signal?: AbortSignal) {
  return api("/templates/preview", { method: "POST", body: input, schema: PreviewResultSchema, signal });
}
