"use client";

import { useQueryClient } from "@tanstack/react-query";
import { useEffect, useMemo, useRef, useState } from "react";
import { reconnectDelayMs } from "@/lib/bench/backoff";
import { HISTORY_SECONDS, LiveStore } from "@/lib/bench/live-store";
import { productionQueryKey } from "./api";
import { decodeFrames, parseServerMessage, SESSION_ENDED, type CandidateMetrics, type ClientMessage, type ServerMessage } from "@/lib/protocol";
import { useLatest } from "@/components/hooks/use-latest";

export type LinkState = "connecting" | "live" | "reconnecting" | "signed-out";

export interface LiveStatus {
  link: LinkState;
  /** When the next reconnect attempt starts (ms since the epoch), while reconnecting. */
  retryAt: number | null;
  /** The broker link as the sidecar reports it. */
  mqtt: "connected" | "reconnecting" | "closed" | null;
  droppedFrames: number;
  /** When the last frame arrived (ms since the epoch). */
  lastFrameAt: number | null;
  /** The last refusal or failure, in the sidecar's words. */
  error: string | null;
}

export interface LiveChannel {
  store: LiveStore;
  status: LiveStatus;
  metrics: Record<string, CandidateMetrics>;
  /** Sends a message now if the link is open (messages while closed are dropped; onOpen re-sends state). */
  send(message: ClientMessage): void;
}

interface Options {
  path: string;
  sampleRateHz: number;
  /** ws://<page host>:<port><wsPath> */
  port: number;
  wsPath: string;
  /** Called on every (re)connection after subscribing, to re-send the candidates the sidecar forgot. */
  onOpen: (send: (m: ClientMessage) => void) => void;
}

/**
 * The WebSocket URL of the sidecar filtering `path` now (partitioned sidecars hold leases on their
 * channels), or `fallback` (one sidecar, or the web app not answering: the reconnect loop asks again).
 */
async function ownerUrl(path: string, fallback: string): Promise<string> {
  try {
    const res = await fetch(`/api/v1/live/owner?channel=${encodeURIComponent(path)}`, { cache: "no-store" });
    const body: unknown = res.ok ? await res.json() : null;
    const wsUrl = body && typeof body === "object" && "wsUrl" in body ? body.wsUrl : null;
    return typeof wsUrl === "string" && /^wss?:\/\//.test(wsUrl) ? wsUrl : fallback;
  } catch {
    return fallback; // the web app is down or restarting: the page's sidecar is the best guess
  }
}

const INITIAL: LiveStatus = { link: "connecting", retryAt: null, mqtt: null, droppedFrames: 0, lastFrameAt: null, error: null };

/**
 * The live WebSocket of one channel: subscribes at full rate (no server decimation, so spectra see
 * every sample), feeds frames into a LiveStore, keeps status and metrics, and reconnects by itself
 * with exponential backoff. Each connection goes to the sidecar that holds the channel now; when
 * the channel moves (the sidecar says so, or goes away) the hook asks again and follows.
 */
export function useLiveChannel(opts: Options): LiveChannel {
  const queryClient = useQueryClient();
  const store = useMemo(() => new LiveStore(opts.sampleRateHz), [opts.sampleRateHz]);
  const [status, setStatus] = useState<LiveStatus>(INITIAL);
  const [metrics, setMetrics] = useState<Record<string, CandidateMetrics>>({});
  const socketRef = useRef<WebSocket | null>(null);
  const onOpenRef = useLatest(opts.onOpen);

  useEffect(() => {
    let attempt = 0;
    let timer: ReturnType<typeof setTimeout> | null = null;
    let closed = false;
    let lastFrameShown = 0;
    const scheme = window.location.protocol === "https:" ? "wss" : "ws";
    const fallback = `${scheme}://${window.location.hostname}:${opts.port}${opts.wsPath}`;

    const handle = (msg: ServerMessage) => {
      switch (msg.type) {
        case "frame": {
          if (msg.channel !== opts.path) return;
          store.push(msg);
          const now = Date.now();
          if (now - lastFrameShown > 1000) {
            lastFrameShown = now;
            setStatus((s) => ({ ...s, lastFrameAt: now }));
          }
          return;
        }
        case "status":
          setStatus((s) => ({ ...s, mqtt: msg.mqtt, droppedFrames: msg.droppedFrames }));
          return;
        case "metrics":
          if (msg.channel === opts.path) setMetrics(msg.candidates);
          return;
        case "error":
          setStatus((s) => ({ ...s, error: msg.message }));
          return;
        case "production-changed":
          // A deployment was acknowledged: the production label, trace and analysis reload.
          if (msg.channel === opts.path) void queryClient.invalidateQueries({ queryKey: productionQueryKey(msg.channel) });
          return;
        case "moved":
          // The channel is filtered elsewhere now: drop this socket and connect to the new owner at once.
          if (msg.channel === opts.path) {
            attempt = 0;
            socketRef.current?.close();
          }
          return;
        case "hello":
          return;
      }
    };

    const connect = async () => {
      const url = await ownerUrl(opts.path, fallback);
      if (closed) return;
      const ws = new WebSocket(url);
      socketRef.current = ws;
      const send = (m: ClientMessage) => {
        if (ws.readyState === WebSocket.OPEN) ws.send(JSON.stringify(m));
      };
      ws.onopen = () => {
        attempt = 0;
        setStatus((s) => ({ ...s, link: "live", retryAt: null, error: null }));
        send({ type: "subscribe", channel: opts.path });
        send({ type: "window", channel: opts.path, seconds: HISTORY_SECONDS, maxPoints: 1_000_000 });
        onOpenRef.current(send);
      };
      ws.binaryType = "arraybuffer";
      ws.onmessage = (ev) => {
        if (ev.data instanceof ArrayBuffer) {
          const decoded = decodeFrames(new Uint8Array(ev.data));
          if (decoded.ok) for (const frame of decoded.frames) handle(frame);
          else console.warn(`[live] a binary message was refused: ${decoded.reason}`);
          return;
        }
        const message = typeof ev.data === "string" ? parseServerMessage(ev.data) : null;
        if (message) handle(message);
      };
      ws.onclose = (ev) => {
        if (socketRef.current === ws) socketRef.current = null;
        if (closed) return;
        if (ev.code === SESSION_ENDED) {
          setStatus((s) => ({ ...s, link: "signed-out", retryAt: null }));
          return;
        }
        const delay = reconnectDelayMs(attempt++, Math.random());
        setStatus((s) => ({ ...s, link: "reconnecting", retryAt: Date.now() + delay }));
        timer = setTimeout(() => void connect(), delay);
      };
    };
    void connect();
    return () => {
      closed = true;
      if (timer) clearTimeout(timer);
      const ws = socketRef.current;
      socketRef.current = null;
      ws?.close();
    };
  }, [opts.path, opts.port, opts.wsPath, store, onOpenRef, queryClient]);

  const send = useMemo(
    () => (m: ClientMessage) => {
      const ws = socketRef.current;
      if (ws && ws.readyState === WebSocket.OPEN) ws.send(JSON.stringify(m));
    },
    [],
  );

  return { store, status, metrics, send };
}
