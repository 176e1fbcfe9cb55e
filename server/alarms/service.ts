import type { Db } from "@/db/client";
import { ALARM_EVENTS_CHANNEL, storeAlarmEvents } from "@/db/queries/alarm-events";
import { ALARM_RULES_CHANNEL } from "@/db/queries/alarm-rules";
import type { Clock, Logger } from "../clock";
import { listenForNotifications, type Listener } from "../deploy/listen";
import type { Pipeline } from "../pipeline/pipeline";
import type { Hub } from "../ws/hub";
import { createAlarmEngine, type AlarmEngine } from "./engine";
import { createEventStore, type EventStore } from "./event-store";
import { errorMessage } from "@/lib/errors";

export interface AlarmService {
  engine: AlarmEngine;
  store: EventStore;
  /** Stops listening and writes what is still buffered, if it can. */
  stop(): Promise<void>;
}

/**
 * Starts alarm evaluation on the live pipeline: the engine runs after the production filter on every
 * accepted batch, events go to PostgreSQL through the buffered store and to every browser through the
 * hub, rule changes (NOTIFY tapwright_alarm_rules) reload the rules, and acknowledgements (NOTIFY
 * tapwright_alarm_events) are pushed to every browser.
 */
export async function startAlarms(deps: {
  db: Db;
  /** Connection string for the LISTEN connections. */
  databaseUrl: string;
  pipeline: Pick<Pipeline, "onSamples" | "productionRevision">;
  hub: Pick<Hub, "broadcast">;
  clock: Clock;
  logger: Logger;
  /** How often buffered events are retried while the database is down (ms). */
  retryMs?: number;
}): Promise<AlarmService> {
  const { clock, logger } = deps;
  const store = createEventStore({ write: (records) => storeAlarmEvents(deps.db, records), clock, logger, retryMs: deps.retryMs });
  const engine = await createAlarmEngine({
    db: deps.db,
    store,
    productionRevision: (path) => deps.pipeline.productionRevision(path),
    broadcast: (message) => deps.hub.broadcast(message),
    clock,
    logger,
  });
  const unsubscribe = deps.pipeline.onSamples((path, batch, production) => engine.evaluate(path, batch, production));
  const warn = (what: string) => (err: unknown) => logger.warn(`alarms: ${what}: ${errorMessage(err)}`);
  const reload = () => void engine.reload().catch(warn("rules not reloaded"));
  const listeners: Listener[] = [
    await listenForNotifications({ databaseUrl: deps.databaseUrl, channel: ALARM_RULES_CHANNEL, onNotify: reload, onReconnect: reload, clock, logger }),
    await listenForNotifications({
      databaseUrl: deps.databaseUrl,
      channel: ALARM_EVENTS_CHANNEL,
      onNotify: (id) => void engine.announce(id).catch(warn(`event ${id} not announced`)),
      onReconnect: () => undefined,
      clock,
      logger,
    }),
  ];
  return {
    engine,
    store,
    async stop() {
      unsubscribe();
      await Promise.all(listeners.map((l) => l.close()));
      await store.close();
    },
  };
}
