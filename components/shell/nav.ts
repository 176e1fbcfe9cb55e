import type { Role } from "@/lib/auth/roles";

/** The main navigation and the least role that sees each entry. */
export const NAV: { href: string; label: string; role: Role }[] = [
  { href: "/", label: "Overview", role: "operator" },
  { href: "/admin/users", label: "Users", role: "admin" },
];
