/** The closed set of roles, lowest privilege first. */
export const ROLES = ["operator", "engineer", "lead", "admin"] as const;
export type Role = (typeof ROLES)[number];

const RANK: Record<Role, number> = { operator: 0, engineer: 1, lead: 2, admin: 3 };

/** Whether `role` may do what `required` may: admin ⊃ lead ⊃ engineer ⊃ operator. */
export function roleAtLeast(role: Role, required: Role): boolean {
  return RANK[role] >= RANK[required];
}

export function isRole(value: unknown): value is Role {
  return typeof value === "string" && (ROLES as readonly string[]).includes(value);
}
