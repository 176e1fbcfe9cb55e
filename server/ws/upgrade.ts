import type { IncomingMessage } from "node:http";
import type { Duplex } from "node:stream";
import { unsealData } from "iron-session";
import { WebSocketServer, type WebSocket } from "ws";
import type { Db } from "@/db/client";
import { findUserById } from "@/db/queries/users";
import { resolveSessionUser, type SessionUser } from "@/lib/auth/guard";
import { SESSION_COOKIE, type SessionData } from "@/lib/auth/session-config";
import { WS_PATH } from "@/lib/protocol";
import type { Logger } from "../clock";
import type { Hub } from "./hub";

/** The path browsers connect to: ws://<sidecar>/ws. */

/** Largest client message accepted, in bytes (ws closes the connection with 1009 beyond it). */
const MAX_CLIENT_MESSAGE = 64 * 1024;

function cookieValue(header: string | undefined, name: string): string | undefined {
  for (const part of (header ?? "").split(";")) {
    const eq = part.indexOf("=");
    if (eq > 0 && part.slice(0, eq).trim() === name) return decodeURIComponent(part.slice(eq + 1).trim());
  }
  return undefined;
}

/**
 * The signed-in user behind an upgrade request, through the one session guard: the iron-session
 * cookie is unsealed (unsealData returns {} for a missing, forged or expired seal), then the account
 * must exist, be enabled and carry the same session version. The session is returned too, so the
 * hub can run the same check again while the connection is open.
 */
export async function userFromUpgrade(
  req: IncomingMessage,
  db: Db,
  sessionSecret: string,
  ttl: number,
): Promise<{ user: SessionUser; session: SessionData } | null> {
  const sealed = cookieValue(req.headers.cookie, SESSION_COOKIE);
  if (!sealed) return null;
  const session = await unsealData<SessionData>(sealed, { password: sessionSecret, ttl });
  if (typeof session.userId !== "number") return null;
  const user = resolveSessionUser(session, await findUserById(db, session.userId));
  return user ? { user, session: { userId: session.userId, sessionVersion: session.sessionVersion } } : null;
}

function refuse(socket: Duplex, status: 401 | 403 | 404 | 503, text: string): void {
  socket.end(`HTTP/1.1 ${status} ${text}\r\nConnection: close\r\nContent-Length: 0\r\n\r\n`);
}

/**
 * WebSocket endpoint in noServer mode: every upgrade is authenticated before ws sees it; a missing
 * or bad session gets 401, a foreign Origin 403 (when allowedOrigins is given), any other path 404.
 */
export function createWsEndpoint(deps: {
  db: Db;
  sessionSecret: string;
  sessionTtlSeconds: number;
  hub: Hub;
  logger: Logger;
  allowedOrigins?: readonly string[];
}) {
  const wss = new WebSocketServer({ noServer: true, maxPayload: MAX_CLIENT_MESSAGE, perMessageDeflate: false });
  let next = 0;

  function attach(ws: WebSocket, user: SessionUser, session: SessionData): void {
    const id = `c${++next}`;
    const socket = (ws as unknown as { _socket?: { setNoDelay?: (on: boolean) => void } })._socket;
    socket?.setNoDelay?.(true);
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
    ws.on("close", () => deps.hub.remove(id));
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
      wss.handleUpgrade(req, socket, head, (ws) => attach(ws, signedIn.user, signedIn.session));
    } catch (err) {
      deps.logger.warn(`upgrade failed: ${err instanceof Error ? err.message : String(err)}`);
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
