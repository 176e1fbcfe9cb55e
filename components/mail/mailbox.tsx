import { formatDateTime } from "@/lib/format/date-time";

interface Message {
  id: string;
  receivedAt: Date;
  from: string;
  to: string[];
  subject: string;
  body: string;
}

interface Pending {
  id: string;
  subject: string;
  recipients: string[];
  attempts: number;
  nextAttemptAt: Date;
  lastError: string | null;
}


/** The development mailbox (what the SMTP fake received) and what still waits in the outbox. */
export function Mailbox({ messages, backlog }: { messages: Message[]; backlog: Pending[] }) {
  return (
    <div className="space-y-6">
      <section className="card">
        <header className="border-b border-slate-200 px-4 py-3 dark:border-slate-800">
          <h1 className="text-lg font-semibold">Mailbox</h1>
          <p className="text-sm text-slate-500">Messages received by the local SMTP fake, newest first. Nothing here left this machine.</p>
        </header>
        {messages.length === 0 && <p className="px-4 py-6 text-sm text-slate-500">No mail yet. Submitting a revision for review sends the first message to the leads.</p>}
        <ul className="divide-y divide-slate-100 dark:divide-slate-800">
          {messages.map((m) => (
            <li key={m.id} data-testid="mail-message">
              <details className="px-4 py-2">
                <summary className="cursor-pointer">
                  <span className="font-medium">{m.subject}</span>
                  <span className="ml-2 text-xs text-slate-500">to {m.to.join(", ")} · <span className="num">{formatDateTime(m.receivedAt)}</span></span>
                </summary>
                <pre className="num mt-2 whitespace-pre-wrap text-xs">{m.body}</pre>
                <p className="mt-1 text-xs text-slate-500">From {m.from}</p>
              </details>
            </li>
          ))}
        </ul>
      </section>
      <section className="card">
        <h2 className="border-b border-slate-200 px-4 py-3 font-semibold dark:border-slate-800">Outbox: not yet delivered</h2>
        {backlog.length === 0 ? (
          <p className="px-4 py-4 text-sm text-slate-500">Everything has been delivered.</p>
        ) : (
          <table className="w-full text-sm">
            <thead className="text-left text-xs uppercase tracking-wide text-slate-500">
              <tr><th className="px-4 py-2">Subject</th><th className="px-2">To</th><th className="px-2">Attempts</th><th className="px-2">Next attempt</th><th className="px-2">Last error</th></tr>
            </thead>
            <tbody>
              {backlog.map((m) => (
                <tr key={m.id} className="border-t border-slate-100 dark:border-slate-800">
                  <td className="px-4 py-1.5">{m.subject}</td>
                  <td className="px-2 text-xs">{m.recipients.join(", ")}</td>
                  <td className="num px-2">{m.attempts}</td>
                  <td className="num px-2 text-xs">{formatDateTime(m.nextAttemptAt)}</td>
                  <td className="px-2 text-xs text-fault">{m.lastError}</td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </section>
    </div>
  );
}
