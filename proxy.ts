import { NextResponse, type NextRequest } from "next/server";
import { appOrigin, env } from "@/lib/env";
import { contentSecurityPolicy, hostName } from "@/lib/http/csp";

/**
 * Pages get a Content-Security-Policy with a fresh nonce (Next reads it from the request's CSP header
 * and puts it on its scripts; the root layout reads x-nonce for its own). Checks of who may do what
 * live in every page, handler and action, not here.
 */
export function proxy(request: NextRequest): NextResponse {
  const e = env();
  const https = new URL(appOrigin(e)).protocol === "https:";
  const nonce = btoa(String.fromCharCode(...crypto.getRandomValues(new Uint8Array(16))));
  const csp = contentSecurityPolicy({ nonce, host: hostName(request.headers.get("host")), sidecarPort: e.SIDECAR_PORT, sidecarOrigins: e.SIDECAR_WS_ORIGINS, https });
  const headers = new Headers(request.headers);
  headers.set("x-nonce", nonce);
  headers.set("content-security-policy", csp);
  const response = NextResponse.next({ request: { headers } });
  response.headers.set("content-security-policy", csp);
  if (https) response.headers.set("strict-transport-security", "max-age=31536000; includeSubDomains");
  return response;
}

export const config = {
  matcher: [
    {
      // Pages only: API answers are JSON or files (next.config.ts gives them their own headers), and
      // server action posts are left alone so their bodies are not copied through the proxy.
      source: "/((?!api/|_next/static|_next/image|favicon.ico).*)",
      missing: [
        { type: "header", key: "next-action" },
        { type: "header", key: "next-router-prefetch" },
        { type: "header", key: "purpose", value: "prefetch" },
      ],
    },
  ],
};
