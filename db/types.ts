import type { ColumnType, Generated, Insertable, Selectable, Updateable } from "kysely";
import type { Role } from "@/lib/auth/roles";

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

export interface LoginFailuresTable {
  id: Generated<string>;
  at: CreatedAt;
  email: string;
  address: string;
}

export interface DeviceCredentialsTable {
  id: Generated<number>;
  device_id: number;
  username: string;
  password_hash: string;
  created_at: CreatedAt;
}

export interface Database {
  users: UsersTable;
  rigs: RigsTable;
  devices: DevicesTable;
  channels: ChannelsTable;
  audit_log: AuditLogTable;
  login_failures: LoginFailuresTable;
  device_credentials: DeviceCredentialsTable;
}

export type User = Selectable<UsersTable>;
export type NewUser = Insertable<UsersTable>;
export type UserUpdate = Updateable<UsersTable>;
export type Channel = Selectable<ChannelsTable>;
