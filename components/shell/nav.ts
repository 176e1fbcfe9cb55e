import type { Role } from "@/lib/auth/roles";

/** The main navigation and the least role that sees each entry. */
export const NAV: { href: string; label: string; role: Role }[] = [
  { href: "/", label: "Overview", role: "operator" },
  { href: "/alarms", label: "Alarms", role: "operator" },
  { href: "/sets", label: "Coefficient sets", role: "operator" },
  { href: "/recordings", label: "Recordings", role: "operator" },
  { href: "/reviews", label: "Reviews", role: "lead" },
  { href: "/audit", label: "Audit", role: "lead" },
  { href: "/tokens", label: "API tokens", role: "engineer" },
  { href: "/api-docs", label: "API", role: "operator" },
  { href: "/admin/users", label: "Users", role: "admin" },
  { href: "/admin/mail", label: "Mailbox", role: "admin" },
];
