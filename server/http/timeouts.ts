/**
 * Socket time limits of the HTTP server: a client must finish its headers within `headersMs` and its whole
 * request (body included) within `requestMs`, else Node answers 408 and closes the socket. Without them a
 * client that declares a huge Content-Length and sends a few bytes holds a socket for Node's default of
 * 300 s (plus up to 30 s until the next check).
 */
import type { Server } from "node:http";

/** The limits the server runs with (milliseconds). */
export interface ServerTimeouts {
  headersMs: number;
  requestMs: number;
  /** How often Node looks for sockets over their limit. */
  checkEveryMs: number;
}

/** Default limits: uploads are at most 32 MiB, which a slow office link still sends well within a minute. */
export const SERVER_TIMEOUTS: ServerTimeouts = { headersMs: 15_000, requestMs: 60_000, checkEveryMs: 1_000 };

/**
 * Apply the limits to a server. Call it right after `listen()` returns: Node starts its checking timer when
 * the server emits "listening", which happens on a later tick, and reads the interval then.
 */
export function applyServerTimeouts(server: Server, t: ServerTimeouts = SERVER_TIMEOUTS): Server {
  server.headersTimeout = t.headersMs;
  server.requestTimeout = t.requestMs;
  (server as Server & { connectionsCheckingInterval: number }).connectionsCheckingInterval = t.checkEveryMs;
  return server;
}
