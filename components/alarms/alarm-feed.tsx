"use client";

import { useQuery } from "@tanstack/react-query";
import { createContext, useCallback, useContext, useEffect, useMemo, useState, type ReactNode } from "react";
import { mergeEvents, type EventFilter } from "@/lib/alarms/view";
import { reconnectDelayMs } from "@/lib/bench/backoff";
import { parseServerMessage, SESSION_ENDED, type AlarmEventView } from "@/lib/protocol";
import { fetchAlarmEvents } from "./api";

/** How the pushed alarms reach this page. */
export type FeedLink = "connecting" | "live" | "reconnecting" | "signed-out";

interface Feed {
  /** Alarms pushed (or acknowledged here) since the page opened, newest state per id. */
  pushed: ReadonlyMap<string, AlarmEventView>;
  link: FeedLink;
  /** Takes an event this page changed (an acknowledgement) before its push arrives. */
  remember(event: AlarmEventView): void;
}

const FeedContext = createContext<Feed | null>(null);

/** Most pushed events kept in memory; older ones are in the database and come back with the next fetch. */
const KEPT = 500;

/**
 * One WebSocket to the sidecar for the page's alarm news: every raised, cleared or acknowledged
 * alarm is pushed to every signed-in browser, so lists on the page change without a reload.
 * Reconnects with backoff; a session that ended stops it.
 */
export function AlarmFeed({ port, wsPath, children }: { port: number; wsPath: string; children: ReactNode }) {
  const [pushed, setPushed] = useState<ReadonlyMap<string, AlarmEventView>>(new Map());
  const [link, setLink] = useState<FeedLink>("connecting");
  const remember = useCallback((event: AlarmEventView) => {
    setPushed((old) => {
      const next = new Map(old);
      next.delete(event.id);
      next.set(event.id, event);
      for (const id of next.keys()) {
        if (next.size <= KEPT) break;
        next.delete(id);
      }
      return next;
    });
  }, []);

  useEffect(() => {
    let attempt = 0;
    let closed = false;
    let timer: ReturnType<typeof setTimeout> | null = null;
    let socket: WebSocket | null = null;
    const url = `${window.location.protocol === "https:" ? "wss" : "ws"}://${window.location.hostname}:${port}${wsPath}`;
    const connect = () => {
      const ws = new WebSocket(url);
      socket = ws;
      ws.onopen = () => {
        attempt = 0;
        setLink("live");
      };
      ws.onmessage = (ev) => {
        const message = typeof ev.data === "string" ? parseServerMessage(ev.data) : null;
        if (message?.type === "alarm") remember(message.event);
      };
      ws.onclose = (ev) => {
        if (closed) return;
        if (ev.code === SESSION_ENDED) return setLink("signed-out");
        setLink("reconnecting");
        timer = setTimeout(connect, reconnectDelayMs(attempt++, Math.random()));
      };
    };
    connect();
    return () => {
      closed = true;
      if (timer) clearTimeout(timer);
      socket?.close();
    };
  }, [port, wsPath, remember]);

  const value = useMemo(() => ({ pushed, link, remember }), [pushed, link, remember]);
  return <FeedContext.Provider value={value}>{children}</FeedContext.Provider>;
}

export function useAlarmFeed(): Feed {
  const feed = useContext(FeedContext);
  if (!feed) throw new Error("useAlarmFeed needs an <AlarmFeed> around it");
  return feed;
}

/**
 * Stored alarm events for a filter (refetched every 30 s and when the link comes back), brought up
 * to date with everything pushed since.
 */
export function useAlarmEvents(filter: EventFilter, limit = 200) {
  const { pushed, link } = useAlarmFeed();
  const query = useQuery({
    queryKey: ["alarm-events", filter, limit, link === "live"],
    queryFn: () => fetchAlarmEvents({ ...filter, limit }),
    refetchInterval: 30_000,
    placeholderData: (previous) => previous,
  });
  const events = useMemo(() => mergeEvents(query.data ?? [], pushed.values(), filter), [query.data, pushed, filter]);
  return { events, query, link };
}
