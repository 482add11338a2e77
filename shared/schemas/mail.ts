import { z } from "zod";

/** Outbox row states. */
export const MAIL_STATUSES = ["pending", "sent", "failed"] as const;
/** One of MAIL_STATUSES. */
export type MailStatus = (typeof MAIL_STATUSES)[number];

/** The notification templates under templates/mail/. */
export const MAIL_TEMPLATES = [
  "submitted",
  "approved",
  "changes-requested",
  "released",
  "withdrawn",
  "verified",
] as const;
/** One of MAIL_TEMPLATES. */
export type MailTemplateName = (typeof MAIL_TEMPLATES)[number];

/** A sink message in the mailbox list (no bodies). */
export const SinkMessageSummarySchema = z.object({
  id: z.number().int(),
  receivedAt: z.string(),
  envelopeFrom: z.string(),
  envelopeTo: z.array(z.string()),
  subject: z.string(),
});
/** A mailbox list row. */
export type SinkMessageSummary = z.infer<typeof SinkMessageSummarySchema>;

/** The mailbox list, newest first, keyset paged by id, with the sink's port and the outbox counts. */
export const SinkMessageListSchema = z.object({
  messages: z.array(SinkMessageSummarySchema),
  nextBefore: z.number().int().nullable(),
  /** Loopback port of the SMTP sink in the answering process, null when it runs none. */
  sinkPort: z.number().int().nullable(),
  outbox: z.object({ pending: z.number().int(), sent: z.number().int(), failed: z.number().int() }),
});
/** The mailbox list answer. */
export type SinkMessageList = z.infer<typeof SinkMessageListSchema>;

/** One sink message with its bodies. */
export const SinkMessageSchema = SinkMessageSummarySchema.extend({
  messageId: z.string().nullable(),
  text: z.string(),
  html: z.string().nullable(),
});
/** A full mailbox message. */
export type SinkMessage = z.infer<typeof SinkMessageSchema>;
