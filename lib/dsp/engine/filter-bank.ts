import type { FilterDesign } from "../types";
import { createStreamingFilter, type StreamingFilter, type StreamingFilterOptions } from "./streaming-filter";

interface BankEntry {
  filter: StreamingFilter;
  out: Float64Array;
}

interface Channel {
  entries: Map<string, BankEntry>;
  outputs: Map<string, Float64Array>;
}

/**
 * Streaming filters for many channels: channel id → filter id → filter. Processing a block for a
 * channel runs every filter of that channel on it. Output arrays are owned by the bank and reused
 * while the block length stays the same, so steady operation allocates nothing; copy an output if
 * it must outlive the next call for that channel.
 */
export interface FilterBank {
  /** Add a filter; throws if the id is taken on that channel. */
  add(channelId: string, filterId: string, design: FilterDesign, opts?: StreamingFilterOptions): void;
  /** Remove one filter; returns whether it existed. A channel with no filters left is dropped. */
  remove(channelId: string, filterId: string): boolean;
  /** Remove a channel and all its filters; returns whether it existed. */
  removeChannel(channelId: string): boolean;
  /** Reset one filter, every filter of a channel, or (no arguments) everything. Unknown ids throw. */
  reset(channelId?: string, filterId?: string): void;
  /** Filter a block for a channel; returns filter id → output block (bank-owned, reused). Unknown channel throws. */
  process(channelId: string, x: Float64Array): ReadonlyMap<string, Float64Array>;
  /** Non-finite input samples seen by one filter. */
  faults(channelId: string, filterId: string): number;
  channelIds(): string[];
  filterIds(channelId: string): string[];
}

export function createFilterBank(): FilterBank {
  const channels = new Map<string, Channel>();

  function channelOf(channelId: string): Channel {
    const channel = channels.get(channelId);
    if (!channel) throw new Error(`unknown channel '${channelId}'`);
    return channel;
  }

  function entryOf(channelId: string, filterId: string): BankEntry {
    const entry = channelOf(channelId).entries.get(filterId);
    if (!entry) throw new Error(`unknown filter '${filterId}' on channel '${channelId}'`);
    return entry;
  }

  return {
    add(channelId, filterId, design, opts) {
      const channel = channels.get(channelId) ?? { entries: new Map(), outputs: new Map() };
      if (channel.entries.has(filterId)) {
        throw new Error(`filter '${filterId}' already exists on channel '${channelId}'`);
      }
      const filter = createStreamingFilter(design, opts);
      const out = new Float64Array(0);
      channel.entries.set(filterId, { filter, out });
      channel.outputs.set(filterId, out);
      channels.set(channelId, channel);
    },
    remove(channelId, filterId) {
      const channel = channels.get(channelId);
      if (!channel || !channel.entries.delete(filterId)) return false;
      channel.outputs.delete(filterId);
      if (channel.entries.size === 0) channels.delete(channelId);
      return true;
    },
    removeChannel(channelId) {
      return channels.delete(channelId);
    },
    reset(channelId, filterId) {
      if (channelId === undefined) {
        for (const channel of channels.values()) for (const entry of channel.entries.values()) entry.filter.reset();
      } else if (filterId === undefined) {
        for (const entry of channelOf(channelId).entries.values()) entry.filter.reset();
      } else {
        entryOf(channelId, filterId).filter.reset();
      }
    },
    process(channelId, x) {
      const channel = channelOf(channelId);
      for (const [filterId, entry] of channel.entries) {
        if (entry.out.length !== x.length) {
          entry.out = new Float64Array(x.length);
          channel.outputs.set(filterId, entry.out);
        }
        entry.filter.process(x, entry.out);
      }
      return channel.outputs;
    },
    faults(channelId, filterId) {
      return entryOf(channelId, filterId).filter.faults;
    },
    channelIds() {
      return [...channels.keys()];
    },
    filterIds(channelId) {
      return [...channelOf(channelId).entries.keys()];
    },
  };
}
