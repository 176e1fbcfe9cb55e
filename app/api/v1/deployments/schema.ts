import { z } from "zod";
import { dbId } from "@/lib/http/fields";
import { channelPathSchema } from "@/lib/protocol";

export const rollbackSchema = z.object({ channel: channelPathSchema, expectedActiveId: dbId });
export const listDeploymentsSchema = z.object({ channel: channelPathSchema });
