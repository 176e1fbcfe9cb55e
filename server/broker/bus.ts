/** Connection state of the sidecar's link to MQTT. */
export type BusState = "connected" | "reconnecting" | "closed";

export type MessageHandler = (topic: string, payload: Buffer) => void;

export interface PublishOptions {
  retain?: boolean;
  qos?: 0 | 1;
}

/**
 * What the sidecar needs of MQTT, whether the broker is embedded (subscribed inside its process)
 * or external (an mqtt.js connection). Handlers are called for every message matching their filter.
 */
export interface MessageBus {
  subscribe(filter: string, handler: MessageHandler): Promise<void>;
  /** Drops every handler of this filter and, for an external broker, the subscription itself. */
  unsubscribe(filter: string): Promise<void>;
  publish(topic: string, payload: Buffer | string, opts?: PublishOptions): Promise<void>;
  readonly state: BusState;
  onState(listener: (state: BusState) => void): void;
  close(): Promise<void>;
}

/** Whether a topic matches a filter (MQTT 3.1.1 §4.7: `+` one level, `#` the rest; `$share/<group>/` stripped, MQTT 5.0 §4.8.2). */
export function topicMatches(filter: string, topic: string): boolean {
  const plain = filter.startsWith("$share/") ? filter.split("/").slice(2).join("/") : filter;
  const f = plain.split("/");
  const t = topic.split("/");
  for (let i = 0; i < f.length; i++) {
    if (f[i] === "#") return true;
    if (i >= t.length) return false;
    if (f[i] !== "+" && f[i] !== t[i]) return false;
  }
  return f.length === t.length;
}
