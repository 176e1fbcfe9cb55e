import { createFilterBank, NoSteadyState, type FilterDesign, type LiveDesign } from "@/lib/dsp";
import { MAX_CANDIDATES_PER_CLIENT, type CandidateMetrics, type SampleBatch } from "@/lib/protocol";
import type { BatchSink, ChannelInfo } from "../ingest/ingest";
import { GrowingColumn } from "./column";
import { candidateMetrics, rawSpectrum, type RawSpectrum } from "./metrics";
import { SampleRing } from "./ring";
import { SparkEnvelope, type Spark } from "./spark";

/** Filter key of the production slot in every channel's bank and in frames. */
export const PRODUCTION = "production";

/**
 * Contiguous new samples of a channel (one sequence run) with every filter's output beside them.
 * The columns are views of the channel's staging memory: valid until the channel's next push.
 */
export interface PendingBlock {
  /** Sequence numbers of the first and the newest message in the block. */
  seq: number;
  lastSeq: number;
  t0: number;
  raw: Float64Array;
  /** Filter key ("production" or `<owner>/<id>`) → output, same length as raw. */
  traces: Map<string, Float64Array>;
}

/** A block being filled: where its samples start in the channel's staging columns, and how many. */
interface OpenBlock {
  seq: number;
  lastSeq: number;
  t0: number;
  start: number;
  length: number;
  traces: Map<string, { column: GrowingColumn; start: number }>;
}

/** A channel's samples since the last drain, raw and per filter, in memory reused tick after tick. */
interface Staging {
  raw: GrowingColumn;
  traces: Map<string, GrowingColumn>;
}

interface Candidate {
  live: LiveDesign;
  output: SampleRing;
  /** Samples the candidate has filtered since it was added. */
  filtered: number;
}

interface LiveChannel {
  info: ChannelInfo;
  raw: SampleRing;
  production: { revisionId: string; design: FilterDesign } | null;
  candidates: Map<string, Candidate>;
  pending: OpenBlock[];
  staging: Staging;
  nextSeq: number | null;
  /** Set when the filter set changed, so the next batch opens a new block with aligned traces. */
  breakBlock: boolean;
  /** When the newest batch arrived (the sidecar's clock, epoch ms), or null before the first. */
  lastSampleAt: number | null;
  spark: SparkEnvelope;
}

/** A candidate refused by the pipeline: its id is taken on the channel, or the owner has as many as allowed. */
export class CandidateLimitError extends Error {
  constructor(
    readonly reason: "duplicate" | "too_many",
    message: string,
  ) {
    super(message);
    this.name = "CandidateLimitError";
  }
}

export interface Pipeline extends BatchSink {
  /** Sets or clears (design null) the channel's production filter; its state starts at rest. */
  setProductionFilter(path: string, revisionId: string, design: FilterDesign | null): void;
  /** The revision in the production slot, or null. */
  productionRevision(path: string): string | null;
  /** Adds a candidate for `owner`; throws CandidateLimitError past MAX_CANDIDATES_PER_CLIENT or for a taken id. */
  addCandidate(path: string, owner: string, id: string, live: LiveDesign): void;
  removeCandidate(path: string, owner: string, id: string): boolean;
  /** Removes every candidate of an owner (a closed connection). */
  removeOwner(owner: string): void;
  /** New samples since the last drain, in sequence runs; clears them. The blocks' columns are valid until the channel's next push: copy what is kept longer. */
  drain(path: string): PendingBlock[];
  /** Live metrics of an owner's candidates on a channel (null fields until a candidate has settled), judged at `lineHz` when given, else at the strongest raw peak. */
  metrics(path: string, owner: string, lineHz?: number | null): Record<string, CandidateMetrics>;
  channel(path: string): ChannelInfo | undefined;
  /** Adds a channel created after start; known channels are left as they are. */
  addChannel(info: ChannelInfo): void;
  /** Stops a channel handed to another sidecar: production filter cleared, samples not yet sent dropped. */
  resetChannel(path: string): void;
  paths(): string[];
  /** When the channel's newest batch arrived (epoch ms, the `now` given), or null before the first. */
  lastSampleAt(path: string): number | null;
  /** The channel's raw envelope over about the last 30 s (60 buckets of about 500 ms), or null. */
  spark(path: string): Spark | null;
  /** The channel's newest raw samples held (at most n), oldest first. */
  recent(path: string, n: number): Float64Array;
  /** Calls fn with every accepted batch after filtering, with the production output beside it (null without one; valid only during the call); returns the unsubscribe. */
  onSamples(fn: SamplesListener): () => void;
}

export type SamplesListener = (path: string, batch: SampleBatch, production: Float64Array | null) => void;

export const candidateKey = (owner: string, id: string): string => `${owner}/${id}`;

const EMPTY_METRICS: CandidateMetrics = {
  removedRms: null,
  lagMs: null,
  measuredAttenuationDb: null,
  predictedAttenuationDb: null,
  noiseLineHz: null,
};

/**
 * The live pipeline: per channel a ring of raw samples, the production slot and any number of
 * candidates, all run on every sample by one lib/dsp filter bank. Accepted batches come in through
 * push (from ingest); filtered production output goes out through onFiltered (for republishing).
 */
export function createPipeline(deps: {
  channels: readonly ChannelInfo[];
  historySeconds?: number;
  /** Seconds a candidate runs before its metrics are reported (its transient settles). */
  settleSeconds?: number;
  onFiltered?: (path: string, batch: SampleBatch, values: Float64Array) => void;
  /** The sidecar's clock, for lastSampleAt (epoch ms). */
  now?: () => number;
  /** A candidate's metrics could not be computed (they are reported empty); for the log. */
  onMetricsError?: (path: string, id: string, err: unknown) => void;
}): Pipeline {
  const now = deps.now ?? Date.now;
  const historySeconds = deps.historySeconds ?? 60;
  const settleSeconds = deps.settleSeconds ?? 1;
  const bank = createFilterBank();
  const listeners: SamplesListener[] = [];
  const fresh = (info: ChannelInfo): LiveChannel => ({
    info,
    raw: new SampleRing(Math.ceil(historySeconds * info.sampleRateHz)),
    production: null,
    candidates: new Map(),
    pending: [],
    staging: { raw: new GrowingColumn(0), traces: new Map() },
    nextSeq: null,
    breakBlock: false,
    lastSampleAt: null,
    spark: new SparkEnvelope(info.sampleRateHz),
  });
  const live = new Map<string, LiveChannel>(deps.channels.map((info) => [info.path, fresh(info)]));

  function channelOf(path: string): LiveChannel {
    const ch = live.get(path);
    if (!ch) throw new Error(`unknown channel '${path}'`);
    return ch;
  }

  /** Empties a channel's staging for the next samples; columns of filters no longer running are let go. */
  function emptyStaging(ch: LiveChannel): void {
    ch.staging.raw.reset();
    for (const [key, column] of ch.staging.traces) {
      if (key === PRODUCTION ? ch.production : ch.candidates.has(key)) column.reset();
      else ch.staging.traces.delete(key);
    }
  }

  function clearProduction(path: string, ch: LiveChannel): void {
    if (ch.production) bank.remove(path, PRODUCTION);
    ch.production = null;
  }

  function blockFor(ch: LiveChannel, batch: SampleBatch): OpenBlock {
    const last = ch.pending.at(-1);
    const contiguous = last && !ch.breakBlock && ch.nextSeq === batch.seq;
    ch.breakBlock = false;
    ch.nextSeq = (batch.seq + 1) >>> 0;
    if (contiguous) {
      last.lastSeq = batch.seq;
      return last;
    }
    const block: OpenBlock = { seq: batch.seq, lastSeq: batch.seq, t0: batch.t0, start: ch.staging.raw.length, length: 0, traces: new Map() };
    ch.pending.push(block);
    return block;
  }

  function push(path: string, batch: SampleBatch): void {
    const ch = channelOf(path);
    ch.raw.push(batch.values);
    ch.spark.push(batch.t0, batch.values);
    ch.lastSampleAt = now();
    const block = blockFor(ch, batch);
    ch.staging.raw.append(batch.values);
    block.length += batch.values.length;
    if (!ch.production && ch.candidates.size === 0) {
      for (const fn of listeners) fn(path, batch, null);
      return;
    }
    const outputs = bank.process(path, batch.values);
    for (const [key, y] of outputs) {
      let trace = block.traces.get(key);
      if (!trace) {
        let column = ch.staging.traces.get(key);
        if (!column) ch.staging.traces.set(key, (column = new GrowingColumn(ch.staging.raw.length)));
        block.traces.set(key, (trace = { column, start: column.length }));
      }
      trace.column.append(y);
      const candidate = ch.candidates.get(key);
      if (candidate) {
        candidate.output.push(y);
        candidate.filtered += y.length;
      } else if (key === PRODUCTION) {
        deps.onFiltered?.(path, batch, y);
      }
    }
    for (const fn of listeners) fn(path, batch, outputs.get(PRODUCTION) ?? null);
  }

  /**
   * Live filters start at the steady state of the first sample they see, so a new trace does not
   * swing in from zero; a filter without a steady state (a pole at z = 1) starts at rest.
   */
  function addLive(path: string, id: string, design: FilterDesign): void {
    try {
      bank.add(path, id, design, { initial: "step" });
    } catch (err) {
      if (!(err instanceof NoSteadyState)) throw err;
      bank.add(path, id, design);
    }
  }

  return {
    push,
    setProductionFilter(path, revisionId, design) {
      const ch = channelOf(path);
      clearProduction(path, ch);
      if (design) {
        addLive(path, PRODUCTION, design);
        ch.production = { revisionId, design };
      }
      ch.breakBlock = true;
    },
    productionRevision: (path) => channelOf(path).production?.revisionId ?? null,
    addCandidate(path, owner, id, live) {
      const ch = channelOf(path);
      const key = candidateKey(owner, id);
      if (ch.candidates.has(key)) throw new CandidateLimitError("duplicate", `candidate '${id}' already exists on ${path}`);
      const mine = [...ch.candidates.keys()].filter((k) => k.startsWith(`${owner}/`)).length;
      if (mine >= MAX_CANDIDATES_PER_CLIENT) {
        throw new CandidateLimitError("too_many", `at most ${MAX_CANDIDATES_PER_CLIENT} candidates per channel`);
      }
      addLive(path, key, live.design);
      ch.candidates.set(key, { live, output: new SampleRing(Math.ceil(ch.info.sampleRateHz)), filtered: 0 });
      ch.breakBlock = true;
    },
    removeCandidate(path, owner, id) {
      const ch = channelOf(path);
      const key = candidateKey(owner, id);
      if (!ch.candidates.delete(key)) return false;
      bank.remove(path, key);
      // A block's traces all cover its raw samples: the next samples start a block without this one.
      ch.breakBlock = true;
      return true;
    },
    removeOwner(owner) {
      for (const [path, ch] of live) {
        for (const key of [...ch.candidates.keys()]) {
          if (!key.startsWith(`${owner}/`)) continue;
          ch.candidates.delete(key);
          bank.remove(path, key);
          ch.breakBlock = true;
        }
      }
    },
    drain(path) {
      const ch = channelOf(path);
      if (!ch.pending.length) return [];
      const blocks: PendingBlock[] = [];
      for (const { seq, lastSeq, t0, start, length, traces } of ch.pending) {
        const views = new Map<string, Float64Array>();
        for (const [key, t] of traces) views.set(key, t.column.view(t.start, t.start + length));
        blocks.push({ seq, lastSeq, t0, raw: ch.staging.raw.view(start, start + length), traces: views });
      }
      ch.pending = [];
      emptyStaging(ch);
      return blocks;
    },
    metrics(path, owner, lineHz = null) {
      const ch = channelOf(path);
      const fs = ch.info.sampleRateHz;
      const n = Math.ceil(fs);
      const result: Record<string, CandidateMetrics> = {};
      const raw = ch.raw.latest(n);
      let spectrum: RawSpectrum | undefined;
      for (const [key, c] of ch.candidates) {
        if (!key.startsWith(`${owner}/`)) continue;
        const id = key.slice(owner.length + 1);
        if (c.filtered < n + settleSeconds * fs) {
          result[id] = EMPTY_METRICS;
          continue;
        }
        try {
          spectrum ??= rawSpectrum(raw, fs);
          result[id] = candidateMetrics(raw, c.output.latest(n), c.live, spectrum, lineHz);
        } catch (err) {
          deps.onMetricsError?.(path, id, err);
          result[id] = EMPTY_METRICS;
        }
      }
      return result;
    },
    channel: (path) => live.get(path)?.info,
    addChannel(info) {
      if (!live.has(info.path)) live.set(info.path, fresh(info));
    },
    resetChannel(path) {
      const ch = channelOf(path);
      clearProduction(path, ch);
      ch.pending = [];
      emptyStaging(ch);
      ch.nextSeq = null;
      ch.breakBlock = true;
    },
    paths: () => [...live.keys()],
    lastSampleAt: (path) => channelOf(path).lastSampleAt,
    spark: (path) => channelOf(path).spark.read(),
    recent: (path, n) => channelOf(path).raw.latest(n),
    onSamples(fn) {
      listeners.push(fn);
      return () => {
        const i = listeners.indexOf(fn);
        if (i >= 0) listeners.splice(i, 1);
      };
    },
  };
}
