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

/**
 * A topic filter's matcher (MQTT 3.1.1 §4.7: `+` one level, `#` the rest and its parent level;
 * `$share/<group>/` stripped, MQTT 5.0 §4.8.2). The filter is split once; a topic is walked level by
 * level in place, so matching a message allocates nothing.
 */
export function topicFilter(filter: string): (topic: string) => boolean {
  const plain = filter.startsWith("$share/") ? filter.split("/").slice(2).join("/") : filter;
  const levels = plain.split("/");
  return (topic) => {
    /** Start of the topic level compared next; topic.length + 1 once every level is consumed. */
    let at = 0;
    for (const level of levels) {
      if (level === "#") return true;
      if (at > topic.length) return false;
      const slash = topic.indexOf("/", at);
      const end = slash < 0 ? topic.length : slash;
      if (level !== "+" && (end - at !== level.length || !topic.startsWith(level, at))) return false;
      at = end + 1;
    }
    return at === topic.length + 1;
  };
}
