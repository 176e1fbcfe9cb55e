import Link from "next/link";
import type { SessionUser } from "@/lib/auth/guard";
import { roleAtLeast } from "@/lib/auth/roles";
import { Logo } from "./logo";
import { NAV } from "./nav";
import { SignOutButton } from "./sign-out-button";
import { ThemeToggle } from "./theme-toggle";

export function AppHeader({ user }: { user: SessionUser }) {
  return (
    <header className="border-b border-slate-200 bg-white/80 backdrop-blur dark:border-slate-800 dark:bg-slate-900/80">
      <div className="mx-auto flex h-14 max-w-screen-2xl items-center gap-6 px-4">
        <Link href="/" aria-label="Tapwright overview">
          <Logo />
        </Link>
        <nav className="flex items-center gap-1 text-sm">
          {NAV.filter((n) => roleAtLeast(user.role, n.role)).map((n) => (
            <Link key={n.href} href={n.href} className="rounded-md px-2.5 py-1.5 text-slate-600 hover:bg-slate-100 hover:text-slate-900 dark:text-slate-300 dark:hover:bg-slate-800 dark:hover:text-white">
              {n.label}
            </Link>
          ))}
        </nav>
        <div className="ml-auto flex items-center gap-3 text-sm">
          <span className="hidden text-right leading-tight sm:block" data-testid="who">
            <span className="block font-medium">{user.name}</span>
            <span className="block text-xs uppercase tracking-wide text-slate-500">{user.role}</span>
          </span>
          <ThemeToggle />
          <SignOutButton />
        </div>
      </div>
    </header>
  );
}
