import type { NextConfig } from "next";

const config: NextConfig = {
  poweredByHeader: false,
  reactStrictMode: true,
  devIndicators: false,
  // A separate output folder lets two servers of the same checkout run side by side.
  distDir: process.env.NEXT_DIST_DIR ?? ".next",
};

export default config;
