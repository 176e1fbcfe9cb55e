import { db } from "@/db";
import { releaseLoginAttempt, reserveLoginAttempt } from "@/db/queries/login-throttle";
import { createSession } from "@/db/queries/sessions";
import { findUserByEmail } from "@/db/queries/users";
import { verifyPassword } from "@/lib/auth/password";
import { SESSION_TTL_SECONDS } from "@/lib/auth/session-config";
import { getSession, knownDevice, rememberDevice } from "@/lib/auth/session";
import { attemptKeys, throttlePolicy } from "@/lib/auth/throttle";
import { env } from "@/lib/env";
import { AppError, RetryLater } from "@/lib/errors";
import { clientAddress, handler, parseBody } from "@/lib/http/handler";
import { loginSchema } from "./schema";

// A fixed hash so an unknown e-mail costs the same time as a wrong password.
const DUMMY_HASH = "scrypt$32768$8$1$AAAAAAAAAAAAAAAAAAAAAA==$AAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAA=";

/**
 * Sign-in. The attempt takes its place in the failure counts before the password is checked (so
 * parallel guesses are counted one by one) and waits its turn when a key holding it back must wait
 * (429 with Retry-After); see lib/auth/throttle.ts for whom a stranger's failures can slow down.
 */
export const POST = handler(async (req) => {
  const { email, password } = await parseBody(req, loginSchema);
  const policy = throttlePolicy(env());
  const device = await knownDevice(email);
  const keys = attemptKeys(email, clientAddress(req), device);
  const waitMs = await reserveLoginAttempt(db(), keys, policy);
  if (waitMs > 0) {
    const seconds = Math.ceil(waitMs / 1000);
    throw new RetryLater(`Too many failed sign-ins. Try again in ${seconds} s.`, seconds);
  }
  const user = await findUserByEmail(db(), email);
  const ok = await verifyPassword(password, user?.password_hash ?? DUMMY_HASH);
  if (!user || !ok || user.disabled) throw new AppError("unauthorized", "E-mail or password is not right.");
  await releaseLoginAttempt(db(), keys, policy);
  const session = await getSession();
  session.userId = user.id;
  session.sessionVersion = user.session_version;
  session.sessionId = await createSession(db(), user.id, SESSION_TTL_SECONDS);
  await session.save();
  await rememberDevice(email, device);
  return Response.json({ email: user.email, name: user.display_name, role: user.role });
});
