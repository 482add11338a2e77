import { Link, useParams, useSearchParams } from "react-router-dom";
import { Button } from "@/components/ui/button";
import { PageHeader, Section } from "@/components/ui/page";
import { EmptyState, ErrorState, TableSkeleton } from "@/components/ui/states";
import { Table, Td, Th, Tr } from "@/components/ui/table";
import { cn } from "@/lib/cn";
import { formatDateTime } from "@/lib/format";
import { useMailboxList, useMailboxMessage } from "../api/get-mailbox";

/** `/admin/mailbox` and `/admin/mailbox/:id`: what the local SMTP sink received, newest first. */
export function MailboxPage() {
  const { id } = useParams();
  const selected = id && /^\d+$/.test(id) ? Number(id) : undefined;
  const [params, setParams] = useSearchParams();
  const beforeParam = params.get("before") ?? "";
  const before = /^\d+$/.test(beforeParam) ? Number(beforeParam) : undefined;
  const list = useMailboxList(before);
  const keep = params.toString() ? `?${params.toString()}` : "";

  return (
    <div>
      <PageHeader
        title="Mailbox"
        subtitle={
          list.data
            ? `${list.data.sinkPort === null ? "No SMTP sink runs in this server process." : `The development SMTP sink listens on 127.0.0.1:${list.data.sinkPort}.`} Outbox: ${list.data.outbox.pending} pending, ${list.data.outbox.sent} sent, ${list.data.outbox.failed} failed.`
            : "Mail the local SMTP sink received."
        }
      />
      <div className="grid gap-6 lg:grid-cols-[minmax(0,2fr)_minmax(0,3fr)]">
        <div>
          {list.isPending ? (
            <TableSkeleton rows={6} label="Loading the mailbox" />
          ) : list.isError ? (
            <ErrorState error={list.error} onRetry={() => void list.refetch()} />
          ) : list.data.messages.length === 0 ? (
            <EmptyState title="No mail received yet">
              Notifications (submitted, approved, released…) land here when the server sends mail to the local
              sink.
            </EmptyState>
          ) : (
            <>
              <Table label="Received messages">
                <thead>
                  <tr>
                    <Th>Received</Th>
                    <Th>To</Th>
                    <Th>Subject</Th>
                  </tr>
                </thead>
                <tbody>
                  {list.data.messages.map((m) => (
                    <Tr key={m.id} className={cn(m.id === selected && "bg-signal-50")}>
                      <Td className="whitespace-nowrap font-mono text-[13px]">
                        <time dateTime={m.receivedAt}>{formatDateTime(m.receivedAt)}</time>
                      </Td>
                      <Td className="break-all">{m.envelopeTo.join(", ")}</Td>
                      <Td>
                        <Link
                          to={`/admin/mailbox/${m.id}${keep}`}
                          aria-current={m.id === selected ? "true" : undefined}
                          className="text-signal-800 underline-offset-2 hover:underline focus-visible:outline-2 focus-visible:outline-signal-500"
                        >
                          {m.subject || "(no subject)"}
                        </Link>
                      </Td>
                    </Tr>
                  ))}
                </tbody>
              </Table>
              <nav aria-label="Pages" className="mt-3 flex justify-end gap-2">
                <Button
                  size="sm"
                  disabled={before === undefined}
                  onClick={() => setParams(new URLSearchParams())}
                >
                  Newest
                </Button>
                <Button
                  size="sm"
                  disabled={list.data.nextBefore === null}
                  onClick={() => setParams(new URLSearchParams({ before: String(list.data.nextBefore) }))}
                >
                  Older
                </Button>
              </nav>
            </>
          )}
        </div>
        <div>
          {selected === undefined ? (
            <p className="text-sm text-ink-600">Choose a message to read it.</p>
          ) : (
            <MessageView id={selected} />
          )}
        </div>
      </div>
    </div>
  );
}

function MessageView({ id }: { id: number }) {
  const q = useMailboxMessage(id);
  if (q.isPending) return <TableSkeleton rows={5} label="Loading the message" />;
  if (q.isError) return <ErrorState error={q.error} onRetry={() => void q.refetch()} />;
  const m = q.data;
  return (
    <article aria-label="Message">
      <h2 className="mb-2 text-base font-semibold text-ink-900">{m.subject || "(no subject)"}</h2>
      <dl className="mb-4 grid grid-cols-[auto_1fr] gap-x-3 gap-y-1 text-sm">
        <dt className="text-ink-600">From</dt>
        <dd className="font-mono text-[13px]">{m.envelopeFrom}</dd>
        <dt className="text-ink-600">To</dt>
        <dd className="font-mono text-[13px] break-all">{m.envelopeTo.join(", ")}</dd>
        <dt className="text-ink-600">Received</dt>
        <dd className="font-mono text-[13px]">{formatDateTime(m.receivedAt)}</dd>
      </dl>
      <Section title="Plain text">
        <pre className="max-h-96 overflow-auto whitespace-pre-wrap rounded border border-paper-300 bg-paper-50 p-3 font-mono text-[13px] text-ink-900">
          {m.text}
        </pre>
      </Section>
      {m.html !== null && (
        <Section title="HTML">
          {/* sandbox with no allowances: no scripts, no forms, no same-origin access, no navigation of this page. */}
          <iframe
            title="HTML part of the message"
            sandbox=""
            srcDoc={m.html}
            referrerPolicy="no-referrer"
            className="h-[28rem] w-full rounded border border-paper-300 bg-white"
          />
        </Section>
      )}
    </article>
  );
}
