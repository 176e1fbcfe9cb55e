import http from "node:http";
import type { Duplex } from "node:stream";
import { encodeSamples } from "@/lib/recordings/samples";

/**
 * HTTP side of the sidecar: GET /health and GET /overview as JSON, GET /recent?channel=<path> (the
 * raw samples the sidecar holds, float64 little-endian with the rate in x-sample-rate-hz),
 * WebSocket upgrades handed on, everything else 404. /overview and /recent are lab-wide (nothing per
 * user) and meant for the web app's server, which reaches them on loopback; the browser never calls
 * the sidecar over HTTP.
 */
export function createHttpServer(deps: {
  health: () => { status: "ok" | "degraded" } & Record<string, unknown>;
  overview: () => object;
  recent?: (path: string) => { sampleRateHz: number; values: Float64Array } | null;
  upgrade: (req: http.IncomingMessage, socket: Duplex, head: Buffer) => void;
}): http.Server {
  const server = http.createServer((req, res) => {
    const url = new URL(req.url ?? "/", "http://sidecar.local");
    const recent = req.method === "GET" && url.pathname === "/recent" && deps.recent ? deps.recent(url.searchParams.get("channel") ?? "") : undefined;
    if (recent) {
      const bytes = encodeSamples(recent.values);
      res.writeHead(200, { "content-type": "application/octet-stream", "x-sample-rate-hz": String(recent.sampleRateHz), "cache-control": "no-store" });
      res.end(bytes);
      return;
    }
    if (req.method === "GET" && req.url === "/health") {
      const body = deps.health();
      res.writeHead(body.status === "ok" ? 200 : 503, { "content-type": "application/json", "cache-control": "no-store" });
      res.end(JSON.stringify(body));
      return;
    }
    if (req.method === "GET" && req.url === "/overview") {
      res.writeHead(200, { "content-type": "application/json", "cache-control": "no-store" });
      res.end(JSON.stringify(deps.overview()));
      return;
    }
    res.writeHead(404, { "content-type": "application/json" });
    res.end(JSON.stringify({ error: { code: "not_found", message: "No such route." } }));
  });
  server.on("upgrade", deps.upgrade);
  return server;
}

export function listen(server: http.Server, port: number, host: string): Promise<number> {
  return new Promise((resolve, reject) => {
    server.once("error", reject);
    server.listen(port, host, () => {
      const a = server.address();
      resolve(typeof a === "object" && a ? a.port : port);
    });
  });
}
