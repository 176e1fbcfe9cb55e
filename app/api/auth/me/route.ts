import { requireUser } from "@/app/_lib/auth";
import { handler } from "@/lib/http/handler";

export const GET = handler(async () => {
  const user = await requireUser();
  return Response.json({ email: user.email, name: user.name, role: user.role });
});
