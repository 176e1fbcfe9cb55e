import { execFileSync } from "node:child_process";
import { chownSync, existsSync, mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { freePort } from "../sidecar-support";

/** Debian's PostgreSQL binaries, newest first, or null when none is installed. */
export function postgresBin(): string | null {
  for (const v of [17, 16, 15]) if (existsSync(`/usr/lib/postgresql/${v}/bin/pg_ctl`)) return `/usr/lib/postgresql/${v}/bin`;
  return null;
}

export interface OwnCluster {
  url: string;
  /** pg_ctl stop -m fast: open connections are ended, new ones refused. */
  stop(): void;
  start(): void;
  /** Stops it and removes its files. */
  remove(): void;
}

/**
 * A throwaway PostgreSQL cluster on a free loopback port, for tests that stop and restart the
 * database without touching the shared test cluster. Runs as the postgres user when the tests run as root.
 */
export async function ownCluster(bin: string): Promise<OwnCluster> {
  const dir = mkdtempSync(join(tmpdir(), "tw-pg-"));
  const data = join(dir, "data");
  const root = process.getuid?.() === 0;
  const uid = root ? Number(execFileSync("id", ["-u", "postgres"]).toString().trim()) : null;
  if (uid !== null) chownSync(dir, uid, uid);
  const run = (cmd: string, args: string[]) =>
    root ? execFileSync("runuser", ["-u", "postgres", "--", `${bin}/${cmd}`, ...args], { cwd: "/", stdio: "pipe" }) : execFileSync(`${bin}/${cmd}`, args, { stdio: "pipe" });
  run("initdb", ["-D", data, "-U", "postgres", "-A", "trust", "-E", "UTF8", "--locale=C.UTF-8", "--no-sync"]);
  const port = await freePort();
  const options = `-c listen_addresses=127.0.0.1 -p ${port} -c unix_socket_directories='' -c fsync=off`;
  let running = false;
  const cluster: OwnCluster = {
    url: `postgres://postgres@127.0.0.1:${port}/postgres`,
    start: () => {
      run("pg_ctl", ["-D", data, "-l", join(dir, "server.log"), "-w", "-t", "30", "-o", options, "start"]);
      running = true;
    },
    stop: () => {
      run("pg_ctl", ["-D", data, "-m", "fast", "-w", "stop"]);
      running = false;
    },
    remove: () => {
      if (running) cluster.stop();
      rmSync(dir, { recursive: true, force: true });
    },
  };
  cluster.start();
  return cluster;
}
