import { z } from "zod";
import { ROLES } from "@/lib/auth/roles";
import { filterSpecSchema as spec } from "@/lib/dsp";
import { ERROR_STATUS, type ErrorCode } from "@/lib/errors";
import { SET_STATUSES } from "@/lib/workflow";
import { DEPLOYMENT_STATES, REVISION_STATES } from "@/lib/workflow/states";

/**
 * The JSON answers of the documented routes, as zod schemas for the OpenAPI document. The integration
 * test (tests/integration/openapi.test.ts) checks one real answer of every route against the document,
 * so these stay what the handlers send. DSP objects (design, quantized form, analysis, configuration)
 * are documented by their main fields; lib/dsp/README.md and the README hold the rest.
 */

const ERROR_CODES = Object.keys(ERROR_STATUS).filter((c): c is ErrorCode => c in ERROR_STATUS);

/** The one error shape (lib/errors.ts). */
export const errorBody = z.object({
  error: z.object({
    code: z.enum(ERROR_CODES),
    message: z.string(),
    details: z.array(z.object({ path: z.string(), message: z.string() })).optional(),
  }),
});

const when = z.iso.datetime();
const format = z.enum(["f32", "q15", "q31"]);

export const accountBody = z.object({ email: z.string(), name: z.string(), role: z.enum(ROLES) });
export const okBody = z.object({ ok: z.literal(true) });
export const healthBody = z.object({ status: z.literal("ok"), db: z.literal("up") });

export const channelList = z.array(z.object({ path: z.string(), name: z.string(), unit: z.string(), sampleRateHz: z.number() }));

/** A design as lib/dsp returns it: sos rows or FIR taps (or a chain's stages), zeros, poles and gain. */
const design = z.looseObject({
  sampleRateHz: z.number(),
  sos: z.array(z.array(z.number())).optional(),
  taps: z.array(z.number()).optional(),
  stages: z.array(z.looseObject({ stage: z.number() })).optional(),
});

export const productionBody = z.object({
  revisionId: z.number(),
  setId: z.number(),
  setName: z.string(),
  revision: z.number(),
  spec,
  design,
  activatedAt: when.nullable(),
  deploymentId: z.number(),
  checksum: z.string(),
});

export const setListBody = z.object({
  items: z.array(
    z.object({ id: z.number(), name: z.string(), channel: z.string(), status: z.enum(SET_STATUSES), latestRevision: z.number(), author: z.string(), updatedAt: when }),
  ),
  total: z.number(),
});

export const savedRevision = z.object({ setId: z.number(), revisionId: z.number(), revision: z.number() });

export const revisionBody = z.object({
  id: z.number(),
  setId: z.number(),
  revision: z.number(),
  spec,
  design,
  quantized: z.looseObject({ format, stable: z.boolean() }).nullable(),
  analysis: z.looseObject({ stable: z.boolean() }),
  format,
  sampleRateHz: z.number(),
  authorId: z.number(),
  author: z.string(),
  notes: z.string(),
  createdAt: when,
  state: z.enum(REVISION_STATES),
  stateVersion: z.number(),
  stateChangedAt: when,
  setName: z.string(),
  retiredAt: when.nullable(),
  channel: z.string(),
});

/** A deployment as the list and detail routes send it (without the design and spec). */
const deployment = z.looseObject({
  id: z.number(),
  kind: z.enum(["promote", "rollback"]),
  state: z.enum(DEPLOYMENT_STATES),
  format,
  checksum: z.string(),
  previousId: z.number().nullable(),
  requestedAt: when,
  activatedAt: when.nullable(),
  endedAt: when.nullable(),
  reason: z.string().nullable(),
  requestedBy: z.string(),
  channel: z.string(),
  revisionId: z.number(),
  revision: z.number(),
  setId: z.number(),
  setName: z.string(),
});

export const deploymentDetail = deployment.extend({ config: z.looseObject({ revisionId: z.string(), format }) });
export const deploymentList = z.object({ items: z.array(deployment) });

export const setDetailBody = z.object({
  set: z.looseObject({ id: z.number(), name: z.string(), version: z.number(), latestRevision: z.number(), channel: z.string(), status: z.enum(SET_STATUSES), format }),
  revisions: z.array(revisionBody),
  reviews: z.array(z.object({ id: z.number(), revision: z.number(), revisionId: z.number(), decision: z.enum(["approved", "rejected"]), comment: z.string(), at: when, reviewer: z.string() })),
  deployments: z.array(deployment),
});

export const retiredBody = z.object({ setId: z.number(), status: z.literal("retired") });
export const transitionBody = z.object({ revisionId: z.number(), state: z.enum(REVISION_STATES), stateVersion: z.number() });
export const promotionBody = z.object({ deployments: z.array(z.object({ id: z.number(), channel: z.string() })) });
export const rollbackBody = z.object({ id: z.number(), channel: z.string(), passThrough: z.boolean() });

export const auditPage = z.object({
  items: z.array(
    z.object({
      id: z.string(),
      at: when,
      actor: z.string().nullable(),
      actorEmail: z.string().nullable(),
      action: z.string(),
      entity: z.string(),
      entityId: z.string().nullable(),
      before: z.unknown(),
      after: z.unknown(),
    }),
  ),
  total: z.number(),
});

/** The OpenAPI document itself, as far as a client needs to know. */
export const openApiBody = z.looseObject({ openapi: z.literal("3.1.0"), paths: z.record(z.string(), z.unknown()) });
