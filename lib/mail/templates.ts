import { trim } from "@/lib/format/units";
import type { AlarmEventView } from "@/lib/protocol";
import { formatDateTime } from "@/lib/format/date-time";

/** The subject and plain-text body of one notification; recipients are chosen by the caller. */
export interface MailMessage {
  kind: MailKind;
  subject: string;
  body: string;
}

export type MailKind = "review_requested" | "approved" | "rejected" | "promoted" | "failed" | "rolled_back" | "alarm";

/** What every message names: the set, its revision and where to open it. */
export interface RevisionRef {
  setId: number;
  setName: string;
  revision: number;
  channel: string;
}

/** Begins the line that links a message to its page; the path after it is made absolute when the mail is sent. */
export const LINK_PREFIX = "Open it in Tapwright: ";

const title = (r: RevisionRef) => `${r.setName} r${r.revision} (${r.channel})`;
const footer = (r: RevisionRef) => `\n\n${LINK_PREFIX}/sets/${r.setId}\n\n— Tapwright (an engineering aid; this message makes no safety claim)\n`;

/**
 * The body with every app link made absolute against appUrl (e.g. http://127.0.0.1:3000), so a mail
 * client can open it; the stored body keeps the app-relative path, valid wherever the app is served.
 */
export function withAbsoluteLinks(body: string, appUrl: string): string {
  const base = appUrl.replace(/\/+$/, "");
  return body.split("\n").map((line) => (line.startsWith(`${LINK_PREFIX}/`) ? `${LINK_PREFIX}${base}${line.slice(LINK_PREFIX.length)}` : line)).join("\n");
}

export function reviewRequestedMail(r: RevisionRef, by: string, notes: string): MailMessage {
  return {
    kind: "review_requested",
    subject: `Review requested: ${title(r)}`,
    body: `${by} asks for a review of revision ${r.revision} of "${r.setName}" on ${r.channel}.` +
      (notes ? `\n\nAuthor's notes:\n${notes}` : "") + footer(r),
  };
}

export function reviewDecisionMail(r: RevisionRef, decision: "approved" | "rejected", by: string, comment: string): MailMessage {
  return {
    kind: decision,
    subject: `${decision === "approved" ? "Approved" : "Rejected"}: ${title(r)}`,
    body: `${by} ${decision} revision ${r.revision} of "${r.setName}" on ${r.channel}.\n\nComment:\n${comment}` + footer(r),
  };
}

export interface DeploymentRef extends RevisionRef {
  /** The channel the deployment went to (may differ from the set's own channel). */
  target: string;
}

export function deploymentMail(d: DeploymentRef, outcome: "promoted" | "failed" | "rolled_back", detail: string): MailMessage {
  const what = {
    promoted: { head: "Active", line: `is now active on ${d.target}; the device acknowledged it.` },
    failed: { head: "Deployment failed", line: `did not become active on ${d.target}; the previous filter stays active.` },
    rolled_back: { head: "Rolled back", line: `is active again on ${d.target} after a rollback; the device acknowledged it.` },
  }[outcome];
  return {
    kind: outcome,
    subject: `${what.head}: ${title(d)}${d.target === d.channel ? "" : ` → ${d.target}`}`,
    body: `Revision ${d.revision} of "${d.setName}" ${what.line}` + (detail ? `\n\n${detail}` : "") + footer(d),
  };
}

/** A critical alarm, as it was raised. */
export function alarmMail(e: AlarmEventView): MailMessage {
  const signal = e.signal === "filtered" ? "production-filtered signal" : "raw signal";
  return {
    kind: "alarm",
    subject: `Critical alarm: ${e.ruleName} on ${e.channel}`,
    body:
      `The ${signal} of ${e.channel} went ${e.side === "high" ? "above its high" : "below its low"} limit of ${trim(e.limit, 6)} ${e.unit} ` +
      `at ${formatDateTime(e.raisedAt)} (${trim(e.peak, 5)} ${e.unit} when raised).` +
      `\n\nOpen the Alarms page to acknowledge it: /alarms` +
      `\n\n— Tapwright (an engineering aid; this message makes no safety claim. Follow the machine's safety documentation.)\n`,
  };
}
