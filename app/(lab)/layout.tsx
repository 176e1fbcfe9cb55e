import type { ReactNode } from "react";
import { requirePageUser } from "@/app/_lib/auth";
import { QueryProvider } from "@/components/providers/query-provider";
import { AppHeader } from "@/components/shell/app-header";
import { DatabaseDown } from "@/components/shell/database-down";
import { isDatabaseDown } from "@/lib/errors";

/** The signed-in pages; while the database is down they show the app's own plain page instead. */
export default async function LabLayout({ children }: { children: ReactNode }) {
  let user;
  try {
    user = await requirePageUser();
  } catch (err) {
    if (!isDatabaseDown(err)) throw err;
    console.error("[pages] the database cannot be reached", err);
    return <DatabaseDown />;
  }
  return (
    <>
      <AppHeader user={user} />
      <main className="mx-auto max-w-screen-2xl px-4 py-6">
        <QueryProvider>{children}</QueryProvider>
      </main>
    </>
  );
}
