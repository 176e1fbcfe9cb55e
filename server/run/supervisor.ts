import { spawn, type ChildProcess } from "node:child_process";

/** One long-running process the supervisor keeps up. */
export interface ChildSpec {
  name: string;
  command: string;
  args: string[];
  env?: Record<string, string>;
}

export interface SupervisorOptions {
  /** First restart delay in ms; doubles after each quick death up to maxDelayMs. */
  initialDelayMs?: number;
  maxDelayMs?: number;
  /** A child that ran this long before dying is restarted after initialDelayMs again. */
  healthyAfterMs?: number;
  log?: (line: string) => void;
}

export interface Supervisor {
  /** Current process id of a child (undefined while it is being restarted). */
  pid(name: string): number | undefined;
  /** How many times a child has been restarted. */
  restarts(name: string): number;
  /** Stop every child (SIGTERM, then SIGKILL after graceMs) and restart nothing more. */
  stop(graceMs?: number): Promise<void>;
}

interface Running {
  spec: ChildSpec;
  child: ChildProcess | undefined;
  delayMs: number;
  restarts: number;
  timer: ReturnType<typeof setTimeout> | undefined;
}

/**
 * Keeps each child running: when one exits for any reason other than stop(), it is started again
 * after a back-off (exponential, reset once the child has stayed up for healthyAfterMs) and the
 * reason is logged. The others are left alone, so the web app stays up while the sidecar restarts.
 */
export function supervise(specs: ChildSpec[], opts: SupervisorOptions = {}): Supervisor {
  const initial = opts.initialDelayMs ?? 1000;
  const max = opts.maxDelayMs ?? 30_000;
  const healthyAfter = opts.healthyAfterMs ?? 60_000;
  const log = opts.log ?? ((line: string) => console.log(`[supervisor] ${line}`));
  const running = new Map<string, Running>();
  let stopping = false;

  function start(r: Running): void {
    r.timer = undefined;
    const startedAt = Date.now();
    const child = spawn(r.spec.command, r.spec.args, { stdio: "inherit", env: { ...process.env, ...r.spec.env } });
    r.child = child;
    child.on("error", (err) => log(`${r.spec.name} could not start: ${err.message}`));
    child.on("exit", (code, signal) => {
      r.child = undefined;
      if (stopping) return;
      const ranMs = Date.now() - startedAt;
      if (ranMs >= healthyAfter) r.delayMs = initial;
      const why = signal ? `killed by ${signal}` : `exited with code ${code}`;
      log(`${r.spec.name} ${why} after ${(ranMs / 1000).toFixed(1)} s; restarting in ${(r.delayMs / 1000).toFixed(1)} s`);
      r.restarts++;
      r.timer = setTimeout(() => start(r), r.delayMs);
      r.delayMs = Math.min(max, r.delayMs * 2);
    });
  }

  for (const spec of specs) {
    if (running.has(spec.name)) throw new Error(`two children are named '${spec.name}'`);
    const r: Running = { spec, child: undefined, delayMs: initial, restarts: 0, timer: undefined };
    running.set(spec.name, r);
    start(r);
  }

  return {
    pid: (name) => running.get(name)?.child?.pid,
    restarts: (name) => running.get(name)?.restarts ?? 0,
    async stop(graceMs = 5000) {
      stopping = true;
      const exits = [...running.values()].map((r) => {
        if (r.timer) clearTimeout(r.timer);
        const child = r.child;
        if (!child || child.exitCode !== null || child.signalCode !== null) return Promise.resolve();
        return new Promise<void>((resolve) => {
          const kill = setTimeout(() => child.kill("SIGKILL"), graceMs);
          child.once("exit", () => {
            clearTimeout(kill);
            resolve();
          });
          child.kill("SIGTERM");
        });
      });
      await Promise.all(exits);
    },
  };
}
