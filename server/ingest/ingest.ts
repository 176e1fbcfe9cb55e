import { decodeSamples, MAX_PAYLOAD_BYTES, parseTopic, samplesTopic, type SampleBatch } from "@/lib/protocol";
import type { FaultLog } from "./fault-log";
import { errorMessage } from "@/lib/errors";

/** What ingest knows of a channel. */
export interface ChannelInfo {
  path: string;
  sampleRateHz: number;
}

/** Where accepted batches go (the live pipeline). */
export interface BatchSink {
  push(path: string, batch: SampleBatch): void;
}

/** The channel path of a samples topic, or null for any other topic. */
function samplesPath(topic: string): string | null {
  const parsed = parseTopic(topic);
  return parsed?.kind === "samples" ? parsed.path : null;
}

/** Relative sample-rate difference tolerated between a message and its channel (covers float32 rounding). */
const RATE_TOLERANCE = 1e-6;

export interface Ingest {
  /** Handles one MQTT message; never throws (a thrown error is counted as handler_error). */
  handle(topic: string, payload: Uint8Array): void;
  /** Knows a channel from now on (one created after start) and forgets its last sequence number (a fresh start). */
  addChannel(info: ChannelInfo): void;
  /** Accepted messages and samples so far. */
  readonly accepted: { messages: number; samples: number };
}

/**
 * Checks and decodes sample messages in this order: size, topic, channel, payload, sample rate,
 * sequence. A sequence gap is counted and the batch still used: the filter state carries on
 * across the gap as if the missing samples never existed.
 */
export function createIngest(deps: {
  channels: readonly ChannelInfo[];
  sink: BatchSink;
  faults: FaultLog;
  /** Whether this sidecar filters the channel now (its lease); messages of others are dropped uncounted. */
  accepts?: (path: string) => boolean;
}): Ingest {
  const channels = new Map(deps.channels.map((c) => [c.path, c]));
  /** Sample topics already read, with their channel: known channels only, so it holds at most one entry per channel. */
  const knownTopics = new Map<string, ChannelInfo>();
  const lastSeq = new Map<string, number>();
  const accepted = { messages: 0, samples: 0 };

  /** The channel of a sample topic (read once, then remembered), or null once the fault that refuses the message is recorded. */
  function channelOfTopic(topic: string, payload: Uint8Array): ChannelInfo | null {
    const known = knownTopics.get(topic);
    const path = known ? known.path : samplesPath(topic);
    if (path === null) {
      deps.faults.record(topic.slice(0, 128), "bad_topic");
      return null;
    }
    if (payload.byteLength > MAX_PAYLOAD_BYTES) {
      deps.faults.record(path, "oversized", `${payload.byteLength} bytes`);
      return null;
    }
    if (known) return known;
    const channel = channels.get(path);
    if (!channel) {
      deps.faults.record(path, "unknown_channel");
      return null;
    }
    knownTopics.set(topic, channel);
    return channel;
  }

  function handleUnsafe(topic: string, payload: Uint8Array): void {
    const channel = channelOfTopic(topic, payload);
    if (!channel) return;
    const { path } = channel;
    if (deps.accepts && !deps.accepts(path)) return;
    const result = decodeSamples(payload);
    if (!result.ok) return deps.faults.record(path, result.fault);
    const { batch } = result;
    if (Math.abs(batch.sampleRateHz - channel.sampleRateHz) > RATE_TOLERANCE * channel.sampleRateHz) {
      return deps.faults.record(path, "rate_mismatch", `${batch.sampleRateHz} Hz, channel is ${channel.sampleRateHz} Hz`);
    }
    const previous = lastSeq.get(path);
    if (previous !== undefined && batch.seq !== ((previous + 1) >>> 0)) {
      deps.faults.record(path, "seq_gap", `${previous} → ${batch.seq}`);
    }
    lastSeq.set(path, batch.seq);
    deps.sink.push(path, batch);
    accepted.messages++;
    accepted.samples += batch.values.length;
  }

  return {
    accepted,
    addChannel(info) {
      channels.set(info.path, info);
      knownTopics.delete(samplesTopic(info.path));
      lastSeq.delete(info.path);
    },
    handle(topic, payload) {
      try {
        handleUnsafe(topic, payload);
      } catch (err) {
        deps.faults.record(parseTopic(topic)?.kind === "samples" ? topic.split("/").slice(2, 5).join("/") : "(unknown)", "handler_error",
          errorMessage(err));
      }
    },
  };
}
