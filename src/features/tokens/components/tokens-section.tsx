import { useState } from "react";
import { CreateTokenSchema, type ApiToken, type CreatedToken, type TokenScope } from "@shared/schemas/tokens";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { CopyButton } from "@/components/ui/copy-button";
import { Dialog, DialogActions } from "@/components/ui/dialog";
import { Field } from "@/components/ui/field";
import { Input } from "@/components/ui/input";
import { Section } from "@/components/ui/page";
import { EmptyState, ErrorState, TableSkeleton } from "@/components/ui/states";
import { Table, Td, Th, Tr } from "@/components/ui/table";
import { useToast } from "@/components/ui/toast";
import { ApiError, fieldErrors } from "@/lib/api-client";
import { formatDateTime } from "@/lib/format";
import { useCreateToken } from "../api/create-token";
import { useMyTokens } from "../api/get-tokens";
import { useRevokeToken } from "../api/revoke-token";

const SELECT =
  "h-8 w-full rounded border border-paper-400 bg-white px-2 text-sm text-ink-900 focus:border-signal-600 focus:outline-none focus-visible:outline-2 focus-visible:outline-signal-500";

/** The secret, once: copy it now, it is stored only as a SHA-256. */
function NewSecret({ created, onDone }: { created: CreatedToken; onDone: () => void }) {
  return (
    <div
      role="status"
      aria-label="New token"
      className="flex max-w-2xl flex-col gap-2 rounded border border-warn-100 bg-warn-50 px-4 py-3 text-sm text-warn-800"
    >
      <p className="font-semibold">
        Copy the token &ldquo;{created.token.name}&rdquo; now: it is shown only this once.
      </p>
      <p>
        Tapwright keeps only its SHA-256, so nobody can show it again. Keep it in your CI&rsquo;s secret
        store, never in a repository.
      </p>
      <div className="flex items-center gap-2">
        <code
          className="min-w-0 flex-1 overflow-x-auto rounded border border-paper-300 bg-white px-2 py-1 font-mono text-[13px] text-ink-900"
          data-testid="new-token-secret"
        >
          {created.secret}
        </code>
        <CopyButton value={created.secret} label="Copy token" />
      </div>
      <div>
        <Button size="sm" onClick={onDone}>
          I have copied it
        </Button>
      </div>
    </div>
  );
}

function CreateTokenForm({ onCreated }: { onCreated: (c: CreatedToken) => void }) {
  const create = useCreateToken();
  const [name, setName] = useState("");
  const [scope, setScope] = useState<TokenScope>("read");
  const [tried, setTried] = useState(false);
  const parsed = CreateTokenSchema.safeParse({ name, scope });
  const server = fieldErrors(create.error);
  const nameError =
    (tried && !parsed.success ? parsed.error.issues.find((i) => i.path[0] === "name")?.message : undefined) ??
    server.name;
  const general =
    create.error instanceof ApiError && Object.keys(server).length === 0 ? create.error.message : undefined;
  return (
    <form
      noValidate
      aria-label="New API token"
      className="flex max-w-2xl flex-wrap items-start gap-3"
      onSubmit={(e) => {
        e.preventDefault();
        setTried(true);
        if (!parsed.success) return;
        create.mutate(parsed.data, {
          onSuccess: (c) => {
            setName("");
            setScope("read");
            setTried(false);
            onCreated(c);
          },
        });
      }}
    >
      <div className="min-w-56 flex-1">
        <Field label="Token name" hint="What uses it, e.g. the nightly FPGA build." error={nameError}>
          {({ id, describedBy, invalid }) => (
            <Input
              id={id}
              value={name}
              maxLength={80}
              aria-describedby={describedBy}
              invalid={invalid}
              onChange={(e) => setName(e.target.value)}
            />
          )}
        </Field>
      </div>
      <div className="w-56">
        <Field
          label="Scope"
          hint={
            scope === "read"
              ? "Downloads only (GET)."
              : scope === "verify"
                ? "Downloads, plus posting verification runs."
                : "Can also change things, as your roles allow."
          }
        >
          {({ id, describedBy }) => (
            <select
              id={id}
              aria-describedby={describedBy}
              className={SELECT}
              value={scope}
              onChange={(e) => setScope(e.target.value as TokenScope)}
            >
              <option value="read">read (recommended)</option>
              <option value="verify">verify</option>
              <option value="read-write">read-write</option>
            </select>
          )}
        </Field>
      </div>
      <div className="pt-5">
        <Button type="submit" variant="primary" busy={create.isPending}>
          Create token
        </Button>
      </div>
      {general && (
        <p role="alert" className="w-full text-sm text-fail-700">
          {general}
        </p>
      )}
    </form>
  );
}

function RevokeDialog({ token, onClose }: { token: ApiToken | null; onClose: () => void }) {
  const revoke = useRevokeToken();
  const toast = useToast();
  const close = () => {
    revoke.reset();
    onClose();
  };
  return (
    <Dialog
      open={token !== null}
      onClose={close}
      title={`Revoke “${token?.name ?? ""}”?`}
      description={<span className="font-mono">{token?.prefix}…</span>}
      footer={
        <DialogActions
          onCancel={close}
          label="Revoke token"
          variant="danger"
          busy={revoke.isPending}
          onConfirm={() =>
            token &&
            revoke.mutate(token.id, {
              onSuccess: () => {
                toast(`Token “${token.name}” revoked`, "pass");
                close();
              },
            })
          }
        />
      }
    >
      <p className="text-sm text-ink-800">
        Scripts using this token are refused from the next request on. This cannot be undone: create a new
        token to replace it.
      </p>
      {revoke.error && (
        <p role="alert" className="mt-2 text-sm text-fail-700">
          {revoke.error.message}
        </p>
      )}
    </Dialog>
  );
}

function TokenTable({ tokens, onRevoke }: { tokens: ApiToken[]; onRevoke: (t: ApiToken) => void }) {
  return (
    <Table label="My API tokens">
      <thead>
        <tr>
          <Th>Name</Th>
          <Th>Prefix</Th>
          <Th>Scope</Th>
          <Th>Created</Th>
          <Th>Last used</Th>
          <Th>Status</Th>
          <Th>
            <span className="sr-only">Actions</span>
          </Th>
        </tr>
      </thead>
      <tbody>
        {tokens.map((t) => (
          <Tr key={t.id}>
            <Td>{t.name}</Td>
            <Td className="font-mono text-[13px]">{t.prefix}…</Td>
            <Td>
              <Badge tone={t.scope === "read" ? "neutral" : "copper"}>{t.scope}</Badge>
            </Td>
            <Td className="font-mono text-[13px] whitespace-nowrap">{formatDateTime(t.createdAt)}</Td>
            <Td className="font-mono text-[13px] whitespace-nowrap">
              {t.lastUsedAt ? formatDateTime(t.lastUsedAt) : "never"}
            </Td>
            <Td>
              {t.revokedAt ? (
                <Badge tone="fail">revoked {formatDateTime(t.revokedAt).slice(0, 10)}</Badge>
              ) : (
                <Badge tone="pass">active</Badge>
              )}
            </Td>
            <Td className="text-right">
              {!t.revokedAt && (
                <Button
                  size="sm"
                  variant="danger-quiet"
                  aria-label={`Revoke ${t.name}`}
                  onClick={() => onRevoke(t)}
                >
                  Revoke…
                </Button>
              )}
            </Td>
          </Tr>
        ))}
      </tbody>
    </Table>
  );
}

/** Account › API tokens: create (shown once), list with prefix, scope, created and last use, revoke with confirmation. */
export function TokensSection() {
  const tokens = useMyTokens();
  const [created, setCreated] = useState<CreatedToken | null>(null);
  const [revoking, setRevoking] = useState<ApiToken | null>(null);
  return (
    <div id="api-tokens">
      <Section title="API tokens">
        <div className="flex flex-col gap-4">
          <p className="max-w-2xl text-sm text-ink-700">
            For build scripts and CI: send{" "}
            <code className="font-mono text-[13px]">Authorization: Bearer &lt;token&gt;</code>. A token acts
            as you, within your projects; a read token can download but never change anything.
          </p>
          {created ? (
            <NewSecret created={created} onDone={() => setCreated(null)} />
          ) : (
            <CreateTokenForm onCreated={setCreated} />
          )}
          {tokens.isPending ? (
            <TableSkeleton label="Loading tokens" rows={2} />
          ) : tokens.isError ? (
            <ErrorState error={tokens.error} onRetry={() => void tokens.refetch()} />
          ) : tokens.data.length === 0 ? (
            <EmptyState title="No tokens yet">
              Create one above for each script or pipeline, so each can be revoked on its own.
            </EmptyState>
          ) : (
            <TokenTable tokens={tokens.data} onRevoke={setRevoking} />
          )}
        </div>
      </Section>
      <RevokeDialog token={revoking} onClose={() => setRevoking(null)} />
    </div>
  );
}
