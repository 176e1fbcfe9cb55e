import { deviceStatusSchema, parseTopic, STATUS_FILTER } from "@/lib/protocol";
import type { MessageBus } from "../broker/bus";
import type { Logger } from "../clock";

export interface DeviceStatusTracker {
  /** true online, false offline, null when the device has not said (or its retained status was cleared). */
  online(rig: string, device: string): boolean | null;
}

/**
 * Follows every device's retained status topic: `{"state":"online"}` when it connects, the offline
 * form as its last will (MQTT 3.1.1 §3.1.2.5) or on a clean stop. An empty retained payload clears
 * the status (MQTT 3.1.1 §3.3.1.3), so the device goes back to unknown. Malformed statuses are
 * ignored and logged once per device.
 */
export async function trackDeviceStatus(deps: { bus: MessageBus; logger: Logger }): Promise<DeviceStatusTracker> {
  const states = new Map<string, boolean>();
  const warned = new Set<string>();
  await deps.bus.subscribe(STATUS_FILTER, (topic, payload) => {
    const parsed = parseTopic(topic);
    if (!parsed || parsed.kind !== "status") return;
    const key = `${parsed.rig}/${parsed.device}`;
    if (payload.byteLength === 0) {
      states.delete(key);
      return;
    }
    let json: unknown;
    try {
      json = JSON.parse(payload.toString("utf8"));
    } catch {
      json = undefined;
    }
    const status = deviceStatusSchema.safeParse(json);
    if (!status.success) {
      if (!warned.has(key)) deps.logger.warn(`device ${key}: status payload is not {"state":"online"|"offline"}; ignored`);
      warned.add(key);
      return;
    }
    states.set(key, status.data.state === "online");
  });
  return { online: (rig, device) => states.get(`${rig}/${device}`) ?? null };
}
