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
