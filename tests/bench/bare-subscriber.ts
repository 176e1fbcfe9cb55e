/**
 * A bare subscriber for the pipeline bench's floor run: one mqtt.js connection (the library the
 * sidecars' bus uses) subscribed to the given channels' sample topics, counting messages and doing
 * nothing else. Run by pipeline.bench.ts: node --import tsx bare-subscriber.ts <mqtt-url>, then over IPC
 * { type: "subscribe", paths } → "ready"; "mark" notes the count at the window's opening and closing;
 * "report" → { type: "report", messages } received between the two marks.
 */
import mqtt from "mqtt";
import { samplesTopic } from "@/lib/protocol";

type Command = { type: "subscribe"; paths: string[] } | { type: "mark" } | { type: "report" };

const client = await mqtt.connectAsync(process.argv[2], { reconnectPeriod: 0 });
let messages = 0;
const marks: number[] = [];
client.on("message", () => messages++);
process.on("message", (m: Command) => {
  if (m.type === "subscribe") {
    client.subscribeAsync(m.paths.map(samplesTopic), { qos: 0 }).then(
      () => process.send?.({ type: "ready" }),
      (err: unknown) => {
        console.error(err);
        process.exit(1);
      },
    );
  } else if (m.type === "mark") {
    marks.push(messages);
  } else {
    process.send?.({ type: "report", messages: (marks[1] ?? messages) - (marks[0] ?? 0) });
  }
});
process.on("disconnect", () => process.exit(0));
