import { z } from "zod";
import { ROLES } from "@/lib/auth/roles";
import { dbId } from "@/lib/http/fields";

export const createUserSchema = z.object({
  email: z.string().trim().toLowerCase().email("Enter an e-mail address.").max(254),
  displayName: z.string().trim().min(1, "Enter a display name.").max(80),
  role: z.enum(ROLES, { message: "Choose a role." }),
  password: z.string().min(10, "Use at least 10 characters.").max(1024),
});

export const changeUserSchema = z.object({
  id: dbId,
  role: z.enum(ROLES).optional(),
  disabled: z.enum(["true", "false"]).transform((v) => v === "true").optional(),
  password: z.string().min(10, "Use at least 10 characters.").max(1024).optional(),
});
