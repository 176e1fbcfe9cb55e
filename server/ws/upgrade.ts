import type { IncomingMessage } from "node:http";
import { Socket } from "node:net";
import type { Duplex } from "node:stream";
import { WebSocketServer, type WebSocket } from "ws";
import type { Db } from "@/db/client";
import { liveSessionAccount } from "@/db/queries/sessions";
import { resolveSessionUser, type SessionUser } from "@/lib/auth/guard";
import { SESSION_COOKIE, type SessionData } from "@/lib/auth/session-config";
import { unsealSessionCookie } from "@/lib/auth/session-unseal";
import { WS_PATH } from "@/lib/protocol";
import type { Logger } from "../clock";
import type { Hub } from "./hub";
import { errorMessage } from "@/lib/errors";

/** The path browsers connect to: ws://<sidecar>/ws. */

/** Largest client message accepted, in bytes (ws closes the connection with 1009 beyond it). */
const MAX_CLIENT_MESSAGE = 64 * 1024;

/** A cookie value with its percent-escapes undone, or "" when they are malformed (then it unseals to no session: a 401). */
function decodedCookie(value: string): string {
  try {
    return decodeURIComponent(value);
  } catch {
    return "";
  }
}

function cookieValue(header: string | undefined, name: string): string | undefined {
  for (const part of (header ?? "").split(";")) {
    const eq = part.indexOf("=");
    if (eq > 0 && part.slice(0, eq).trim() === name) return part.slice(eq + 1).trim();
  }
  return undefined;
}

/**
 * The signed-in user behind an upgrade request, through the one session guard: the iron-session
 * cookie is unsealed, then its stored session must be live and its account enabled with the same
 * session version. The session is returned too, so the hub can run the same check again while the
 * connection is open. Only a database failure throws.
 */
export async function userFromUpgrade(
  req: IncomingMessage,
  db: Db,
  sessionSecret: string,
  ttl: number,
): Promise<{ user: SessionUser; session: SessionData } | null> {
  const sealed = cookieValue(req.headers.cookie, SESSION_COOKIE);
  if (!sealed) return null;
  const session = await unsealSessionCookie(decodedCookie(sealed), sessionSecret, ttl);
  if (typeof session.userId !== "number" || typeof session.sessionId !== "string") return null;
  const user = resolveSessionUser(session, await liveSessionAccount(db, session.sessionId));
  const { userId, sessionVersion, sessionId } = session;
  return user ? { user, session: { userId, sessionVersion, sessionId } } : null;
}

function refuse(socket: Duplex, status: 401 | 403 | 404 | 429 | 503, text: string): void {
  socket.end(`HTTP/1.1 ${status} ${text}\r\nConnection: close\r\nContent-Length: 0\r\n\r\n`);
}

/**
 * WebSocket endpoint in noServer mode: every upgrade is authenticated before ws sees it; a missing
 * or bad session gets 401, a foreign Origin 403 (when allowedOrigins is given), a user already at
 * `maxConnectionsPerUser` open connections 429, any other path 404, and a database failure 503.
 */
export function createWsEndpoint(deps: {
  db: Db;
  sessionSecret: string;
  sessionTtlSeconds: number;
  hub: Hub;
  logger: Logger;
  allowedOrigins?: readonly string[];
  maxConnectionsPerUser?: number;
}) {
  const wss = new WebSocketServer({ noServer: true, maxPayload: MAX_CLIENT_MESSAGE, perMessageDeflate: false });
  const maxPerUser = deps.maxConnectionsPerUser ?? 8;
  /** Open (or opening) connections per user id; taken synchronously after the session check, so parallel upgrades cannot pass the cap. */
  const perUser = new Map<number, number>();
  let next = 0;

  function release(userId: number): void {
    const left = (perUser.get(userId) ?? 1) - 1;
    if (left > 0) perUser.set(userId, left);
    else perUser.delete(userId);
  }

  function attach(ws: WebSocket, user: SessionUser, session: SessionData): void {
    const id = `c${++next}`;
    deps.hub.add({
      id,
      user,
      session,
      send: (text) => ws.send(text),
      bufferedAmount: () => ws.bufferedAmount,
      close: (code, reason) => ws.close(code, reason),
    });
    ws.on("message", (data, isBinary) => {
      if (isBinary) return deps.hub.message(id, "\u0000");
      deps.hub.message(id, data.toString());
    });
    ws.on("close", () => {
      deps.hub.remove(id);
      release(user.id);
    });
    ws.on("error", () => ws.terminate());
  }

  async function handleUpgrade(req: IncomingMessage, socket: Duplex, head: Buffer): Promise<void> {
    socket.on("error", () => socket.destroy());
    try {
      if (new URL(req.url ?? "/", "http://sidecar").pathname !== WS_PATH) return refuse(socket, 404, "Not Found");
      const origin = req.headers.origin;
      if (deps.allowedOrigins && origin && !deps.allowedOrigins.includes(origin)) return refuse(socket, 403, "Forbidden");
      const signedIn = await userFromUpgrade(req, deps.db, deps.sessionSecret, deps.sessionTtlSeconds);
      if (!signedIn) return refuse(socket, 401, "Unauthorized");
      const userId = signedIn.user.id;
      if ((perUser.get(userId) ?? 0) >= maxPerUser) return refuse(socket, 429, "Too Many Requests");
      perUser.set(userId, (perUser.get(userId) ?? 0) + 1);
      // ws answers a bad handshake itself (400) without calling back: the slot is released when the socket closes.
      let opened = false;
      socket.once("close", () => {
        if (!opened) release(userId);
      });
      wss.handleUpgrade(req, socket, head, (ws) => {
        opened = true;
        // Frames go out as soon as they are written (Nagle's algorithm off), as on every broker socket.
        if (socket instanceof Socket) socket.setNoDelay(true);
        attach(ws, signedIn.user, signedIn.session);
      });
    } catch (err) {
      deps.logger.warn(`upgrade failed: ${errorMessage(err)}`);
      refuse(socket, 503, "Service Unavailable");
    }
  }

  return {
    handleUpgrade,
    close(): Promise<void> {
      for (const ws of wss.clients) ws.terminate();
      return new Promise((resolve) => wss.close(() => resolve()));
    },
  };
}
