/**
 * API tokens: minted with 256 random bits, shown once, stored as SHA-256 only, revocable, last use
 * recorded. The bearer middleware (server/auth/bearer.ts) calls `authenticateToken` on each request.
 */
import { and, desc, eq, isNull } from "drizzle-orm";
import { createHash, randomBytes } from "node:crypto";
import {
  TOKEN_PREFIX,
  type ApiToken,
  type CreateTokenSchema,
  type CreatedToken,
  type TokenScope,
} from "../../shared/schemas/tokens";
import type { z } from "zod";
import type { Db } from "../db/client";
import { apiTokens, users } from "../db/schema";
import { HttpError } from "../http/errors";
import { recordAudit, type AuditActor } from "./audit";
import type { Viewer } from "./projects";
import { findUserById, toSessionUser, type UserRecord } from "./users";

/** How many leading characters of a secret are stored and shown to recognise it. */
export const SHOWN_PREFIX_LENGTH = 8;

/** SHA-256 (hex) of a token secret, as stored in api_tokens.token_hash. */
export function hashTokenSecret(secret: string): string {
  return createHash("sha256").update(secret, "utf8").digest("hex");
}

/** A fresh secret: "tw_" + 43 base64url characters (32 random bytes). */
export function newTokenSecret(): string {
  return TOKEN_PREFIX + randomBytes(32).toString("base64url");
}

/** Secrets look like this; anything else is refused before touching the database. */
export const TOKEN_SECRET_PATTERN = /^tw_[A-Za-z0-9_-]{43}$/;

const tokenColumns = {
  id: apiTokens.id,
  name: apiTokens.name,
  prefix: apiTokens.prefix,
  scope: apiTokens.scope,
  createdAt: apiTokens.createdAt,
  lastUsedAt: apiTokens.lastUsedAt,
  revokedAt: apiTokens.revokedAt,
  ownerId: users.id,
  ownerUsername: users.username,
  ownerDisplayName: users.displayName,
};

type TokenRow = {
  id: number;
  name: string;
  prefix: string;
  scope: TokenScope;
  createdAt: Date;
  lastUsedAt: Date | null;
  revokedAt: Date | null;
  ownerId: number;
  ownerUsername: string;
  ownerDisplayName: string;
};

function toApiToken(r: TokenRow): ApiToken {
  return {
    id: r.id,
    name: r.name,
    prefix: r.prefix,
    scope: r.scope,
    owner: { id: r.ownerId, username: r.ownerUsername, displayName: r.ownerDisplayName },
    createdAt: r.createdAt.toISOString(),
    lastUsedAt: r.lastUsedAt?.toISOString() ?? null,
    revokedAt: r.revokedAt?.toISOString() ?? null,
  };
}

const isAdmin = (v: Viewer): boolean => v.roles.includes("admin");

/** The viewer's tokens (everyone's for an admin asking for all), newest first. */
export async function listTokens(db: Db, viewer: Viewer, all = false): Promise<ApiToken[]> {
  if (all && !isAdmin(viewer)) throw new HttpError("forbidden", "Only admins can list everyone's tokens");
  const q = db.select(tokenColumns).from(apiTokens).innerJoin(users, eq(users.id, apiTokens.userId));
  const rows = await (all ? q : q.where(eq(apiTokens.userId, viewer.id))).orderBy(desc(apiTokens.id));
  return rows.map(toApiToken);
}

async function tokenById(db: Db, id: number): Promise<TokenRow | undefined> {
  const [row] = await db
    .select(tokenColumns)
    .from(apiTokens)
    .innerJoin(users, eq(users.id, apiTokens.userId))
    .where(eq(apiTokens.id, id));
  return row;
}

/** Mint a token for the viewer; the secret is in the answer and nowhere else, ever. */
export async function createToken(
  db: Db,
  viewer: Viewer,
  input: z.infer<typeof CreateTokenSchema>,
): Promise<CreatedToken> {
  const secret = newTokenSecret();
  const id = await db.transaction(async (tx) => {
    const [row] = await tx
      .insert(apiTokens)
      .values({
        userId: viewer.id,
        name: input.name,
        prefix: secret.slice(0, SHOWN_PREFIX_LENGTH),
        tokenHash: hashTokenSecret(secret),
        scope: input.scope,
      })
      .returning({ id: apiTokens.id });
    if (!row) throw new Error("token insert returned no row");
    await recordAudit(tx, {
      action: "token.create",
      summary: `Created API token "${input.name}" (${input.scope})`,
      subjectType: "api_token",
      subjectId: row.id,
      details: { name: input.name, scope: input.scope, prefix: secret.slice(0, SHOWN_PREFIX_LENGTH) },
    });
    return row.id;
  });
  const row = await tokenById(db, id);
  if (!row) throw new Error(`token ${id} vanished`);
  return { token: toApiToken(row), secret };
}

/** Revoke a token: its owner or an admin; others get 404 (they cannot learn it exists); twice is 409. */
export async function revokeToken(db: Db, viewer: Viewer, id: number): Promise<ApiToken> {
  const row = await tokenById(db, id);
  if (!row || (row.ownerId !== viewer.id && !isAdmin(viewer)))
    throw new HttpError("not_found", "No such token");
  if (row.revokedAt) throw new HttpError("conflict", "This token is already revoked");
  await db.transaction(async (tx) => {
    const done = await tx
      .update(apiTokens)
      .set({ revokedAt: new Date() })
      .where(and(eq(apiTokens.id, id), isNull(apiTokens.revokedAt)))
      .returning({ id: apiTokens.id });
    if (done.length === 0) throw new HttpError("conflict", "This token is already revoked");
    await recordAudit(tx, {
      action: "token.revoke",
      summary: `Revoked API token "${row.name}" (${row.prefix}…) of ${row.ownerUsername}`,
      subjectType: "api_token",
      subjectId: id,
      details: { owner: row.ownerUsername, prefix: row.prefix },
    });
  });
  const after = await tokenById(db, id);
  if (!after) throw new Error(`token ${id} vanished`);
  return toApiToken(after);
}

/** A request authenticated by a token: who, and what the token allows. */
export interface TokenIdentity {
  tokenId: number;
  scope: TokenScope;
  prefix: string;
  user: UserRecord;
}

/**
 * The live token holding this secret and its active owner, or null (unknown, revoked, owner deactivated).
 * Records the use: last_used_at and a `token.use` audit row, in one transaction.
 */
export async function authenticateToken(
  db: Db,
  secret: string,
  use: { method: string; path: string; ip: string | null },
): Promise<TokenIdentity | null> {
  if (!TOKEN_SECRET_PATTERN.test(secret)) return null;
  const [row] = await db
    .select({ id: apiTokens.id, userId: apiTokens.userId, scope: apiTokens.scope, prefix: apiTokens.prefix })
    .from(apiTokens)
    .where(and(eq(apiTokens.tokenHash, hashTokenSecret(secret)), isNull(apiTokens.revokedAt)));
  if (!row) return null;
  const user = await findUserById(db, row.userId);
  if (!user || !user.active) return null;
  const actor: AuditActor = { kind: "token", userId: user.id, ip: use.ip };
  await db.transaction(async (tx) => {
    await tx.update(apiTokens).set({ lastUsedAt: new Date() }).where(eq(apiTokens.id, row.id));
    await recordAudit(tx, {
      actor,
      action: "token.use",
      summary: `API token ${row.prefix}… used: ${use.method} ${use.path}`,
      subjectType: "api_token",
      subjectId: row.id,
      details: { method: use.method, path: use.path, scope: row.scope },
    });
  });
  return { tokenId: row.id, scope: row.scope, prefix: row.prefix, user };
}

/** The session-shaped user a token request acts as. */
export const tokenSessionUser = (id: TokenIdentity) => toSessionUser(id.user);
