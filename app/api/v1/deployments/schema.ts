import { z } from "zod";
import { channelPathSchema } from "@/lib/protocol";

export const rollbackSchema = z.object({ channel: channelPathSchema, expectedActiveId: z.coerce.number().int().positive() });
export const listDeploymentsSchema = z.object({ channel: channelPathSchema });
