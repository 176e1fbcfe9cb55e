import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Db } from "@/db/client";
import { parseServerMessage } from "@/lib/protocol";
import type { Sidecar } from "@/server/sidecar";
import { cookieFor, openSocket, seededDb, testSidecar } from "./sidecar-support";

const STRAIN = "hydraulic-press/env-node/frame-strain";

let store: { db: Db; close: () => Promise<void> };
let sidecar: Sidecar;

beforeAll(async () => {
  store = await seededDb("sidecar_production_push");
  sidecar = await testSidecar(store.db);
});
afterAll(async () => {
  await sidecar?.close();
  await store?.close();
});

describe("production-changed", () => {
  it("reaches the connections subscribed to the channel, and only those, as a message of the protocol", async () => {
    const watching = await openSocket(sidecar.httpPort, await cookieFor(store.db, "operator@tapwright.test"));
    const elsewhere = await openSocket(sidecar.httpPort, await cookieFor(store.db, "engineer@tapwright.test"));
    await watching.next("hello");
    await elsewhere.next("hello");
    watching.send({ type: "subscribe", channel: STRAIN });
    // Messages are handled in order: the refusal of the second proves the first was applied.
    watching.send({ type: "subscribe", channel: "no-such/rig/channel" });
    await watching.next("error", (m) => m.code === "unknown_channel");

    const message = { type: "production-changed", channel: STRAIN, revisionId: null } as const;
    sidecar.hub.toSubscribers(STRAIN, message);
    sidecar.hub.statusTick();
    expect(await watching.next("production-changed")).toEqual(message);
    await elsewhere.next("status"); // the one sent on connecting
    await elsewhere.next("status"); // the tick's, sent after the production change
    expect(elsewhere.messages.some((m) => m.type === "production-changed")).toBe(false);
    expect(parseServerMessage(JSON.stringify({ ...message, revisionId: 42 }))).toEqual({ ...message, revisionId: 42 });
    expect(parseServerMessage(JSON.stringify({ ...message, revisionId: "42" }))).toBeNull();
    watching.ws.close();
    elsewhere.ws.close();
  });
});
