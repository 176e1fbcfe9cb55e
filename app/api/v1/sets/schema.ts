import { z } from "zod";
import { filterSpecSchema } from "@/lib/dsp";
import { channelPathSchema } from "@/lib/protocol";
import { SET_STATUSES } from "@/lib/workflow";
import { SET_SORTS } from "@/db/queries/sets";
import { dbId, pageNumber } from "@/lib/http/fields";

const notes = z.string().max(4000, "Notes are limited to 4000 characters.").optional();

export const createSetSchema = z.object({
  channel: channelPathSchema,
  name: z.string().trim().min(1, "Give the set a name.").max(120),
  notes,
  spec: filterSpecSchema,
});

export const addRevisionSchema = z.object({
  spec: filterSpecSchema,
  notes,
  expectedLatestRevision: dbId,
});

export const retireSchema = z.object({ expectedVersion: dbId });

export const listSetsSchema = z.object({
  channel: z.string().max(192).optional(),
  status: z.enum(SET_STATUSES).optional(),
  author: z.string().trim().max(120).optional(),
  q: z.string().trim().max(120).optional(),
  sort: z.enum(SET_SORTS).default("updatedAt"),
  dir: z.enum(["asc", "desc"]).default("desc"),
  page: pageNumber,
  pageSize: z.coerce.number().int().min(1).max(100).default(20),
});

