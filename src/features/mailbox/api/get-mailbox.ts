import { keepPreviousData, queryOptions, useQuery } from "@tanstack/react-query";
import { z } from "zod";
import { SinkMessageListSchema, SinkMessageSchema } from "@shared/schemas/mail";
import { api } from "@/lib/api-client";

/** Query keys for the SMTP sink's mailbox. */
export const mailboxKeys = {
  all: ["mailbox"] as const,
  list: (before: number | undefined) => [...mailboxKeys.all, "list", before ?? null] as const,
  detail: (id: number) => [...mailboxKeys.all, "detail", id] as const,
};

/** GET /api/admin/mailbox: newest first; refreshed every 10 s so new mail shows up on its own. */
export const mailboxListQueryOptions = (before: number | undefined) =>
  queryOptions({
    queryKey: mailboxKeys.list(before),
    queryFn: ({ signal }) =>
      api(`/admin/mailbox?limit=50${before ? `&before=${before}` : ""}`, {
        schema: SinkMessageListSchema,
        signal,
      }),
    placeholderData: keepPreviousData,
    refetchInterval: 10_000,
  });

/** The mailbox list. */
export function useMailboxList(before: number | undefined) {
  return useQuery(mailboxListQueryOptions(before));
}

/** GET /api/admin/mailbox/:id. */
export const mailboxMessageQueryOptions = (id: number) =>
  queryOptions({
    queryKey: mailboxKeys.detail(id),
    queryFn: ({ signal }) =>
      api(`/admin/mailbox/${id}`, { schema: z.object({ message: SinkMessageSchema }), signal }).then(
        (r) => r.message,
      ),
    staleTime: Infinity, // a received message never changes
  });

/** One message with its parts. */
export function useMailboxMessage(id: number | undefined) {
  return useQuery({ ...mailboxMessageQueryOptions(id ?? 0), enabled: id !== undefined });
}
