import { db } from "@/db";
import { clearLoginFailures, countLoginFailures, findUserByEmail, recordLoginFailure } from "@/db/queries/users";
import { verifyPassword } from "@/lib/auth/password";
import { getSession } from "@/lib/auth/session";
import { THROTTLE, isThrottled } from "@/lib/auth/throttle";
import { AppError } from "@/lib/errors";
import { clientAddress, handler, parseBody } from "@/lib/http/handler";
import { loginSchema } from "./schema";

// A fixed hash so an unknown e-mail costs the same time as a wrong password.
const DUMMY_HASH = "scrypt$32768$8$1$AAAAAAAAAAAAAAAAAAAAAA==$AAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAA=";

export const POST = handler(async (req) => {
  const { email, password } = await parseBody(req, loginSchema);
  const address = clientAddress(req);
  if (isThrottled(await countLoginFailures(db(), email, address, THROTTLE.windowMs))) {
    throw new AppError("too_many_requests", "Too many failed sign-ins. Wait a few minutes and try again.");
  }
  const user = await findUserByEmail(db(), email);
  const ok = await verifyPassword(password, user?.password_hash ?? DUMMY_HASH);
  if (!user || !ok || user.disabled) {
    await recordLoginFailure(db(), email, address);
    throw new AppError("unauthorized", "E-mail or password is not right.");
  }
  await clearLoginFailures(db(), email);
  const session = await getSession();
  session.userId = user.id;
  session.sessionVersion = user.session_version;
  await session.save();
  return Response.json({ email: user.email, name: user.display_name, role: user.role });
});
