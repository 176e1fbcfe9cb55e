import { z } from "zod";

/** Every setting Tapwright reads from the environment, parsed once. Defaults are the local demo's. */
const envSchema = z.object({
  DATABASE_URL: z.string().url().default("postgres://postgres@127.0.0.1:5433/tapwright"),
  /** The schema owner's URL, for migrations and the seed; the app itself connects as DATABASE_URL. */
  MIGRATION_DATABASE_URL: z.string().url().optional(),
  SESSION_SECRET: z.string().min(32, "SESSION_SECRET must be at least 32 characters"),
  PORT: z.coerce.number().int().min(1).max(65535).default(3000),
  /** Where people reach the web app (links in mail); default http://127.0.0.1:PORT. */
  APP_URL: z.string().url().optional(),
  SIDECAR_PORT: z.coerce.number().int().min(1).max(65535).default(3001),
  MQTT_PORT: z.coerce.number().int().min(0).max(65535).default(1883),
  MQTT_URL: z.string().url().optional(),
  MQTT_USERNAME: z.string().optional(),
  MQTT_PASSWORD: z.string().optional(),
  SMTP_PORT: z.coerce.number().int().min(1).max(65535).default(2525),
  MAIL_FROM: z.string().default("Tapwright <tapwright@tapwright.test>"),
  DEMO: z.enum(["0", "1"]).default("1"),
  DEMO_PASSWORD: z.string().min(8).default("tapwright-demo"),
  /** 1: the seed also puts the demo's production filter on the supply pressure (`npm start` sets it; tests do not). */
  DEMO_PRODUCTION: z.enum(["0", "1"]).default("0"),
  COOKIE_SECURE: z.enum(["0", "1"]).default("0"),
  /** Proxies whose X-Forwarded-For entries are believed: addresses or CIDR blocks, comma-separated. */
  TRUSTED_PROXIES: z.string().default(""),
  MAX_JSON_BODY_BYTES: z.coerce.number().int().min(1024).max(100_000_000).default(1_000_000),
  LOGIN_FREE_FAILURES: z.coerce.number().int().min(1).max(1000).default(5),
  LOGIN_FREE_FAILURES_PER_ADDRESS: z.coerce.number().int().min(1).max(100_000).default(20),
  LOGIN_DELAY_BASE_MS: z.coerce.number().int().min(1).max(3_600_000).default(1000),
  LOGIN_DELAY_MAX_MS: z.coerce.number().int().min(1).max(86_400_000).default(900_000),
  WS_MESSAGES_PER_SECOND: z.coerce.number().min(0.1).max(10_000).default(20),
  WS_MESSAGE_BURST: z.coerce.number().int().min(1).max(100_000).default(40),
  WS_CONNECTIONS_PER_USER: z.coerce.number().int().min(1).max(1000).default(8),
  /** Candidates whose live metrics a sidecar computes per second (default: the hub's METRICS_PER_SECOND); past it each refreshes less often than once a second. */
  LIVE_METRICS_PER_SECOND: z.coerce.number().int().min(1).max(100_000).optional(),
  REQUIRE_DEVICE_AUTH: z.enum(["0", "1"]).default("1"),
  MQTT_CA_FILE: z.string().optional(),
  /** Set to partition channels across sidecars on one external broker (MQTT_URL): this sidecar's unique key. */
  SIDECAR_ID: z.string().regex(/^[a-z0-9][a-z0-9-]{0,62}$/, "SIDECAR_ID must be a key of a-z, 0-9 and -").optional(),
  /** Where browsers reach this sidecar's WebSocket; default ws://127.0.0.1:SIDECAR_PORT/ws. */
  SIDECAR_WS_URL: z.string().regex(/^wss?:\/\/[^\s]{1,500}$/, "SIDECAR_WS_URL must be a ws:// or wss:// URL").optional(),
  /** For the web app of a partitioned deployment: the sidecars' WebSocket origins, comma-separated (allowed by the pages' CSP). */
  SIDECAR_WS_ORIGINS: z
    .string()
    .default("")
    .transform((s) => s.split(",").map((o) => o.trim()).filter(Boolean))
    .pipe(z.array(z.string().regex(/^wss?:\/\/[a-z0-9.-]+(:\d{1,5})?$/i, "SIDECAR_WS_ORIGINS must list ws:// or wss:// origins (scheme, host, port)"))),
  /** A channel lease lives this long past its last renewal; a silent sidecar's channels move after it. */
  LEASE_TTL_MS: z.coerce.number().int().min(1000).max(60_000).default(5000),
  LEASE_HEARTBEAT_MS: z.coerce.number().int().min(100).max(20_000).default(1000),
  SHARED_GROUP: z.string().regex(/^[a-z0-9][a-z0-9-]{0,62}$/, "SHARED_GROUP must be a key of a-z, 0-9 and -").optional(),
  REPUBLISH_FILTERED: z.enum(["0", "1"]).default("0"),
  DEMO_SEED: z.coerce.number().int().min(0).max(0xffffffff).default(20261201),
  DEPLOY_ACK_TIMEOUT_MS: z.coerce.number().int().min(100).max(600_000).default(10_000),
  DESIGN_THREADS: z.coerce.number().int().min(1).max(16).default(1),
  DESIGN_TIMEOUT_MS: z.coerce.number().int().min(100).max(120_000).default(10_000),
  DESIGN_QUEUE: z.coerce.number().int().min(0).max(1000).default(32),
  DESIGN_PER_USER: z.coerce.number().int().min(1).max(100).default(2),
});

export type Env = z.infer<typeof envSchema>;

/** The web app's public address: APP_URL, or the local web app. */
export function appUrl(e: Env): string {
  return e.APP_URL ?? `http://127.0.0.1:${e.PORT}`;
}

/** The app's own origin (for cross-site checks): APP_URL's, or the loopback address `npm start` serves on. */
export function appOrigin(e: Env): string {
  return new URL(appUrl(e)).origin;
}

/** Whether the session cookie is Secure: served over HTTPS (APP_URL https://…) or COOKIE_SECURE=1. */
export function cookieSecure(e: Env): boolean {
  return e.COOKIE_SECURE === "1" || new URL(appUrl(e)).protocol === "https:";
}

let cached: Env | undefined;

/** The validated environment; throws with every bad variable named. */
export function env(): Env {
  if (!cached) {
    const parsed = envSchema.safeParse(process.env);
    if (!parsed.success) {
      const lines = parsed.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`);
      throw new Error(`Invalid environment:\n${lines.join("\n")}`);
    }
    cached = parsed.data;
  }
  return cached;
}
