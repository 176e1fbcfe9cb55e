import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { currentUser } from "@/app/_lib/auth";
import { SignInForm } from "@/components/auth/sign-in-form";
import { Logo } from "@/components/shell/logo";

export const metadata: Metadata = { title: "Sign in" };

export default async function SignInPage() {
  if (await currentUser()) redirect("/");
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
      </div>
    </main>
  );
}
