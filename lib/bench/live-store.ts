import type { FrameMessage } from "@/lib/protocol";
import { MAX_CANDIDATES } from "./colors";
import { TraceRing } from "./ring-buffer";

export const RAW_SLOT = 0;
export const PRODUCTION_SLOT = 1;
export const FIRST_CANDIDATE_SLOT = 2;
export const SLOT_COUNT = FIRST_CANDIDATE_SLOT + MAX_CANDIDATES;
/** The frame's trace id of the production filter (server/pipeline PRODUCTION). */
export const PRODUCTION_TRACE = "production";
/** Seconds of history kept: the longest time window. */
export const HISTORY_SECONDS = 60;

/**
 * The browser's copy of one channel's live traces: frames go into a ring (time in s), candidates are
 * bound to fixed slots, and listeners hear of every change (the chart then redraws once per frame).
 */
export class LiveStore {
  readonly ring: TraceRing;
  readonly sampleRateHz: number;
  private readonly slotById = new Map<string, number>();
  private readonly listeners = new Set<() => void>();
  private latestValues: (number | null)[] = Array.from({ length: SLOT_COUNT }, () => null);
  /** Frames received since the store was made. */
  frames = 0;

  constructor(sampleRateHz: number, seconds = HISTORY_SECONDS) {
    if (!(sampleRateHz > 0)) throw new Error(`sampleRateHz must be > 0 Hz (got ${sampleRateHz})`);
    this.sampleRateHz = sampleRateHz;
    this.ring = new TraceRing(Math.ceil(sampleRateHz * seconds) + 1, SLOT_COUNT);
  }

  /** Routes trace `id` of later frames to candidate slot `slot` (FIRST_CANDIDATE_SLOT … SLOT_COUNT − 1). */
  bind(id: string, slot: number): void {
    if (!(slot >= FIRST_CANDIDATE_SLOT && slot < SLOT_COUNT)) throw new Error(`slot must be ${FIRST_CANDIDATE_SLOT}…${SLOT_COUNT - 1} (got ${slot})`);
    this.slotById.set(id, slot);
  }

  /** Stops routing `id` and forgets its history. */
  unbind(id: string): void {
    const slot = this.slotById.get(id);
    if (slot === undefined) return;
    this.slotById.delete(id);
    this.ring.clearSeries(slot);
    this.latestValues[slot] = null;
    this.notify();
  }

  /**
   * Appends one frame. Undecimated frames hold one point per sample; decimated ones two per bucket,
   * placed at the bucket's quarter and three-quarter times. A jump forward of more than two steps
   * leaves a gap (NaN row); time going backwards (a restarted rig) starts the history afresh.
   */
  push(frame: FrameMessage<ArrayLike<number>>): void {
    const n = frame.raw.length;
    if (n === 0) return;
    const step = frame.decimated && frame.bucketSamples ? frame.bucketSamples / (2 * frame.sampleRateHz) : 1 / frame.sampleRateHz;
    const t0 = frame.t0 / 1000 + (frame.decimated ? step / 2 : 0);
    const last = this.ring.lastX();
    if (t0 <= last - step / 2) this.ring.clear();
    else if (t0 - last > 2.5 * step) this.ring.pushBlock(last + step, step, 1, []);
    const columns: (ArrayLike<number> | undefined)[] = Array.from({ length: SLOT_COUNT }, () => undefined);
    columns[RAW_SLOT] = frame.raw;
    columns[PRODUCTION_SLOT] = frame.traces[PRODUCTION_TRACE];
    for (const [id, slot] of this.slotById) columns[slot] = frame.traces[id];
    this.ring.pushBlock(t0, step, n, columns);
    this.latestValues = columns.map((c) => (c && c.length === n ? c[n - 1] : null));
    this.frames++;
    this.notify();
  }

  /** The newest value of each slot (null when the slot has no data in the last frame). */
  latest(): readonly (number | null)[] {
    return this.latestValues;
  }

  /**
   * The finite samples of one slot over the last `seconds` s, gaps left out (for spectra: a lost message
   * of a few samples costs a small phase jump, far less than shortening the estimate to the last gap).
   */
  recent(slot: number, seconds: number): Float64Array {
    const end = this.ring.length;
    const from = this.ring.lowerBound(this.ring.lastX() - seconds);
    const out = new Float64Array(end - from);
    let n = 0;
    for (let i = from; i < end; i++) {
      const v = this.ring.y(slot, i);
      if (Number.isFinite(v)) out[n++] = v;
    }
    return out.slice(0, n);
  }

  subscribe(listener: () => void): () => void {
    this.listeners.add(listener);
    return () => this.listeners.delete(listener);
  }

  private notify(): void {
    for (const l of this.listeners) l();
  }
}
