import { z } from "zod";
import { dbId } from "@/lib/http/fields";

export const createTokenSchema = z.object({
  name: z.string().trim().min(1, "Say what will use the token.").max(80, "Keep the name under 80 characters."),
});

export const revokeTokenSchema = z.object({ tokenId: dbId });
