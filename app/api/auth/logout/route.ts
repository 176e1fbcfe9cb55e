import { getSession } from "@/lib/auth/session";
import { handler } from "@/lib/http/handler";

export const POST = handler(async () => {
  const session = await getSession();
  session.destroy();
  return Response.json({ ok: true });
});
