/** What the pages' Content-Security-Policy depends on, per request. */
export interface CspInput {
  /** A fresh random nonce (base64) for this response's scripts and styles. */
  nonce: string;
  /** Host name the browser used for the page (the sidecar's WebSocket is on the same host). */
  host: string | null;
  sidecarPort: number;
  /** Partitioned sidecars' WebSocket origins (SIDECAR_WS_ORIGINS), each allowed beside the page's own sidecar. */
  sidecarOrigins?: readonly string[];
  /** The app is served over HTTPS: the WebSocket is wss:, and plain http: subresources are upgraded. */
  https: boolean;
}

const HOST_NAME = /^(?:[a-z0-9.-]+|\[[0-9a-f:.]+\])$/i;

/**
 * The pages' policy: scripts and styles only from the app itself with this response's nonce (Next
 * puts it on its own scripts; 'strict-dynamic' lets them load their chunks); style attributes are
 * allowed (React renders inline style props, which cannot carry a nonce; they cannot run script);
 * no eval, so the DSP engine runs its generic loops in the browser; connections to the app and to
 * the sidecar's WebSocket; no plugins, no <base>, forms only to the app, and no framing at all.
 */
export function contentSecurityPolicy({ nonce, host, sidecarPort, sidecarOrigins = [], https }: CspInput): string {
  const own = host && HOST_NAME.test(host) ? ` ${https ? "wss" : "ws"}://${host}:${sidecarPort}` : "";
  const ws = own + sidecarOrigins.map((o) => ` ${o}`).join("");
  return [
    "default-src 'self'",
    `script-src 'self' 'nonce-${nonce}' 'strict-dynamic'`,
    `style-src 'self' 'nonce-${nonce}'`,
    "style-src-attr 'unsafe-inline'",
    "img-src 'self' data: blob:",
    "font-src 'self'",
    `connect-src 'self'${ws}`,
    "object-src 'none'",
    "base-uri 'none'",
    "form-action 'self'",
    "frame-ancestors 'none'",
    ...(https ? ["upgrade-insecure-requests"] : []),
  ].join("; ");
}

/** The host name of a Host header value (without its port). */
export function hostName(hostHeader: string | null): string | null {
  if (!hostHeader) return null;
  const bracketed = /^(\[[^\]]+\])(?::\d+)?$/.exec(hostHeader);
  if (bracketed) return bracketed[1];
  return hostHeader.replace(/:\d+$/, "");
}
