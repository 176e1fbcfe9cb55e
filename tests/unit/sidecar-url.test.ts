import { describe, expect, it } from "vitest";
import { localSidecarWsUrl, sidecarHttpUrl } from "@/lib/protocol";

describe("sidecarHttpUrl", () => {
  it("answers on the host and port a sidecar advertises for its WebSocket, over HTTP or HTTPS to match", () => {
    expect(sidecarHttpUrl("ws://10.0.4.7:3350/ws", "/overview")).toBe("http://10.0.4.7:3350/overview");
    expect(sidecarHttpUrl("wss://live-2.lab.test/ws", "/overview")).toBe("https://live-2.lab.test/overview");
  });

  it("carries a channel path as one escaped query value", () => {
    const url = new URL(sidecarHttpUrl("ws://127.0.0.1:3351/ws", "/recent", { channel: "hydraulic-press/supply-node/supply-pressure" }));
    expect(url.pathname).toBe("/recent");
    expect(url.searchParams.get("channel")).toBe("hydraulic-press/supply-node/supply-pressure");
    expect(url.searchParams.size).toBe(1);
  });

  it("finds the one sidecar on this host from its port, as it advertises itself without SIDECAR_WS_URL", () => {
    expect(localSidecarWsUrl(3001)).toBe("ws://127.0.0.1:3001/ws");
    expect(sidecarHttpUrl(localSidecarWsUrl(3001), "/overview")).toBe("http://127.0.0.1:3001/overview");
  });
});
