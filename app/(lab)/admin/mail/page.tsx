import type { Metadata } from "next";
import { requirePageUser } from "@/app/_lib/auth";
import { Mailbox } from "@/components/mail/mailbox";
import { db } from "@/db";
import { listMailbox, outboxBacklog } from "@/db/queries/mail";

export const metadata: Metadata = { title: "Mailbox" };

export default async function MailPage() {
  await requirePageUser("admin");
  const [messages, backlog] = await Promise.all([listMailbox(db()), outboxBacklog(db())]);
  return <Mailbox messages={messages} backlog={backlog} />;
}
