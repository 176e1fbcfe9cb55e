import { z } from "zod";

export const loginSchema = z.object({
  email: z.string().trim().email("Enter an e-mail address.").max(254),
  password: z.string().min(1, "Enter your password.").max(1024),
});
