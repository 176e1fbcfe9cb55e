/** The WebSocket URL of the sidecar on this host at `port`: what a sidecar advertises when SIDECAR_WS_URL is not set, and where the web app finds the one sidecar. */
export function localSidecarWsUrl(port: number): string {
  return `ws://127.0.0.1:${port}/ws`;
}

/**
 * The HTTP address of a sidecar endpoint (/overview, /recent) beside the WebSocket URL the sidecar
 * advertises in its lease (ws → http, wss → https, same host and port), with the query given.
 */
export function sidecarHttpUrl(wsUrl: string, pathname: "/overview" | "/recent", query: Record<string, string> = {}): string {
  const url = new URL(wsUrl);
  url.protocol = url.protocol === "wss:" ? "https:" : "http:";
  url.pathname = pathname;
  url.search = new URLSearchParams(query).toString();
  return url.toString();
}
