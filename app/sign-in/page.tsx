import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { currentUser } from "@/app/_lib/auth";
import { db } from "@/db";
import { ping } from "@/db/queries/health";
import { SignInForm } from "@/components/auth/sign-in-form";
import { DatabaseDown } from "@/components/shell/database-down";
import { Logo } from "@/components/shell/logo";
import { DEMO_ACCOUNTS } from "@/lib/demo/lab";
import { env } from "@/lib/env";
import { isDatabaseDown } from "@/lib/errors";

export const metadata: Metadata = { title: "Sign in" };

export default async function SignInPage() {
  let signedIn;
  try {
    signedIn = await currentUser();
    // Without a session nothing above needed the database; signing in will, so say now when it is down.
    if (!signedIn) await ping(db());
  } catch (err) {
    if (!isDatabaseDown(err)) throw err;
    console.error("[sign-in] the database cannot be reached", err);
    return <DatabaseDown />;
  }
  if (signedIn) redirect("/");
  return (
    <main className="grid min-h-screen place-items-center px-4">
      <div className="w-full max-w-sm">
        <div className="mb-6 flex flex-col items-center gap-2 text-lg">
          <Logo />
          <p className="text-sm text-slate-500">Filters for live sensor streams</p>
        </div>
        <div className="card p-6">
          <SignInForm />
        </div>
        {env().DEMO === "1" && (
          <aside className="mt-4 text-xs text-slate-500" aria-label="Demo accounts">
            <p>Demo lab accounts, one per role ({DEMO_ACCOUNTS.map((a) => a.role).join(", ")}):</p>
            <p className="num mt-1">{DEMO_ACCOUNTS.map((a) => a.email).join(" · ")}</p>
            <p className="mt-1">The password is set by DEMO_PASSWORD and printed by npm start.</p>
          </aside>
        )}
      </div>
    </main>
  );
}
