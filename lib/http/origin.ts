/** Methods that change state and so must come from the app's own pages (or carry an API token). */
export function changesState(method: string): boolean {
  return !["GET", "HEAD", "OPTIONS"].includes(method.toUpperCase());
}

function hostOf(url: string): string | null {
  try {
    return new URL(url).host;
  } catch {
    return null;
  }
}

/**
 * Why a state-changing request must be refused as cross-site, or null when it is the app's own.
 * The request's `Origin` must name the host it was sent to (its Host header) or the configured
 * app origin (APP_URL). Without Origin, `Sec-Fetch-Site` must say same-origin; without either, the
 * `Referer` must be the app's. With none of them the request is refused: a browser sends at least
 * one, and scripts authenticate with an API token (an Authorization header, which a cross-site page
 * cannot attach without a CORS preflight that Tapwright never grants). With `originRequired` (server
 * actions, which browsers always post with an Origin) only a matching Origin passes.
 */
export function crossSiteRefusal(headers: Headers, appOrigin: string, opts: { originRequired?: boolean } = {}): string | null {
  if (headers.has("authorization") && !opts.originRequired) return null;
  const ownHosts = new Set([headers.get("host"), hostOf(appOrigin)].filter((h): h is string => Boolean(h)));
  const origin = headers.get("origin");
  if (origin !== null) {
    const host = origin === "null" ? null : hostOf(origin);
    return host && ownHosts.has(host) ? null : `requests from ${origin === "null" ? "an opaque origin" : origin} may not change anything here`;
  }
  if (opts.originRequired) return "the request does not say where it comes from (Origin)";
  const site = headers.get("sec-fetch-site");
  if (site !== null) return site === "same-origin" ? null : `a ${site} request may not change anything here`;
  const referer = headers.get("referer");
  if (referer !== null) {
    const host = hostOf(referer);
    return host && ownHosts.has(host) ? null : "a request referred by another site may not change anything here";
  }
  return "the request says neither where it comes from (Origin) nor that it is same-origin (Sec-Fetch-Site)";
}
