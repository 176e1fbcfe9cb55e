/**
 * What can be wrong with an incoming message (samples, or an acknowledgement that did not come from
 * the device that owns its topic: `foreign_ack`). Each kind is counted per channel (or under
 * the topic's path when the channel is unknown) and reported by /health and status messages.
 */
export const FAULT_KINDS = [
  "bad_topic",
  "oversized",
  "bad_json",
  "bad_binary",
  "bad_shape",
  "non_finite",
  "bad_length",
  "unknown_channel",
  "rate_mismatch",
  "seq_gap",
  "handler_error",
  "foreign_ack",
] as const;

export type FaultKind = (typeof FAULT_KINDS)[number];
