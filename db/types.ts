import type { ColumnType, Generated, Insertable, Selectable, Updateable } from "kysely";
import type { Role } from "@/lib/auth/roles";
import type { AlarmKind, AlarmSeverity, AlarmSignal, AlarmState, LimitSide } from "@/lib/protocol";
import type { TokenScope } from "@/lib/auth/token-scope";
import type { DeploymentKind, DeploymentState, RevisionState } from "@/lib/workflow/states";
import type { RevisionContent, StoredChannelConfig } from "@/lib/coefficients";
import type { FilterDesign, FilterSpec } from "@/lib/dsp";

type CreatedAt = ColumnType<Date, Date | string | undefined, never>;

export interface UsersTable {
  id: Generated<number>;
  email: string;
  display_name: string;
  password_hash: string;
  role: Role;
  disabled: Generated<boolean>;
  session_version: Generated<number>;
  created_at: CreatedAt;
}

export interface RigsTable {
  id: Generated<number>;
  key: string;
  name: string;
  description: Generated<string>;
}

export type CoefficientFormat = "f32" | "q15" | "q31";

export interface DevicesTable {
  id: Generated<number>;
  rig_id: number;
  key: string;
  name: string;
  coefficient_format: Generated<CoefficientFormat>;
}

export interface ChannelsTable {
  id: Generated<number>;
  device_id: number;
  key: string;
  name: string;
  unit: string;
  sample_rate_hz: number;
  range_min: number;
  range_max: number;
  /** Most second-order sections the channel's device runs over a whole chain (0–64). */
  max_sections: Generated<number>;
  /** Most FIR taps the channel's device runs over a whole chain (0–1024). */
  max_fir_taps: Generated<number>;
}

export interface AuditLogTable {
  id: Generated<string>;
  at: CreatedAt;
  actor_id: number | null;
  action: string;
  entity: string;
  entity_id: string | null;
  before: unknown;
  after: unknown;
}

/** A signed-in session; its id is sealed in the cookie, and a revoked or expired row ends it. */
export interface SessionsTable {
  id: string;
  user_id: number;
  created_at: CreatedAt;
  expires_at: Date;
  revoked_at: Date | null;
}

/** Failed sign-ins counted per key (`account:…`, `address:…`, `device:…`) and the time before the next try. */
export interface LoginThrottleTable {
  key: string;
  failures: Generated<number>;
  last_failure_at: ColumnType<Date, Date | string | undefined, Date | string>;
  blocked_until: Date | null;
}

export interface DeviceCredentialsTable {
  id: Generated<number>;
  device_id: number;
  username: string;
  password_hash: string;
  created_at: CreatedAt;
}

export type { DeploymentKind };

declare const stored: unique symbol;
/**
 * A JSON column's value as read: written as a T, but not yet checked. Only its reader in
 * db/json-columns.ts opens it (parsing it with the column's zod schema), so nothing uses a stored
 * value that no longer has the shape its type claims.
 */
export type StoredJson<T> = { readonly [stored]: T };
/** A JSON column written once as JSON text (immutable after insert). */
type Json<T> = ColumnType<StoredJson<T>, string, never>;

export interface CoefficientSetsTable {
  id: Generated<number>;
  channel_id: number;
  name: string;
  created_by: number;
  created_at: CreatedAt;
  updated_at: ColumnType<Date, Date | string | undefined, Date | string>;
  latest_revision: Generated<number>;
  retired_at: ColumnType<Date | null, never, Date | string | null>;
  version: Generated<number>;
}

/** Content columns are immutable in the database; only the review state columns are updatable. */
export interface RevisionsTable {
  id: Generated<number>;
  set_id: ColumnType<number, number, never>;
  revision: ColumnType<number, number, never>;
  spec: Json<FilterSpec>;
  design: Json<FilterDesign>;
  device_format: ColumnType<CoefficientFormat, CoefficientFormat, never>;
  quantized: Json<RevisionContent["quantized"]>;
  analysis: Json<RevisionContent["analysis"]>;
  sample_rate_hz: ColumnType<number, number, never>;
  author_id: ColumnType<number, number, never>;
  notes: ColumnType<string, string | undefined, never>;
  created_at: ColumnType<Date, Date | string | undefined, never>;
  state: ColumnType<RevisionState, RevisionState | undefined, RevisionState>;
  state_version: Generated<number>;
  state_changed_at: ColumnType<Date, Date | string | undefined, Date | string>;
}

export interface ReviewsTable {
  id: Generated<number>;
  revision_id: number;
  reviewer_id: number;
  decision: "approved" | "rejected";
  comment: string;
  at: CreatedAt;
}

export interface DeploymentsTable {
  id: Generated<number>;
  revision_id: number;
  channel_id: number;
  kind: DeploymentKind;
  state: ColumnType<DeploymentState, DeploymentState | undefined, DeploymentState>;
  format: CoefficientFormat;
  config: Json<StoredChannelConfig>;
  checksum: string;
  previous_id: number | null;
  requested_by: number;
  requested_at: CreatedAt;
  activated_at: ColumnType<Date | null, never, Date | string | null>;
  ended_at: ColumnType<Date | null, never, Date | string | null>;
  reason: string | null;
}

export interface MailOutboxTable {
  id: Generated<string>;
  kind: string;
  recipients: string[];
  subject: string;
  body: string;
  created_at: CreatedAt;
  attempts: Generated<number>;
  next_attempt_at: ColumnType<Date, Date | string | undefined, Date | string>;
  sent_at: ColumnType<Date | null, never, Date | string | null>;
  last_error: string | null;
}

export interface MailboxTable {
  id: Generated<string>;
  received_at: CreatedAt;
  envelope_from: string;
  envelope_to: string[];
  subject: string;
  body: string;
  raw: string;
}

export type { TokenScope };

/** API tokens for build pipelines: only the SHA-256 of the token is kept. */
export interface ApiTokensTable {
  id: Generated<number>;
  user_id: number;
  name: string;
  token_hash: string;
  scope: ColumnType<TokenScope, TokenScope | undefined, never>;
  created_at: CreatedAt;
  last_used_at: ColumnType<Date | null, never, Date | string | null>;
  revoked_at: ColumnType<Date | null, never, Date | string | null>;
  /** Why it was revoked: by a person, or with its owner's disabling (never undone). */
  revoked_reason: ColumnType<"revoked" | "owner_disabled" | null, never, "revoked" | "owner_disabled" | null>;
  /** The current one-minute rate window of its requests: when it started and how many it holds. */
  window_start: ColumnType<Date | null, never, Date | string | null>;
  window_count: ColumnType<number, never, number>;
}

/** Stored samples of a channel; `samples` is float64 little-endian (lib/recordings/samples.ts), NaN for missing. */
export interface RecordingsTable {
  id: Generated<number>;
  channel_id: ColumnType<number, number, never>;
  name: string;
  notes: ColumnType<string, string | undefined, string>;
  sample_rate_hz: ColumnType<number, number, never>;
  started_at: ColumnType<Date | null, Date | string | null | undefined, never>;
  sample_count: ColumnType<number, number, never>;
  missing_count: ColumnType<number, number | undefined, never>;
  samples: ColumnType<Uint8Array, Uint8Array, never>;
  source: ColumnType<"upload", "upload" | undefined, never>;
  created_by: ColumnType<number, number, never>;
  created_at: CreatedAt;
}

export interface AlarmRulesTable {
  id: Generated<number>;
  channel_id: ColumnType<number, number, never>;
  name: string;
  signal: AlarmSignal;
  high: number | null;
  low: number | null;
  deadband: number;
  min_duration_ms: number;
  severity: AlarmSeverity;
  enabled: Generated<boolean>;
  created_by: ColumnType<number, number, never>;
  created_at: CreatedAt;
  updated_at: ColumnType<Date, Date | string | undefined, Date | string>;
  deleted_at: ColumnType<Date | null, never, Date | string | null>;
}

/** Written by the sidecar (id is its uuid for the event); only the acknowledgement columns are set by people. */
export interface AlarmEventsTable {
  id: string;
  rule_id: number;
  channel_id: number;
  kind: AlarmKind;
  severity: AlarmSeverity;
  signal: AlarmSignal;
  side: LimitSide;
  limit_value: number;
  state: AlarmState;
  raised_at: Date | string;
  cleared_at: Date | string | null;
  peak: number;
  revision_id: number | null;
  acknowledged_by: ColumnType<number | null, never, number>;
  acknowledged_at: ColumnType<Date | null, never, Date | string>;
  ack_comment: ColumnType<string | null, never, string>;
  stored_at: CreatedAt;
}

export interface SidecarsTable {
  id: string;
  ws_url: string;
  started_at: CreatedAt;
  heartbeat_at: ColumnType<Date, Date | string | undefined, Date | string>;
}

export interface ChannelLeasesTable {
  channel_id: number;
  sidecar_id: string;
  acquired_at: ColumnType<Date, Date | string | undefined, Date | string>;
  expires_at: ColumnType<Date, Date | string, Date | string>;
}

export interface AnnotationsTable {
  id: Generated<number>;
  channel_id: ColumnType<number, number, never>;
  at: ColumnType<Date, Date | string, never>;
  end_at: ColumnType<Date | null, Date | string | null | undefined, never>;
  text: ColumnType<string, string, never>;
  created_by: ColumnType<number, number, never>;
  created_at: CreatedAt;
}

export interface BenchCandidatesTable {
  id: Generated<number>;
  user_id: ColumnType<number, number, never>;
  channel_id: ColumnType<number, number, never>;
  key: ColumnType<string, string, never>;
  color_index: number;
  spec: ColumnType<StoredJson<FilterSpec>, string, string>;
  created_at: CreatedAt;
  updated_at: ColumnType<Date, Date | string | undefined, Date | string>;
}

export interface Database {
  users: UsersTable;
  rigs: RigsTable;
  devices: DevicesTable;
  channels: ChannelsTable;
  audit_log: AuditLogTable;
  sessions: SessionsTable;
  login_throttle: LoginThrottleTable;
  device_credentials: DeviceCredentialsTable;
  coefficient_sets: CoefficientSetsTable;
  revisions: RevisionsTable;
  reviews: ReviewsTable;
  deployments: DeploymentsTable;
  mail_outbox: MailOutboxTable;
  mailbox: MailboxTable;
  api_tokens: ApiTokensTable;
  recordings: RecordingsTable;
  alarm_rules: AlarmRulesTable;
  alarm_events: AlarmEventsTable;
  annotations: AnnotationsTable;
  bench_candidates: BenchCandidatesTable;
  sidecars: SidecarsTable;
  channel_leases: ChannelLeasesTable;
}

export type User = Selectable<UsersTable>;
export type NewUser = Insertable<UsersTable>;
export type UserUpdate = Updateable<UsersTable>;
export type Channel = Selectable<ChannelsTable>;
