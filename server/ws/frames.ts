import { allFinite, type FrameMessage } from "@/lib/protocol";
import { minMaxDecimate } from "../pipeline/decimate";
import type { PendingBlock } from "../pipeline/pipeline";

/** One shared view of a channel: clients with the same trace set and bucket size get the same text. */
export interface ViewState {
  path: string;
  sampleRateHz: number;
  /** Filter key in the pipeline → trace id in the frame. */
  traceIds: Map<string, string>;
  bucket: number;
  /** Decimated views hold back samples short of a whole bucket until the next tick. */
  carry: PendingBlock | null;
}

/** A frame's column: a view of the block's samples, or their min/max decimation. */
type Column = Float64Array | number[];

/** Samples [from, to) of a column, min/max decimated in buckets when bucket > 1 (a plain function: the frame path makes no closures). */
function reduce(v: Float64Array, from: number, to: number, bucket: number): Column {
  const part = from === 0 && to === v.length ? v : v.subarray(from, to);
  return bucket === 1 ? part : minMaxDecimate(part, bucket);
}

function pick(view: ViewState, block: PendingBlock, from: number, to: number, bucket: number): FrameMessage<Column> {
  const traces: Record<string, Column> = {};
  for (const [key, id] of view.traceIds) {
    const trace = block.traces.get(key);
    if (!trace) continue;
    // A trace that diverged (an unstable candidate) is left out of the frame: the chart shows no NaN or ±∞.
    const points = reduce(trace, from, to, bucket);
    if (allFinite(points)) traces[id] = points;
  }
  const frame: FrameMessage<Column> = {
    type: "frame",
    channel: view.path,
    seq: block.lastSeq,
    t0: block.t0 + (from * 1000) / view.sampleRateHz,
    sampleRateHz: view.sampleRateHz,
    raw: reduce(block.raw, from, to, bucket),
    traces,
    samples: to - from,
    decimated: bucket > 1,
  };
  if (bucket > 1) frame.bucketSamples = bucket;
  return frame;
}

function joined(a: Float64Array, b: Float64Array): Float64Array {
  const out = new Float64Array(a.length + b.length);
  out.set(a);
  out.set(b, a.length);
  return out;
}

function concat(a: PendingBlock, b: PendingBlock): PendingBlock {
  const traces = new Map<string, Float64Array>();
  for (const [key, t] of b.traces) {
    const head = a.traces.get(key);
    if (head) traces.set(key, joined(head, t));
  }
  return { seq: a.seq, lastSeq: b.lastSeq, t0: a.t0, raw: joined(a.raw, b.raw), traces };
}

/** Whether a block continues the carried samples: the next sequence number, with the same of the view's filters running. */
function continues(view: ViewState, carry: PendingBlock, block: PendingBlock): boolean {
  if (((carry.lastSeq + 1) >>> 0) !== block.seq) return false;
  return [...view.traceIds.keys()].every((key) => carry.traces.has(key) === block.traces.has(key));
}

/**
 * Frames for one view from this tick's blocks. Undecimated: one frame per block. Decimated: whole
 * buckets only, the remainder carried to the next tick while the sequence and the view's filters
 * continue; a break in the sequence, or a filter of the view switched in or out (a promotion, a
 * rollback), flushes the remainder as a short last bucket, so a new filter's trace shows from its
 * first sample. A frame's seq is the newest message it draws on.
 */
export function buildFrames(view: ViewState, blocks: readonly PendingBlock[]): FrameMessage<Column>[] {
  const frames: FrameMessage<Column>[] = [];
  for (const block of blocks) {
    if (view.bucket === 1) {
      frames.push(pick(view, block, 0, block.raw.length, 1));
      continue;
    }
    let work = block;
    if (view.carry && continues(view, view.carry, block)) work = concat(view.carry, block);
    else if (view.carry) frames.push(pick(view, view.carry, 0, view.carry.raw.length, view.bucket));
    view.carry = null;
    const whole = Math.floor(work.raw.length / view.bucket) * view.bucket;
    if (whole > 0) frames.push(pick(view, work, 0, whole, view.bucket));
    if (whole < work.raw.length) {
      const traces = new Map([...work.traces].map(([k, t]) => [k, t.slice(whole)]));
      view.carry = { seq: work.seq, lastSeq: work.lastSeq, t0: work.t0 + (whole * 1000) / view.sampleRateHz, raw: work.raw.slice(whole), traces };
    }
  }
  return frames;
}
