import type { Db } from "@/db/client";
import { seedDemo } from "@/db/seed";
import type { SessionUser } from "@/lib/auth/guard";
import { requireRole } from "@/lib/auth/guard";
import type { Role } from "@/lib/auth/roles";
import { freshDb } from "./support/fresh-db";

/**
 * Shared set-up of the sets/deploy/mail integration tests: a migrated, seeded database, the demo
 * accounts as session users, and stand-ins for `@/db` and `@/app/_lib/auth` so route handlers and
 * server actions run against this database as whoever `actAs` names (mock them with vi.mock).
 */
export const state: { db: Db | null; user: SessionUser | null } = { db: null, user: null };

export const dbModule = {
  db: (): Db => {
    if (!state.db) throw new Error("test database not ready");
    return state.db;
  },
};

export const authModule = {
  currentUser: async () => state.user,
  requireUser: async (role: Role = "operator") => requireRole(state.user, role),
  requireActionUser: async (role: Role = "operator") => requireRole(state.user, role),
  requirePageUser: async (role: Role = "operator") => requireRole(state.user, role),
};

export type Accounts = Record<Role | "lead2", SessionUser>;

export async function setUpLab(label: string): Promise<{ db: Db; url: string; users: Accounts; close: () => Promise<void> }> {
  const fresh = await freshDb(label);
  await seedDemo(fresh.db, "tapwright-demo");
  await fresh.db
    .insertInto("users")
    .values({ email: "lead2@tapwright.test", display_name: "Second Lead", password_hash: "x", role: "lead" })
    .execute();
  const rows = await fresh.db.selectFrom("users").select(["id", "email", "display_name", "role"]).execute();
  const byEmail = (email: string): SessionUser => {
    const r = rows.find((u) => u.email === email);
    if (!r) throw new Error(`no demo account ${email}`);
    return { id: r.id, email: r.email, name: r.display_name, role: r.role };
  };
  const users: Accounts = {
    operator: byEmail("operator@tapwright.test"),
    engineer: byEmail("engineer@tapwright.test"),
    lead: byEmail("lead@tapwright.test"),
    lead2: byEmail("lead2@tapwright.test"),
    admin: byEmail("admin@tapwright.test"),
  };
  state.db = fresh.db;
  return { ...fresh, users };
}

export function actAs(user: SessionUser | null): void {
  state.user = user;
}

/** A 2nd-order Butterworth low-pass at 100 Hz for a 1 kHz channel. */
export const butterSpec = (cutoffHz = 100, sampleRateHz = 1000) => ({
  kind: "iir" as const,
  family: "butterworth" as const,
  response: "lowpass" as const,
  order: 2,
  cutoffHz,
  sampleRateHz,
});

/** What a browser sends with a fetch from the app's own page. */
export const SAME_ORIGIN = { "sec-fetch-site": "same-origin" } as const;

export function jsonRequest(method: string, url: string, body?: unknown): Request {
  return new Request(`http://test.local${url}`, {
    method,
    headers: { "content-type": "application/json", ...SAME_ORIGIN },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
}

export const params = <T>(value: T) => ({ params: Promise.resolve(value) });

/** Route params of the production route for a channel path. */
export function pathParams(path: string): { rig: string; device: string; channel: string } {
  const [rig, device, channel] = path.split("/");
  return { rig, device, channel };
}
