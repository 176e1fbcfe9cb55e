import type { FilterSpec, LiveDesign } from "@/lib/dsp";
import { requireRole, resolveSessionUser, type SessionUser, type StoredSession } from "@/lib/auth/guard";
import { roleAtLeast, type Role } from "@/lib/auth/roles";
import type { SessionData } from "@/lib/auth/session-config";
import { AppError, errorMessage } from "@/lib/errors";
import {
  bundleFrames,
  clientMessageSchema,
  encodeFrame,
  MAX_CANDIDATES_PER_CLIENT,
  SESSION_ENDED,
  TOO_MANY_MESSAGES,
  WS_PROTOCOL_VERSION,
  type ClientMessage,
  type ControlMessage,
  type WsErrorCode,
} from "@/lib/protocol";
import { WorkBusy, WorkFailed, WorkTimeout } from "@/lib/workers/pool";
import type { BusState } from "../broker/bus";
import type { Clock, Logger, Timer } from "../clock";
import type { FaultLog } from "../ingest/fault-log";
import { bucketSize } from "../pipeline/decimate";
import { CandidateLimitError, candidateKey, PRODUCTION, type PendingBlock, type Pipeline } from "../pipeline/pipeline";
import { buildFrames, type ViewState } from "./frames";
import { tokenBucket, type TokenBucket } from "./rate-limit";

/** One browser connection as the hub sees it; the WebSocket server supplies it. */
export interface ClientConn {
  /** Unique per connection; owns the connection's candidates. */
  id: string;
  /** Who opened the connection; the hub keeps its own copy, refreshed on every session recheck. */
  user: SessionUser;
  /** What the session cookie held (user, session version, stored session), rechecked against the database. */
  session: SessionData;
  /** Sends a text message (JSON control) or a binary one (a frame). */
  send(data: string | Uint8Array): void;
  /** Closes the socket (WebSocket close code and reason). */
  close(code: number, reason: string): void;
  /** Bytes queued for the socket but not yet sent (ws.bufferedAmount). */
  bufferedAmount(): number;
}

interface Subscription {
  window: { seconds: number; maxPoints: number } | null;
}

interface ClientState {
  conn: ClientConn;
  /** The user as of the last session recheck: role checks use this, not conn.user. */
  user: SessionUser;
  subs: Map<string, Subscription>;
  droppedFrames: number;
  /** Channels on which this client has candidates. */
  candidates: Map<string, Set<string>>;
  /** The noise line this client's metrics judge per channel (Hz), when it chose one. */
  noiseLines: Map<string, number>;
  /** When this client's metrics of a channel were last sent (the clock's ms). */
  metricsSentAt: Map<string, number>;
  /** Candidates being designed (`<path>|<id>` → the add that started it); counted against the limits. */
  designing: Map<string, symbol>;
  messages: TokenBucket;
  /** Messages refused by the rate since the last one accepted; past a limit the connection is closed. */
  refusedInARow: number;
}

export interface HubOptions {
  pipeline: Pipeline;
  faults: FaultLog;
  clock: Clock;
  logger: Logger;
  busState: () => BusState;
  /** The live stored sessions of these ids with their accounts, in one query (revoked or expired ones are left out). */
  sessions: (ids: string[]) => Promise<StoredSession[]>;
  /** Designs a candidate's spec off the event loop (a worker thread with a time limit); `owner` is the connection. */
  design: (spec: FilterSpec, owner: string) => Promise<LiveDesign>;
  /** Message rate per connection: `perSecond` sustained, `burst` at once (default 20/s, 40). */
  messageRate?: { perSecond: number; burst: number };
  /** Partitioned: whether this sidecar filters the channel now; a subscriber of another's channel is told it moved. */
  serves?: (path: string) => boolean;
  /** A client with more than this many bytes queued (or BUFFERED_TICKS of its stream, when more) loses frames until it catches up. */
  maxBufferedBytes?: number;
  frameIntervalMs?: number;
  /** How often a client's metrics of a channel are refreshed, at most (default 1,000 ms). */
  metricsIntervalMs?: number;
  /** Candidates whose metrics this sidecar computes per second, at most (default METRICS_PER_SECOND); beyond it they refresh in turn, less often. */
  metricsPerSecond?: number;
  statusIntervalMs?: number;
}

export interface Hub {
  add(conn: ClientConn): void;
  remove(id: string): void;
  /** Handles one text message from a client; replies with an error message on any refusal. */
  message(id: string, text: string): void;
  /** Sends new samples of every channel to its subscribers (driven by the frame timer). */
  tick(): void;
  /**
   * Sends the metrics that are due (not sent for metricsIntervalMs) in turn, within the budget of
   * `candidates` candidate metrics (default: metricsPerSecond's share of one frame interval, carried
   * over between ticks); driven by the frame timer.
   */
  metricsTick(candidates?: number): void;
  statusTick(): void;
  /** Tells the channel's subscribers it moved to another sidecar. */
  moved(path: string): void;
  /** Sends one message to every open connection (lab-wide news such as alarms), stringified once. */
  broadcast(message: ControlMessage): void;
  /** Sends one message about a channel to the connections subscribed to it, stringified once. */
  toSubscribers(channel: string, message: ControlMessage): void;
  /**
   * Checks every open connection's session against its account (one query): a missing or disabled
   * account or a bumped session version closes the socket with SESSION_ENDED; a changed role
   * applies to later messages, and candidates the new role may not hold are removed. Runs on the
   * status timer; a call while one is in flight shares it.
   */
  recheckSessions(): Promise<void>;
  start(): void;
  stop(): void;
  readonly clientCount: number;
}

/** Default budget of live metrics: candidates per second per sidecar (each costs about 0.2 ms: two Welch estimates and a 4,096-point correlation). */
export const METRICS_PER_SECOND = 256;

/** Frame ticks of a client's own stream that may wait in its socket before it loses frames (about a quarter of a second). */
const BUFFERED_TICKS = 8;

/** Least role per client message: watching is for everyone signed in, trying filters for engineers. */
const REQUIRED_ROLE: Record<ClientMessage["type"], Role> = {
  subscribe: "operator",
  unsubscribe: "operator",
  window: "operator",
  "candidate.add": "engineer",
  "candidate.remove": "engineer",
  "noise-line": "engineer",
};

class Refusal extends Error {
  constructor(readonly code: WsErrorCode, message: string) {
    super(message);
  }
}

/** A failed candidate design as the error its client receives. */
function designRefusal(err: unknown): unknown {
  if (err instanceof WorkBusy) return new Refusal("busy", err.message);
  if (err instanceof WorkTimeout) return new Refusal("bad_spec", `${err.message} Make the design smaller: fewer sections, taps or stages.`);
  if (err instanceof WorkFailed && err.kind !== "crashed") return new Refusal("bad_spec", err.message);
  if (err instanceof CandidateLimitError) {
    return new Refusal(err.reason === "duplicate" ? "duplicate_candidate" : "too_many_candidates", err.message);
  }
  return err;
}

/**
 * Fans the pipeline out to WebSocket clients. Each tick drains every channel once; clients that
 * share a view (same trace set and bucket size) share its frames, encoded once, and each client gets
 * the tick's frames of all its channels in one binary message. A client whose socket is backed up
 * loses frames (counted, reported in its status), never slowing the others.
 */
export function createHub(opts: HubOptions): Hub {
  const maxBuffered = opts.maxBufferedBytes ?? 1 << 20;
  const rate = opts.messageRate ?? { perSecond: 20, burst: 40 };
  const clients = new Map<string, ClientState>();
  const views = new Map<string, ViewState>();
  const timers: Timer[] = [];
  let metricsStart: Timer | null = null;
  let recheck: Promise<void> | null = null;
  const frameMs = opts.frameIntervalMs ?? 33;
  const metricsIntervalMs = opts.metricsIntervalMs ?? 1000;
  /** Candidate metrics one frame tick may compute: the per-second budget's share. */
  const metricsPerTick = ((opts.metricsPerSecond ?? METRICS_PER_SECOND) * frameMs) / 1000;
  let metricsBudget = 0;
  let metricsCursor = 0;

  function send(state: ClientState, message: ControlMessage): void {
    state.conn.send(JSON.stringify(message));
  }

  function statusMessage(state: ClientState): ControlMessage {
    const all = opts.faults.byChannel();
    const faults = Object.fromEntries([...state.subs.keys()].filter((p) => all[p]).map((p) => [p, all[p]]));
    return { type: "status", mqtt: opts.busState(), droppedFrames: state.droppedFrames, faults };
  }

  function viewFor(state: ClientState, path: string, sub: Subscription): ViewState {
    const info = opts.pipeline.channel(path)!;
    const owned = state.candidates.get(path);
    const bucket = sub.window ? bucketSize(Math.round(sub.window.seconds * info.sampleRateHz), sub.window.maxPoints) : 1;
    const key = `${path}|${owned?.size ? state.conn.id : "*"}|${bucket}`;
    let view = views.get(key);
    if (!view) {
      const traceIds = new Map<string, string>([[PRODUCTION, PRODUCTION]]);
      for (const id of owned ?? []) traceIds.set(candidateKey(state.conn.id, id), id);
      view = { path, sampleRateHz: info.sampleRateHz, traceIds, bucket, carry: null };
      views.set(key, view);
    }
    return view;
  }

  /** Views depend on a client's candidates; drop its private views when they change. */
  function forgetViews(state: ClientState, path: string): void {
    for (const key of views.keys()) if (key.startsWith(`${path}|${state.conn.id}|`)) views.delete(key);
  }

  /** Entry order for every message: (parsed) → role → channel → act. */
  function handle(state: ClientState, msg: ClientMessage): void {
    const { pipeline } = opts;
    requireRole(state.user, REQUIRED_ROLE[msg.type]);
    const info = pipeline.channel(msg.channel);
    if (!info) throw new Refusal("unknown_channel", `No channel ${msg.channel}.`);
    switch (msg.type) {
      case "subscribe":
        state.subs.set(msg.channel, state.subs.get(msg.channel) ?? { window: null });
        if (opts.serves && !opts.serves(msg.channel)) send(state, { type: "moved", channel: msg.channel });
        return;
      case "unsubscribe":
        state.subs.delete(msg.channel);
        state.metricsSentAt.delete(msg.channel);
        return;
      case "window": {
        const sub = state.subs.get(msg.channel);
        if (!sub) throw new Refusal("not_subscribed", `Subscribe to ${msg.channel} first.`);
        sub.window = { seconds: msg.seconds, maxPoints: msg.maxPoints };
        return;
      }
      case "candidate.add": {
        if (msg.spec.sampleRateHz !== info.sampleRateHz) {
          throw new Refusal("bad_spec", `The spec's sample rate must be the channel's ${info.sampleRateHz} Hz.`);
        }
        const owned = state.candidates.get(msg.channel);
        const designing = [...state.designing.keys()].filter((k) => k.startsWith(`${msg.channel}|`));
        if (owned?.has(msg.id) || state.designing.has(`${msg.channel}|${msg.id}`)) {
          throw new Refusal("duplicate_candidate", `candidate '${msg.id}' already exists on ${msg.channel}`);
        }
        if ((owned?.size ?? 0) + designing.length >= MAX_CANDIDATES_PER_CLIENT) {
          throw new Refusal("too_many_candidates", `at most ${MAX_CANDIDATES_PER_CLIENT} candidates per channel`);
        }
        return startDesign(state, msg.channel, msg.id, msg.spec);
      }
      case "noise-line": {
        if (msg.freqHz === null) return void state.noiseLines.delete(msg.channel);
        if (!(msg.freqHz < info.sampleRateHz / 2)) {
          throw new Refusal("bad_message", `The noise line must lie between 0 and ${info.sampleRateHz / 2} Hz (half the channel's sample rate); got ${msg.freqHz} Hz.`);
        }
        state.noiseLines.set(msg.channel, msg.freqHz);
        return;
      }
      case "candidate.remove": {
        if (state.designing.delete(`${msg.channel}|${msg.id}`)) return;
        if (!pipeline.removeCandidate(msg.channel, state.conn.id, msg.id)) {
          throw new Refusal("unknown_candidate", `No candidate ${msg.id} on ${msg.channel}.`);
        }
        state.candidates.get(msg.channel)?.delete(msg.id);
        forgetViews(state, msg.channel);
        return;
      }
    }
  }

  /**
   * Designs a candidate on the design threads; every limit was checked before. When the design
   * comes back the candidate is added only if this add is still wanted: the connection is open, the
   * candidate was not removed meanwhile, and the role still allows it.
   */
  function startDesign(state: ClientState, path: string, id: string, spec: FilterSpec): void {
    const key = `${path}|${id}`;
    const token = Symbol(key);
    state.designing.set(key, token);
    const wanted = () => clients.get(state.conn.id) === state && state.designing.get(key) === token;
    opts
      .design(spec, state.conn.id)
      .then((live) => {
        if (!wanted()) return;
        requireRole(state.user, REQUIRED_ROLE["candidate.add"]);
        opts.pipeline.addCandidate(path, state.conn.id, id, live);
        const owned = state.candidates.get(path) ?? new Set();
        state.candidates.set(path, owned.add(id));
        forgetViews(state, path);
      })
      .catch((err: unknown) => {
        if (wanted()) refuse(state, designRefusal(err));
      })
      .finally(() => {
        if (state.designing.get(key) === token) state.designing.delete(key);
      });
  }

  /** Replies to a refused message with its error; anything unexpected is logged and answered `internal`. */
  function refuse(state: ClientState, err: unknown): void {
    if (err instanceof Refusal) return send(state, { type: "error", code: err.code, message: err.message });
    if (err instanceof AppError) {
      const code: WsErrorCode = err.code === "forbidden" || err.code === "unauthorized" ? "forbidden" : "internal";
      return send(state, { type: "error", code, message: err.message });
    }
    opts.logger.warn(`ws message failed: ${errorMessage(err)}`);
    send(state, { type: "error", code: "internal", message: "The message could not be handled." });
  }

  /** Whether a client may send another message now; a client that keeps flooding is closed. */
  function withinRate(state: ClientState): boolean {
    if (state.messages.take(opts.clock.now())) {
      state.refusedInARow = 0;
      return true;
    }
    state.refusedInARow++;
    if (state.refusedInARow === 1) {
      send(state, { type: "error", code: "rate_limited", message: `Too many messages: at most ${rate.perSecond} per second. Later ones are dropped.` });
    } else if (state.refusedInARow > rate.burst * 5) {
      hub.remove(state.conn.id);
      state.conn.close(TOO_MANY_MESSAGES, "Too many messages.");
    }
    return false;
  }

  function toSubscribers(channel: string, message: ControlMessage): void {
    const text = JSON.stringify(message);
    for (const state of clients.values()) if (state.subs.has(channel)) state.conn.send(text);
  }

  /** Encodes the channel's new frames once per view and adds them to each subscriber's list for this tick. */
  function queueFrames(path: string, blocks: PendingBlock[], outbox: Map<ClientState, Uint8Array[]>): void {
    const encoded = new Map<ViewState, Uint8Array[]>();
    for (const state of clients.values()) {
      const sub = state.subs.get(path);
      if (!sub) continue;
      const view = viewFor(state, path, sub);
      let out = encoded.get(view);
      if (!out) encoded.set(view, (out = buildFrames(view, blocks).map(encodeFrame)));
      const queued = outbox.get(state);
      if (queued) queued.push(...out);
      else outbox.set(state, [...out]);
    }
  }

  /** Drops every candidate of a client (its role no longer allows them). */
  function dropCandidates(state: ClientState): void {
    opts.pipeline.removeOwner(state.conn.id);
    for (const path of state.candidates.keys()) forgetViews(state, path);
    state.candidates.clear();
  }

  async function recheckOnce(): Promise<void> {
    const open = [...clients.values()];
    if (!open.length) return;
    const ids = [...new Set(open.flatMap((s) => (s.conn.session.sessionId ? [s.conn.session.sessionId] : [])))];
    const live = new Map((await opts.sessions(ids)).map((a) => [a.session_id, a]));
    for (const state of open) {
      if (clients.get(state.conn.id) !== state) continue;
      const user = resolveSessionUser(state.conn.session, live.get(state.conn.session.sessionId ?? ""));
      if (!user) {
        hub.remove(state.conn.id);
        state.conn.close(SESSION_ENDED, "Your session has ended. Sign in again.");
        continue;
      }
      const before = state.user.role;
      state.user = user;
      if (user.role === before) continue;
      if (roleAtLeast(user.role, REQUIRED_ROLE["candidate.add"])) continue;
      const held = [...state.candidates.values()].some((owned) => owned.size > 0);
      dropCandidates(state);
      if (held) send(state, { type: "error", code: "forbidden", message: `Your role is now ${user.role}; your candidates were removed.` });
    }
  }

  const hub: Hub = {
    get clientCount() {
      return clients.size;
    },
    add(conn) {
      const state: ClientState = {
        conn,
        user: conn.user,
        subs: new Map(),
        droppedFrames: 0,
        candidates: new Map(),
        noiseLines: new Map(),
        metricsSentAt: new Map(),
        designing: new Map(),
        messages: tokenBucket(rate.perSecond, rate.burst, opts.clock.now()),
        refusedInARow: 0,
      };
      clients.set(conn.id, state);
      const channels = opts.pipeline.paths().map((path) => ({ path, sampleRateHz: opts.pipeline.channel(path)!.sampleRateHz }));
      send(state, { type: "hello", protocol: WS_PROTOCOL_VERSION, role: conn.user.role, channels });
      send(state, statusMessage(state));
    },
    remove(id) {
      const state = clients.get(id);
      if (!state) return;
      clients.delete(id);
      dropCandidates(state);
    },
    message(id, text) {
      const state = clients.get(id);
      if (!state || !withinRate(state)) return;
      try {
        let json: unknown;
        try {
          json = JSON.parse(text);
        } catch {
          throw new Refusal("bad_message", "Messages must be JSON.");
        }
        const parsed = clientMessageSchema.safeParse(json);
        if (!parsed.success) {
          const issue = parsed.error.issues[0];
          throw new Refusal("bad_message", `${issue.path.join(".") || "message"}: ${issue.message}`);
        }
        handle(state, parsed.data);
      } catch (err) {
        refuse(state, err);
      }
    },
    tick() {
      const outbox = new Map<ClientState, Uint8Array[]>();
      for (const path of opts.pipeline.paths()) {
        const blocks = opts.pipeline.drain(path);
        if (blocks.length) queueFrames(path, blocks, outbox);
      }
      // One binary message per client and tick, whatever the number of its channels: one socket write.
      // A client may have maxBufferedBytes queued, or BUFFERED_TICKS of its own stream when that is more
      // (one watching hundreds of channels sends more than a megabyte a tick).
      for (const [state, frames] of outbox) {
        if (!frames.length) continue;
        const message = bundleFrames(frames);
        if (state.conn.bufferedAmount() > Math.max(maxBuffered, BUFFERED_TICKS * message.byteLength)) {
          state.droppedFrames += frames.length;
          continue;
        }
        state.conn.send(message);
      }
    },
    metricsTick(candidates) {
      const due = opts.clock.now() - metricsIntervalMs;
      const pairs = [...clients.values()].flatMap((state) =>
        [...state.candidates].filter(([path, ids]) => ids.size > 0 && state.subs.has(path)).map(([path, ids]) => ({ state, path, count: ids.size })),
      );
      metricsBudget = Math.min(metricsBudget + (candidates ?? metricsPerTick), Math.max(metricsPerTick, MAX_CANDIDATES_PER_CLIENT));
      // In turn from where the last tick stopped, so every channel gets its share when the budget is short.
      const start = metricsCursor;
      for (let k = 0; k < pairs.length && metricsBudget >= 1; k++) {
        const { state, path, count } = pairs[(start + k) % pairs.length];
        if ((state.metricsSentAt.get(path) ?? -Infinity) > due) continue;
        metricsBudget -= count;
        metricsCursor = (start + k + 1) % pairs.length;
        state.metricsSentAt.set(path, opts.clock.now());
        send(state, { type: "metrics", channel: path, candidates: opts.pipeline.metrics(path, state.conn.id, state.noiseLines.get(path)) });
      }
    },
    statusTick() {
      const live = new Set<ViewState>();
      for (const state of clients.values()) {
        send(state, statusMessage(state));
        for (const [path, sub] of state.subs) live.add(viewFor(state, path, sub));
      }
      for (const [key, view] of views) if (!live.has(view)) views.delete(key);
    },
    moved(path) {
      toSubscribers(path, { type: "moved", channel: path });
    },
    broadcast(message) {
      const text = JSON.stringify(message);
      for (const state of clients.values()) state.conn.send(text);
    },
    toSubscribers,
    recheckSessions() {
      recheck ??= recheckOnce()
        .catch((err) => opts.logger.warn(`session recheck failed: ${errorMessage(err)}`))
        .finally(() => {
          recheck = null;
        });
      return recheck;
    },
    start() {
      // Metrics are spread over the frame ticks within their budget, so the event loop never pauses
      // for all of them at once and the frames keep their pace however many candidates there are;
      // they run half a frame interval after the frames, so the two never hold the loop back to back.
      timers.push(opts.clock.setInterval(() => guarded("frame", hub.tick), frameMs));
      metricsStart = opts.clock.setTimeout(() => {
        metricsStart = null;
        timers.push(opts.clock.setInterval(() => guarded("metrics", () => hub.metricsTick()), frameMs));
      }, frameMs / 2);
      timers.push(
        opts.clock.setInterval(() => {
          guarded("status", hub.statusTick);
          void hub.recheckSessions();
        }, opts.statusIntervalMs ?? 2000),
      );
    },
    stop() {
      if (metricsStart) opts.clock.clearTimeout(metricsStart);
      metricsStart = null;
      for (const t of timers.splice(0)) opts.clock.clearInterval(t);
    },
  };

  function guarded(what: string, fn: () => void): void {
    try {
      fn();
    } catch (err) {
      opts.logger.warn(`${what} tick failed: ${errorMessage(err)}`);
    }
  }

  return hub;
}
