import { randomUUID } from "node:crypto";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import pg from "pg";
import { ALARM_EVENTS_CHANNEL, storeAlarmEvents, type AlarmEventRecord } from "@/db/queries/alarm-events";
import { actAs, jsonRequest, params, setUpLab, type Accounts } from "./sets-fixture";

vi.mock("@/db", async () => (await import("./sets-fixture")).dbModule);
vi.mock("@/app/_lib/auth", async () => (await import("./sets-fixture")).authModule);

const rulesRoute = await import("@/app/api/v1/alarm-rules/route");
const ruleRoute = await import("@/app/api/v1/alarm-rules/[id]/route");
const eventsRoute = await import("@/app/api/v1/alarm-events/route");
const ackRoute = await import("@/app/api/v1/alarm-events/[id]/acknowledge/route");
const notesRoute = await import("@/app/api/v1/annotations/route");
const noteRoute = await import("@/app/api/v1/annotations/[id]/route");

let lab: Awaited<ReturnType<typeof setUpLab>>;
let users: Accounts;
const CHANNEL = "hydraulic-press/press-ctl/line-pressure";

beforeAll(async () => {
  lab = await setUpLab("alarms_api");
  users = lab.users;
});
afterAll(() => lab.close());

const none = undefined as never;
const createRule = (body: unknown) => rulesRoute.POST(jsonRequest("POST", "/api/v1/alarm-rules", body), none);
const patchRule = (id: number, body: unknown) => ruleRoute.PATCH(jsonRequest("PATCH", `/api/v1/alarm-rules/${id}`, body), params({ id: String(id) }));
const deleteRule = (id: number) => ruleRoute.DELETE(jsonRequest("DELETE", `/api/v1/alarm-rules/${id}`), params({ id: String(id) }));
const listRules = (q = "") => rulesRoute.GET(jsonRequest("GET", `/api/v1/alarm-rules${q}`), none);
const listEvents = (q = "") => eventsRoute.GET(jsonRequest("GET", `/api/v1/alarm-events${q}`), none);
const acknowledge = (id: string, body: unknown) => ackRoute.POST(jsonRequest("POST", `/api/v1/alarm-events/${id}/acknowledge`, body), params({ id }));
const addNote = (body: unknown) => notesRoute.POST(jsonRequest("POST", "/api/v1/annotations", body), none);
const listNotes = (q = "") => notesRoute.GET(jsonRequest("GET", `/api/v1/annotations${q}`), none);
const deleteNote = (id: number) => noteRoute.DELETE(jsonRequest("DELETE", `/api/v1/annotations/${id}`), params({ id: String(id) }));

const pressureHigh = { channel: CHANNEL, name: "Line pressure high", signal: "filtered", high: 240, deadband: 10, minDurationMs: 200, severity: "critical" };

async function auditActions(entity: string): Promise<string[]> {
  const rows = await lab.db.selectFrom("audit_log").select("action").where("entity", "=", entity).orderBy("id").execute();
  return rows.map((r) => r.action);
}

describe("alarm rules API", () => {
  it("lets engineers and leads create, edit, disable and delete rules, each change audited", async () => {
    actAs(users.engineer);
    const created = await createRule(pressureHigh);
    expect(created.status).toBe(201);
    const rule = await created.json();
    expect(rule).toMatchObject({ channel: CHANNEL, unit: "bar", name: "Line pressure high", high: 240, low: null, enabled: true, createdBy: "Demo Engineer" });

    actAs(users.lead);
    const edited = await patchRule(rule.id, { low: 20, severity: "warning" });
    expect(edited.status).toBe(200);
    expect(await edited.json()).toMatchObject({ high: 240, low: 20, severity: "warning" });
    expect((await (await patchRule(rule.id, { enabled: false })).json()).enabled).toBe(false);

    actAs(users.operator);
    const listed = await (await listRules(`?channel=${CHANNEL}`)).json();
    expect(listed.map((r: { id: number }) => r.id)).toEqual([rule.id]);

    actAs(users.engineer);
    expect((await deleteRule(rule.id)).status).toBe(204);
    expect((await deleteRule(rule.id)).status).toBe(404);
    expect(await (await listRules(`?channel=${CHANNEL}`)).json()).toEqual([]);
    expect(await auditActions("alarm_rule")).toEqual(["alarm_rule.create", "alarm_rule.update", "alarm_rule.update", "alarm_rule.delete"]);
  });

  it("refuses operators (403) and visitors (401) and stores nothing", async () => {
    actAs(users.operator);
    const refused = await createRule(pressureHigh);
    expect(refused.status).toBe(403);
    expect((await refused.json()).error.code).toBe("forbidden");
    actAs(null);
    expect((await createRule(pressureHigh)).status).toBe(401);
    expect((await listRules()).status).toBe(401);
    actAs(users.operator);
    expect(await (await listRules(`?channel=${CHANNEL}`)).json()).toEqual([]);
  });

  it("answers bad input with the fields at fault", async () => {
    actAs(users.engineer);
    const cases: Array<[unknown, string]> = [
      [{ ...pressureHigh, high: undefined }, "high"],
      [{ ...pressureHigh, low: 300 }, "low"],
      [{ ...pressureHigh, low: 235 }, "deadband"],
      [{ ...pressureHigh, minDurationMs: -1 }, "minDurationMs"],
      [{ ...pressureHigh, severity: "urgent" }, "severity"],
      [{ ...pressureHigh, signal: "both" }, "signal"],
      [{ ...pressureHigh, channel: "no/such" }, "channel"],
      [{ ...pressureHigh, extra: 1 }, ""],
    ];
    for (const [body, path] of cases) {
      const res = await createRule(body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      const error = (await res.json()).error;
      expect(error.code).toBe("bad_request");
      expect(error.details.map((d: { path: string }) => d.path)).toContain(path);
    }
    const unknown = await createRule({ ...pressureHigh, channel: "no-rig/no-device/no-channel" });
    expect(unknown.status).toBe(404);
    const rule = await (await createRule(pressureHigh)).json();
    const crossed = await patchRule(rule.id, { low: 239 });
    expect(crossed.status).toBe(400);
    expect((await crossed.json()).error.details[0].path).toBe("deadband");
    expect((await patchRule(rule.id, {})).status).toBe(400);
    expect((await deleteRule(rule.id)).status).toBe(204);
  });

  it("holds a channel to its rule limit", async () => {
    actAs(users.engineer);
    const channel = "hydraulic-press/env-node/ambient-temp";
    for (let i = 0; i < 20; i++) expect((await createRule({ ...pressureHigh, channel, name: `r${i}` })).status).toBe(201);
    const over = await createRule({ ...pressureHigh, channel, name: "one too many" });
    expect(over.status).toBe(409);
  });
});

describe("alarm events API", () => {
  let ruleId: number;
  const record = (over: Partial<AlarmEventRecord> = {}): AlarmEventRecord => ({
    id: randomUUID(),
    ruleId,
    kind: "limit",
    severity: "critical",
    signal: "filtered",
    side: "high",
    limit: 240,
    state: "raised",
    raisedAt: Date.parse("2026-12-03T10:00:00Z"),
    clearedAt: null,
    peak: 251.5,
    revisionId: null,
    ...over,
  });

  beforeAll(async () => {
    actAs(users.engineer);
    ruleId = (await (await createRule({ ...pressureHigh, name: "Events rule" })).json()).id;
  });

  it("stores a raised event once, moves it to cleared, and mails a critical one once", async () => {
    const raised = record();
    await storeAlarmEvents(lab.db, [raised]);
    await storeAlarmEvents(lab.db, [raised]);
    await storeAlarmEvents(lab.db, [{ ...raised, state: "cleared", clearedAt: raised.raisedAt + 4000, peak: 262 }]);
    await storeAlarmEvents(lab.db, [raised]); // a late, older copy never reopens it
    actAs(users.operator);
    const [event] = await (await listEvents(`?channel=${CHANNEL}&state=cleared`)).json();
    expect(event).toMatchObject({ id: raised.id, state: "cleared", peak: 262, clearedAt: "2026-12-03T10:00:04.000Z", ruleName: "Events rule", unit: "bar", acknowledgedAt: null });
    const mail = await lab.db.selectFrom("mail_outbox").select(["kind", "subject", "body", "recipients"]).where("kind", "=", "alarm").execute();
    expect(mail).toHaveLength(1);
    expect(mail[0].subject).toBe(`Critical alarm: Events rule on ${CHANNEL}`);
    expect(mail[0].body).toContain("above its high limit of 240 bar at 2026-12-03 10:00:00 UTC (251.5 bar when raised)");
    expect(mail[0].recipients).toContain("operator@tapwright.test");
  });

  it("tells every sidecar of each event it stores (NOTIFY with the id), so partitioned sidecars all push it", async () => {
    const listener = new pg.Client({ connectionString: lab.url });
    await listener.connect();
    const heard: string[] = [];
    listener.on("notification", (n) => n.channel === ALARM_EVENTS_CHANNEL && n.payload && heard.push(n.payload));
    await listener.query(`LISTEN ${ALARM_EVENTS_CHANNEL}`);
    try {
      const raised = record({ severity: "warning" });
      await storeAlarmEvents(lab.db, [raised]);
      await vi.waitFor(() => expect(heard).toContain(raised.id), { timeout: 5000 });
      const before = heard.length;
      await storeAlarmEvents(lab.db, [{ ...raised, state: "cleared", clearedAt: raised.raisedAt + 1000 }]);
      await vi.waitFor(() => expect(heard.length).toBe(before + 1), { timeout: 5000 });
      expect(heard.at(-1)).toBe(raised.id);
    } finally {
      await listener.end();
    }
  });

  it("lets an operator acknowledge with a comment, once, audited", async () => {
    const raised = record({ severity: "warning" });
    await storeAlarmEvents(lab.db, [raised]);
    actAs(users.operator);
    const open = await (await listEvents("?state=open")).json();
    expect(open.map((e: { id: string }) => e.id)).toContain(raised.id);
    expect((await acknowledge(raised.id, { comment: "  " })).status).toBe(400);
    const ok = await acknowledge(raised.id, { comment: "Relief valve checked; pump restarted." });
    expect(ok.status).toBe(200);
    expect(await ok.json()).toMatchObject({ acknowledgedBy: "Demo Operator", comment: "Relief valve checked; pump restarted.", state: "raised" });
    const again = await acknowledge(raised.id, { comment: "me too" });
    expect(again.status).toBe(409);
    expect((await acknowledge(randomUUID(), { comment: "x" })).status).toBe(404);
    expect((await acknowledge("17", { comment: "x" })).status).toBe(400);
    actAs(null);
    expect((await acknowledge(raised.id, { comment: "x" })).status).toBe(401);
    expect(await auditActions("alarm_event")).toEqual(["alarm_event.acknowledge"]);
    // Raised but acknowledged: still open until it clears.
    actAs(users.operator);
    expect((await (await listEvents("?state=open")).json()).map((e: { id: string }) => e.id)).toContain(raised.id);
  });

  it("filters by rig, severity, kind, state and time", async () => {
    const masked = record({ kind: "masked", severity: "advisory", raisedAt: Date.parse("2026-12-03T11:00:00Z"), state: "cleared", clearedAt: Date.parse("2026-12-03T11:00:00.004Z"), peak: 300 });
    await storeAlarmEvents(lab.db, [masked]);
    actAs(users.operator);
    const ids = async (q: string) => (await (await listEvents(q)).json()).map((e: { id: string }) => e.id);
    expect(await ids("?kind=masked")).toEqual([masked.id]);
    expect(await ids("?severity=advisory&rig=hydraulic-press")).toEqual([masked.id]);
    expect(await ids("?rig=gearbox-endurance")).toEqual([]);
    expect(await ids("?from=2026-12-03T10:30:00Z&to=2026-12-03T12:00:00Z")).toEqual([masked.id]);
    expect((await listEvents("?state=burning")).status).toBe(400);
    expect((await listEvents("?from=2026-12-03T12:00:00Z&to=2026-12-03T10:00:00Z")).status).toBe(400);
    expect((await listEvents("?limit=100000")).status).toBe(400);
  });
});

describe("annotations API", () => {
  const at = "2026-12-03T09:15:00.000Z";

  it("lets anyone signed in annotate a moment or a span, lists them on the channel and finds them by words", async () => {
    actAs(users.operator);
    const moment = await addNote({ channel: CHANNEL, at, text: "Swapped the pressure transducer (serial 4471)" });
    expect(moment.status).toBe(201);
    expect(await moment.json()).toMatchObject({ channel: CHANNEL, at, endAt: null, authorName: "Demo Operator" });
    actAs(users.engineer);
    const span = await addNote({ channel: CHANNEL, at: "2026-12-03T09:20:00Z", endAt: "2026-12-03T09:25:00Z", text: "Test step 3: relief valve at 250 bar" });
    expect(span.status).toBe(201);
    const listed = await (await listNotes(`?channel=${CHANNEL}`)).json();
    expect(listed.map((n: { text: string }) => n.text)).toEqual(["Test step 3: relief valve at 250 bar", "Swapped the pressure transducer (serial 4471)"]);
    expect((await (await listNotes("?q=TRANSDUCER swapped")).json()).map((n: { at: string }) => n.at)).toEqual([at]);
    expect(await (await listNotes("?q=100%")).json()).toEqual([]);
    const inWindow = await (await listNotes(`?channel=${CHANNEL}&from=2026-12-03T09:22:00Z&to=2026-12-03T09:30:00Z`)).json();
    expect(inWindow.map((n: { text: string }) => n.text)).toEqual(["Test step 3: relief valve at 250 bar"]);
  });

  it("refuses bad input and lets only the author or a lead delete", async () => {
    actAs(users.operator);
    expect((await addNote({ channel: CHANNEL, at, text: "" })).status).toBe(400);
    expect((await addNote({ channel: CHANNEL, at: "yesterday", text: "x" })).status).toBe(400);
    expect((await addNote({ channel: CHANNEL, at, endAt: at, text: "x" })).status).toBe(400);
    expect((await addNote({ channel: CHANNEL, at, text: "x".repeat(501) })).status).toBe(400);
    const note = await (await addNote({ channel: CHANNEL, at, text: "Operator's note" })).json();
    actAs(users.engineer);
    expect((await deleteNote(note.id)).status).toBe(403);
    actAs(users.operator);
    expect((await deleteNote(note.id)).status).toBe(204);
    const other = await (await addNote({ channel: CHANNEL, at, text: "Another" })).json();
    actAs(users.lead);
    expect((await deleteNote(other.id)).status).toBe(204);
    expect((await deleteNote(other.id)).status).toBe(404);
    expect(await auditActions("annotation")).toEqual(expect.arrayContaining(["annotation.create", "annotation.delete"]));
    actAs(null);
    expect((await listNotes()).status).toBe(401);
  });
});
