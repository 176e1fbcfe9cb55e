import type { NextConfig } from "next";

/** Headers on every answer: no MIME sniffing, no framing, no referrer to other sites, no powerful browser features. */
const everywhere = [
  { key: "X-Content-Type-Options", value: "nosniff" },
  { key: "X-Frame-Options", value: "DENY" },
  { key: "Referrer-Policy", value: "same-origin" },
  { key: "Cross-Origin-Opener-Policy", value: "same-origin" },
  { key: "Permissions-Policy", value: "camera=(), microphone=(), geolocation=(), payment=(), usb=()" },
];

const config: NextConfig = {
  poweredByHeader: false,
  reactStrictMode: true,
  devIndicators: false,
  // A separate output folder lets two servers of the same checkout run side by side.
  distDir: process.env.NEXT_DIST_DIR ?? ".next",
  experimental: {
    // Server actions take forms, never files: the same 1 MB as JSON bodies.
    serverActions: { bodySizeLimit: "1mb" },
  },
  async headers() {
    return [
      { source: "/:path*", headers: everywhere },
      // API answers are data: nothing in them may load or run anything, or be framed (pages get theirs from proxy.ts).
      { source: "/api/:path*", headers: [{ key: "Content-Security-Policy", value: "default-src 'none'; frame-ancestors 'none'" }] },
    ];
  },
};

export default config;
