/**
 * Keeps one child process running: when it exits without being asked to (a crash, a kill, an
 * unexpected failure it stopped itself on), it is replaced, after a short pause that grows while it
 * keeps failing. With `standby`, a second child is kept loaded but not serving (it must accept an
 * IPC `{ type: 'listen' }` and say `{ type: 'ready' }` once loaded), so that the replacement serves
 * at once instead of after a cold start. A child that fails too often in a short time is given up on.
 */
import type { ChildProcess } from 'node:child_process';

export interface SupervisorOptions {
  name: string;
  /** Starts the child; `standby` asks for one that loads, says it is ready and waits to be told to listen. */
  start: (standby: boolean) => ChildProcess;
  standby?: boolean;
  log?: (line: string) => void;
  /** Given up after this many unexpected exits within `windowMs`. */
  maxRestarts?: number;
  windowMs?: number;
  /** Called once when the child keeps failing and is not started again. */
  onGiveUp?: (code: number | null) => void;
}

export interface Supervisor {
  /** The serving child (or the last one). */
  readonly child: ChildProcess;
  /** Unexpected exits of the serving child so far. */
  readonly restarts: number;
  /** Whether a standby child is loaded and ready to take over. */
  readonly standbyReady: boolean;
  /** Stops the children (SIGTERM, then SIGKILL after `graceMs`) without starting them again. */
  stop(graceMs?: number): Promise<void>;
}

const isMessage = (m: unknown, type: string) =>
  typeof m === 'object' && m !== null && (m as { type?: unknown }).type === type;

function stopChild(child: ChildProcess, graceMs: number): Promise<void> {
  if (child.exitCode !== null || child.signalCode !== null) return Promise.resolve();
  return new Promise<void>((resolve) => {
    const kill = setTimeout(() => child.kill('SIGKILL'), graceMs);
    child.once('exit', () => {
      clearTimeout(kill);
      resolve();
    });
    child.kill('SIGTERM');
  });
}

export function supervise(options: SupervisorOptions): Supervisor {
  const log = options.log ?? ((line: string) => console.error(line));
  const maxRestarts = options.maxRestarts ?? 5;
  const windowMs = options.windowMs ?? 60_000;
  const exits: number[] = [];
  let restarts = 0;
  let stopped = false;
  let active: ChildProcess;
  let spare: { child: ChildProcess; ready: boolean } | null = null;

  /** Notes an unexpected exit; false when the child has failed too often and is given up on. */
  const failedAgain = (code: number | null): boolean => {
    const now = Date.now();
    exits.push(now);
    while (exits.length > 0 && (exits[0] ?? now) < now - windowMs) exits.shift();
    if (exits.length <= maxRestarts) return true;
    log(
      `» ${options.name} exited ${exits.length} times within ${Math.round(windowMs / 1000)} s; not starting it again`,
    );
    stopped = true;
    if (spare) void stopChild(spare.child, 2000);
    options.onGiveUp?.(code);
    return false;
  };
  const pause = () => Math.min(2000, 100 * 2 ** Math.max(0, exits.length - 1));

  const launchSpare = () => {
    if (stopped || !options.standby) return;
    const child = options.start(true);
    const entry = { child, ready: false };
    spare = entry;
    child.on('message', (m) => {
      if (isMessage(m, 'ready')) entry.ready = true;
    });
    child.on('exit', (code) => {
      if (stopped || spare !== entry) return;
      spare = null;
      if (failedAgain(code)) setTimeout(launchSpare, pause());
    });
  };

  const serve = (child: ChildProcess) => {
    active = child;
    child.on('exit', (code, signal) => {
      if (stopped || active !== child) return;
      restarts += 1;
      if (!failedAgain(code)) return;
      const ready = spare?.ready ? spare : null;
      if (ready) {
        spare = null;
        log(`» ${options.name} exited (${code ?? signal ?? 'unknown'}); the standby takes over`);
        serve(ready.child);
        ready.child.send({ type: 'listen' });
        setTimeout(launchSpare, pause());
        return;
      }
      const wait = pause();
      log(`» ${options.name} exited (${code ?? signal ?? 'unknown'}); starting it again in ${wait} ms`);
      setTimeout(() => {
        if (!stopped) serve(options.start(false));
      }, wait);
    });
  };

  serve(options.start(false));
  launchSpare();

  return {
    get child() {
      return active;
    },
    get restarts() {
      return restarts;
    },
    get standbyReady() {
      return spare?.ready ?? false;
    },
    async stop(graceMs = 5000) {
      stopped = true;
      await Promise.all([stopChild(active, graceMs), spare ? stopChild(spare.child, graceMs) : Promise.resolve()]);
    },
  };
}
