import { supervise } from "./supervisor";
import { errorMessage } from "@/lib/errors";
import { SIDECAR_NODE_FLAGS } from "./sidecar-flags";

/**
 * `npm start`'s process keeper: the web app, the mail catcher and the sidecar, each restarted with a
 * back-off when it dies; Ctrl-C (SIGINT) or SIGTERM stops all three.
 */
const port = process.env.PORT ?? "3000";
const tsx = ["--import", "tsx"];
const supervisor = supervise([
  // The web app behind server/run/web.ts, which gives the app the socket's real peer address.
  { name: "web", command: process.execPath, args: [...tsx, "server/run/web.ts"], env: { NODE_ENV: "production", HOST: "127.0.0.1", PORT: port } },
  { name: "mail", command: process.execPath, args: [...tsx, "server/mail/fake-smtp-main.ts"] },
  { name: "sidecar", command: process.execPath, args: [...SIDECAR_NODE_FLAGS, ...tsx, "server/main.ts"] },
]);

let stopping = false;
function stopAll(signal: string): void {
  if (stopping) return;
  stopping = true;
  console.log(`[supervisor] ${signal}: stopping the web app, the mail catcher and the sidecar`);
  supervisor.stop().then(
    () => process.exit(0),
    (err: unknown) => {
      console.error(`[supervisor] stop failed: ${errorMessage(err)}`);
      process.exit(1);
    },
  );
}
process.on("SIGINT", () => stopAll("SIGINT"));
process.on("SIGTERM", () => stopAll("SIGTERM"));
