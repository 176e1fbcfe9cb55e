import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Db } from "@/db/client";
import { encodeBinarySamples, samplesTopic, type FrameMessage } from "@/lib/protocol";
import type { Sidecar } from "@/server/sidecar";
import { cookieFor, openSocket, seededDb, testSidecar, until } from "./sidecar-support";
import { unchecked } from "../support/unchecked";

const ACCEL = "gearbox-endurance/vibe-node/housing-accel"; // 5 kHz

let store: { db: Db; close: () => Promise<void> };
let sidecar: Sidecar;

beforeAll(async () => {
  store = await seededDb("sidecar_backpressure");
  sidecar = await testSidecar(store.db, { maxBufferedBytes: 256 * 1024 });
});

afterAll(async () => {
  await sidecar?.close();
  await store?.close();
});

describe("a slow WebSocket client", () => {
  it("loses frames (counted and reported to it) while a fast client gets every frame and ingest never waits", async () => {
    const cookie = await cookieFor(store.db, "operator@tapwright.test");
    const fast = await openSocket(sidecar.httpPort, cookie);
    const slow = await openSocket(sidecar.httpPort, cookie);
    fast.send({ type: "subscribe", channel: ACCEL });
    slow.send({ type: "subscribe", channel: ACCEL });
    await until(() => sidecar.hub.clientCount === 2, 5000, "two clients");
    slow.send({ type: "subscribe", channel: "no/such/channel" });
    fast.send({ type: "subscribe", channel: "no/such/channel" });
    await slow.next("error");
    await fast.next("error");
    // The slow browser stops reading: its socket fills, then the sidecar's send buffer for it grows.
    unchecked<{ _socket: { pause(): void } }>(slow.ws)._socket.pause();

    // Frames are float32 (4 bytes a value): enough rounds to fill the loopback socket buffers well past maxBufferedBytes.
    const rounds = 500;
    const values = Array.from({ length: 5000 }, (_, i) => Math.sin(i / 7) * 12.345678901234);
    const payload = (seq: number) => encodeBinarySamples({ seq, t0: seq * 1000, sampleRateHz: 5000, values });
    for (let seq = 0; seq < rounds; seq++) {
      sidecar.ingest.handle(samplesTopic(ACCEL), payload(seq));
      sidecar.hub.tick();
      await new Promise((r) => setImmediate(r));
    }
    expect(sidecar.ingest.accepted.messages).toBe(rounds);
    const frames = (m: { messages: { type: string; channel?: string }[] }) =>
      m.messages.filter((x): x is FrameMessage => x.type === "frame" && x.channel === ACCEL).length;
    await until(() => frames(fast) === rounds, 10_000, "every frame at the fast client");

    sidecar.hub.statusTick();
    unchecked<{ _socket: { resume(): void } }>(slow.ws)._socket.resume();
    const status = await slow.next("status", (s) => s.droppedFrames > 0);
    expect(status.droppedFrames).toBeGreaterThan(0);
    expect(frames(slow) + status.droppedFrames).toBe(rounds);
    const fastStatus = await fast.next("status");
    expect(fastStatus.droppedFrames).toBe(0);
    fast.ws.close();
    slow.ws.close();
  }, 30_000);
});
