import type { ReactNode } from "react";
import { requirePageUser } from "@/app/_lib/auth";
import { QueryProvider } from "@/components/providers/query-provider";
import { AppHeader } from "@/components/shell/app-header";

export default async function LabLayout({ children }: { children: ReactNode }) {
  const user = await requirePageUser();
  return (
    <>
      <AppHeader user={user} />
      <main className="mx-auto max-w-screen-2xl px-4 py-6">
        <QueryProvider>{children}</QueryProvider>
      </main>
    </>
  );
}
