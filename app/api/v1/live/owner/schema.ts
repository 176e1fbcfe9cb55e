import { z } from "zod";
import { channelPathSchema } from "@/lib/protocol";

export const ownerQuerySchema = z.object({ channel: channelPathSchema }).strict();
