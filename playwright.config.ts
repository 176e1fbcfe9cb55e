import { defineConfig } from "@playwright/test";

import { WEB_PORT } from "./tests/e2e/pages/origin";

const SIDECAR_PORT = Number(process.env.E2E_SIDECAR_PORT ?? 3101);
const MQTT_PORT = Number(process.env.E2E_MQTT_PORT ?? 18831);
const SMTP_PORT = Number(process.env.E2E_SMTP_PORT ?? 25251);
const LEASE_ORIGINS = [process.env.E2E_LEASE_PORT_A ?? 3310, process.env.E2E_LEASE_PORT_B ?? 3311].map((p) => `ws://127.0.0.1:${p}`).join(",");
const ports = {
  PORT: String(WEB_PORT),
  SIDECAR_PORT: String(SIDECAR_PORT),
  MQTT_PORT: String(MQTT_PORT),
  SMTP_PORT: String(SMTP_PORT),
};

export default defineConfig({
  testDir: "tests/e2e",
  fullyParallel: false,
  workers: 1,
  retries: 0,
  timeout: 60_000,
  use: {
    baseURL: `http://127.0.0.1:${WEB_PORT}`,
    launchOptions: { executablePath: "/usr/bin/chromium" },
    trace: "retain-on-failure",
  },
  webServer: [
    {
      command: "node --import tsx server/run/web.ts",
      url: `http://127.0.0.1:${WEB_PORT}/api/health`,
      reuseExistingServer: false,
      timeout: 120_000,
      // Loopback counts as a proxy here, so tests can play clients at other addresses with X-Forwarded-For;
      // the first sign-in delay is 5 s so a slow machine still sees it before it runs out.
      // The partitioned sidecars of bench-follows.spec.ts may be connected to as well.
      env: {
        DEMO: "1",
        NODE_ENV: "production",
        HOST: "127.0.0.1",
        TRUSTED_PROXIES: "127.0.0.1",
        LOGIN_DELAY_BASE_MS: "5000",
        SIDECAR_WS_ORIGINS: LEASE_ORIGINS,
        ...ports,
      },
    },
    {
      command: "node --import tsx server/mail/fake-smtp-main.ts",
      port: SMTP_PORT,
      reuseExistingServer: false,
      timeout: 60_000,
      env: ports,
    },
    {
      command: "node --import tsx server/main.ts",
      url: `http://127.0.0.1:${SIDECAR_PORT}/health`,
      reuseExistingServer: false,
      timeout: 60_000,
      env: { DEMO: "1", ...ports },
    },
  ],
});
