import http from "node:http";

/**
 * The web app's server: Next.js (production build) behind a thin HTTP server that appends the
 * socket's peer address to X-Forwarded-For. Next itself only fills the header when a client did not
 * send one, so without this a client could name any address; with it, the last entry is always
 * the real peer, and lib/http/client-address.ts believes earlier entries only from TRUSTED_PROXIES.
 * Run the production build: `NODE_ENV=production node --import tsx server/run/web.ts` (PORT, HOST).
 */
if (process.env.NODE_ENV !== "production") {
  console.error("server/run/web.ts serves the production build: run it with NODE_ENV=production (npm start does).");
  process.exit(1);
}
const port = Number(process.env.PORT ?? 3000);
const hostname = process.env.HOST ?? "127.0.0.1";
const { default: next } = await import("next");

const app = next({ dev: false, hostname, port });
const handle = app.getRequestHandler();
await app.prepare();
// Start the design threads now (they compile lib/ as they start), not on the first save: the pool is
// kept on globalThis, so the route handlers' workPool() finds this one.
try {
  const { workPool } = await import("@/lib/workers");
  workPool();
} catch (err) {
  console.error("[web] the design threads could not be started; they will be on first use", err);
}

const server = http.createServer((req, res) => {
  const peer = req.socket.remoteAddress;
  const sent = req.headers["x-forwarded-for"];
  const hops = [...(Array.isArray(sent) ? sent : sent ? [sent] : []), ...(peer ? [peer] : [])];
  if (hops.length) req.headers["x-forwarded-for"] = hops.join(", ");
  else delete req.headers["x-forwarded-for"];
  handle(req, res).catch((err: unknown) => {
    console.error("[web] request failed", err);
    if (!res.headersSent) res.writeHead(500, { "content-type": "text/plain; charset=utf-8" });
    res.end("Something went wrong on the server.");
  });
});
server.listen(port, hostname, () => console.log(`web app on http://${hostname}:${port}`));

function stop(): void {
  server.close(() => process.exit(0));
  setTimeout(() => process.exit(0), 5000).unref();
}
process.on("SIGTERM", stop);
process.on("SIGINT", stop);
