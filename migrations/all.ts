import type { Migration, MigrationProvider } from "kysely";
import * as m0001 from "./20261201_0001_lab_users_audit";
import * as m0002 from "./20261201_0002_device_credentials";
import * as m0003 from "./20261201_0003_coefficient_sets";
import * as m0004 from "./20261201_0004_mail";
import * as m0005 from "./20261201_0005_api_tokens";
import * as m0006 from "./20261201_0006_recordings";
import * as m0007 from "./20261203_0007_channel_capacity";
import * as m0008 from "./20261203_0008_sessions_throttle";
import * as m0009 from "./20261203_0009_alarms_annotations";
import * as m0010 from "./20261203_0010_token_scopes";
import * as m0011 from "./20261203_0011_bench_candidates";
import * as m0012 from "./20261203_0012_sidecar_leases";

/** Every migration in order; a static list so tsx, vitest and bundlers load them alike. */
export const migrations: Record<string, Migration> = {
  "20261201_0001_lab_users_audit": m0001,
  "20261201_0002_device_credentials": m0002,
  "20261201_0003_coefficient_sets": m0003,
  "20261201_0004_mail": m0004,
  "20261201_0005_api_tokens": m0005,
  "20261201_0006_recordings": m0006,
  "20261203_0007_channel_capacity": m0007,
  "20261203_0008_sessions_throttle": m0008,
  "20261203_0009_alarms_annotations": m0009,
  "20261203_0010_token_scopes": m0010,
  "20261203_0011_bench_candidates": m0011,
  "20261203_0012_sidecar_leases": m0012,
};

export const migrationProvider: MigrationProvider = { getMigrations: async () => migrations };
