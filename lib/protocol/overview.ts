import { z } from "zod";
import { FAULT_KINDS } from "./faults";

/**
 * The sidecar's GET /overview answer as the web app reads it (docs/protocol.md, "/overview").
 * The route handler parses the sidecar's reply with it before passing it on; the cards read it back.
 */
export const liveOverviewSchema = z.object({
  /** The sidecar's clock when it answered, epoch ms. */
  now: z.number(),
  mqtt: z.enum(["connected", "reconnecting", "closed"]),
  channels: z.record(
    z.string(),
    z.object({
      online: z.boolean().nullable(),
      lastSampleAt: z.number().nullable(),
      productionRevisionId: z.string().nullable(),
      spark: z
        .object({ t0: z.number(), stepMs: z.number().positive(), min: z.array(z.number()), max: z.array(z.number()) })
        .refine((s) => s.min.length === s.max.length, { error: "min and max must have the same length" })
        .nullable(),
      faults: z.partialRecord(z.enum(FAULT_KINDS), z.number().int().nonnegative()),
      /** Since when the sidecar serving the channel has counted its faults (when it started), epoch ms. */
      faultsSince: z.number(),
    }),
  ),
});

export type LiveOverview = z.infer<typeof liveOverviewSchema>;
export type ChannelLiveState = LiveOverview["channels"][string];
export type LiveSpark = NonNullable<ChannelLiveState["spark"]>;
