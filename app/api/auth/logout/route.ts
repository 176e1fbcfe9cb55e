import { db } from "@/db";
import { revokeSession } from "@/db/queries/sessions";
import { getSession } from "@/lib/auth/session";
import { handler } from "@/lib/http/handler";

/** Ends the session on the server (every copy of its cookie stops working) and clears the cookie. */
export const POST = handler(async () => {
  const session = await getSession();
  if (session.sessionId) await revokeSession(db(), session.sessionId);
  session.destroy();
  return Response.json({ ok: true });
});
