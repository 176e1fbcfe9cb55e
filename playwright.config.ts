import { defineConfig } from "@playwright/test";

const WEB_PORT = Number(process.env.E2E_WEB_PORT ?? 3100);
const SIDECAR_PORT = Number(process.env.E2E_SIDECAR_PORT ?? 3101);
const MQTT_PORT = Number(process.env.E2E_MQTT_PORT ?? 18831);
const SMTP_PORT = Number(process.env.E2E_SMTP_PORT ?? 25251);
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
      command: `node_modules/.bin/next start -H 127.0.0.1 -p ${WEB_PORT}`,
      url: `http://127.0.0.1:${WEB_PORT}/api/health`,
      reuseExistingServer: false,
      timeout: 120_000,
      env: { DEMO: "1", ...ports },
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
