import { z } from "zod";
import { channelPathSchema } from "@/lib/protocol";
import { TRANSITION_NAMES } from "@/lib/workflow";
import { dbId } from "@/lib/http/fields";

export const transitionSchema = z.object({
  action: z.enum(TRANSITION_NAMES),
  expectedVersion: dbId,
  comment: z.string().trim().max(4000).optional(),
});

export const promoteSchema = z.object({
  channels: z.array(channelPathSchema).min(1, "Choose at least one channel.").max(32),
});
