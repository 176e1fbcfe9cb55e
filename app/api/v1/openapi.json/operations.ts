import { z } from "zod";
import { loginSchema } from "@/app/api/auth/login/schema";
import { auditQuerySchema } from "@/app/api/v1/audit/schema";
import { listDeploymentsSchema, rollbackSchema } from "@/app/api/v1/deployments/schema";
import { exportQuerySchema } from "@/app/api/v1/revisions/[id]/export/schema";
import { promoteSchema, transitionSchema } from "@/app/api/v1/revisions/schema";
import { addRevisionSchema, createSetSchema, listSetsSchema, retireSchema } from "@/app/api/v1/sets/schema";
import { TOKEN_RATE } from "@/lib/auth/token-scope";
import { dbId } from "@/lib/http/fields";
import type { ApiOperation, ApiResponse } from "@/lib/http/openapi";
import { KEY_PATTERN } from "@/lib/protocol";
import * as r from "./responses";

const key = z.string().regex(KEY_PATTERN);
const channelParams = { rig: key, device: key, channel: key };
const id = { id: dbId };

const err = (description: string): ApiResponse => ({ description, json: r.errorBody });
const E400 = err("Invalid fields: `details` lists each path and message.");
const E401 = err("Not signed in, or the token is missing, unknown, revoked or its owner disabled.");
const E403 = err("The role (or the token's scope) does not allow it.");
const E404 = err("Not found.");
const E409 = err("The state changed since it was read (stale version, pending deployment).");
const E422 = err("Understood but refused, with the reason (sample rate, stability, capacity).");
const E429 = err(`Too many requests: a token may make ${TOKEN_RATE.maxPerWindow} a minute (sign-in has its own limits).`);

const TOKENS = `Takes the session cookie or \`Authorization: Bearer tw_…\` (read scope); at most ${TOKEN_RATE.maxPerWindow} token requests a minute.`;

/** The export answer: the file, with its SHA-256 content hash in `x-content-sha256`. */
const FILE: ApiResponse = {
  description: "The file as an attachment (c-header, cmsis-df1, cmsis-df2t: text/x-c; json; scipy: text/x-python; csv: text/csv).",
  files: ["text/x-c", "application/json", "text/x-python", "text/csv"],
};

/** Every documented route of the HTTP API, with the schemas its handler parses and answers with. */
export const API_OPERATIONS: ApiOperation[] = [
  { method: "get", path: "/api/health", operationId: "health", summary: "Liveness and database reachability", tag: "service", auth: "none",
    responses: { 200: { description: "Up.", json: r.healthBody }, 503: { description: "The database is down (text/plain)." } } },
  { method: "get", path: "/api/v1/openapi.json", operationId: "openApi", summary: "This document", tag: "service", auth: "none",
    responses: { 200: { description: "The OpenAPI 3.1 document.", json: r.openApiBody } } },
  { method: "post", path: "/api/auth/login", operationId: "login", summary: "Sign in; sets the session cookie", tag: "session", auth: "none", body: loginSchema,
    responses: { 200: { description: "Signed in.", json: r.accountBody }, 400: E400, 401: err("E-mail or password is not right."), 429: E429 } },
  { method: "post", path: "/api/auth/logout", operationId: "logout", summary: "End the session", tag: "session", auth: "none",
    responses: { 200: { description: "Signed out.", json: r.okBody } } },
  { method: "get", path: "/api/auth/me", operationId: "me", summary: "Who is signed in", tag: "session", auth: "session",
    responses: { 200: { description: "The account.", json: r.accountBody }, 401: E401 } },
  { method: "get", path: "/api/v1/channels", operationId: "listChannels", summary: "Every channel", description: TOKENS, tag: "channels", auth: "session-or-token",
    responses: { 200: { description: "Channels with their unit and sample rate.", json: r.channelList }, 401: E401, 429: E429 } },
  { method: "get", path: "/api/v1/channels/{rig}/{device}/{channel}/production", operationId: "getProduction", summary: "The channel's production filter",
    description: TOKENS, tag: "channels", auth: "session-or-token", path_params: channelParams,
    responses: { 200: { description: "The revision its device acknowledged last.", json: r.productionBody }, 401: E401, 404: err("No such channel, or nothing is active on it.") } },
  { method: "get", path: "/api/v1/channels/{rig}/{device}/{channel}/production/export", operationId: "exportProduction",
    summary: "Export the production filter (what firmware builds fetch)", description: `${TOKENS} Default target: the format it was deployed in (f32 for cmsis-df2t).`,
    tag: "exports", auth: "session-or-token", path_params: channelParams, query: exportQuerySchema,
    responses: { 200: FILE, 400: E400, 401: E401, 404: err("No such channel, or nothing is active on it."), 422: E422, 429: E429 } },
  { method: "get", path: "/api/v1/sets", operationId: "listSets", summary: "Coefficient sets, paged", description: TOKENS, tag: "sets", auth: "session-or-token", query: listSetsSchema,
    responses: { 200: { description: "One page of sets and the total.", json: r.setListBody }, 400: E400, 401: E401 } },
  { method: "post", path: "/api/v1/sets", operationId: "createSet", summary: "A new set with revision 1 (engineer)", tag: "sets", auth: "session", body: createSetSchema,
    responses: { 201: { description: "Saved.", json: r.savedRevision }, 400: E400, 401: E401, 403: E403, 404: E404, 422: E422 } },
  { method: "get", path: "/api/v1/sets/{id}", operationId: "getSet", summary: "A set with its revisions, reviews and deployments", description: TOKENS, tag: "sets",
    auth: "session-or-token", path_params: id, responses: { 200: { description: "The set.", json: r.setDetailBody }, 401: E401, 404: E404 } },
  { method: "post", path: "/api/v1/sets/{id}/revisions", operationId: "addRevision", summary: "A new revision (engineer; 409 when stale)", tag: "sets", auth: "session",
    path_params: id, body: addRevisionSchema,
    responses: { 201: { description: "Saved.", json: r.savedRevision }, 400: E400, 401: E401, 403: E403, 404: E404, 409: E409, 422: E422 } },
  { method: "post", path: "/api/v1/sets/{id}/retire", operationId: "retireSet", summary: "Retire a set (lead)", tag: "sets", auth: "session", path_params: id, body: retireSchema,
    responses: { 200: { description: "Retired.", json: r.retiredBody }, 400: E400, 401: E401, 403: E403, 404: E404, 409: E409 } },
  { method: "get", path: "/api/v1/revisions/{id}", operationId: "getRevision", summary: "A revision with its content", description: TOKENS, tag: "revisions",
    auth: "session-or-token", path_params: id, responses: { 200: { description: "The revision.", json: r.revisionBody }, 401: E401, 404: E404 } },
  { method: "post", path: "/api/v1/revisions/{id}/transitions", operationId: "transitionRevision", summary: "Submit (engineer), approve or reject (lead)",
    tag: "revisions", auth: "session", path_params: id, body: transitionSchema,
    responses: { 200: { description: "The new state.", json: r.transitionBody }, 400: E400, 401: E401, 403: E403, 404: E404, 409: E409 } },
  { method: "post", path: "/api/v1/revisions/{id}/promote", operationId: "promoteRevision", summary: "Promote an approved revision (lead, or a lead's promote token)",
    description: "A lead's session, or `Authorization: Bearer tw_…` of a promote token whose owner is a lead; every use of a promote token is audited with its name.",
    tag: "revisions", auth: "session-or-token", path_params: id, body: promoteSchema,
    responses: { 202: { description: "Pending deployments; poll GET /api/v1/deployments/{id}.", json: r.promotionBody }, 400: E400, 401: E401, 403: E403, 404: E404, 409: E409, 422: E422, 429: E429 } },
  { method: "get", path: "/api/v1/revisions/{id}/export", operationId: "exportRevision", summary: "Export a revision's coefficients",
    description: `${TOKENS} Default target: the format the revision was saved for (f32 for cmsis-df2t).`, tag: "exports", auth: "session-or-token",
    path_params: id, query: exportQuerySchema, responses: { 200: FILE, 400: E400, 401: E401, 404: E404, 422: E422, 429: E429 } },
  { method: "post", path: "/api/v1/deployments/rollback", operationId: "rollback", summary: "Back to the previous revision, or to no filter after a first promotion (lead)", tag: "deployments", auth: "session",
    body: rollbackSchema, responses: { 202: { description: "The pending rollback.", json: r.rollbackBody }, 400: E400, 401: E401, 403: E403, 404: E404, 409: E409 } },
  { method: "get", path: "/api/v1/deployments", operationId: "listDeployments", summary: "A channel's deployment history", description: TOKENS, tag: "deployments",
    auth: "session-or-token", query: listDeploymentsSchema, responses: { 200: { description: "Newest first.", json: r.deploymentList }, 400: E400, 401: E401, 404: E404 } },
  { method: "get", path: "/api/v1/deployments/{id}", operationId: "getDeployment", summary: "One deployment with the configuration sent", description: TOKENS,
    tag: "deployments", auth: "session-or-token", path_params: id, responses: { 200: { description: "The deployment.", json: r.deploymentDetail }, 401: E401, 404: E404 } },
  { method: "get", path: "/api/v1/audit", operationId: "listAudit", summary: "The audit trail (lead), JSON pages or CSV", description: TOKENS, tag: "audit",
    auth: "session-or-token", query: auditQuerySchema,
    responses: { 200: { description: "A page (format=json) or every match as CSV (format=csv).", json: r.auditPage }, 400: E400, 401: E401, 403: E403 } },
];
