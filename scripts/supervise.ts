/**
 * Keeps one child process running: when it exits without being asked to (a crash, a kill, an
 * unexpected failure it stopped itself on), it is started again, after a short pause that grows
 * while it keeps failing. A child that fails too often in a short time is given up on.
 */
import type { ChildProcess } from 'node:child_process';

export interface SupervisorOptions {
  name: string;
  start: () => ChildProcess;
  log?: (line: string) => void;
  /** Given up after this many unexpected exits within `windowMs`. */
  maxRestarts?: number;
  windowMs?: number;
  /** Called once when the child keeps failing and is not started again. */
  onGiveUp?: (code: number | null) => void;
}

export interface Supervisor {
  /** The running child (or the last one). */
  readonly child: ChildProcess;
  /** Unexpected exits so far. */
  readonly restarts: number;
  /** Stops the child (SIGTERM, then SIGKILL after `graceMs`) without starting it again. */
  stop(graceMs?: number): Promise<void>;
}

export function supervise(options: SupervisorOptions): Supervisor {
  const log = options.log ?? ((line: string) => console.error(line));
  const maxRestarts = options.maxRestarts ?? 5;
  const windowMs = options.windowMs ?? 60_000;
  const exits: number[] = [];
  let restarts = 0;
  let stopped = false;
  let child: ChildProcess;

  const launch = () => {
    child = options.start();
    const current = child;
    current.on('exit', (code, signal) => {
      if (stopped) return;
      restarts += 1;
      const now = Date.now();
      exits.push(now);
      while (exits.length > 0 && (exits[0] ?? now) < now - windowMs) exits.shift();
      if (exits.length > maxRestarts) {
        log(`» ${options.name} exited ${exits.length} times within ${Math.round(windowMs / 1000)} s; not starting it again`);
        stopped = true;
        options.onGiveUp?.(code);
        return;
      }
      const pauseMs = Math.min(2000, 100 * 2 ** (exits.length - 1));
      log(`» ${options.name} exited (${code ?? signal ?? 'unknown'}); starting it again in ${pauseMs} ms`);
      setTimeout(() => {
        if (!stopped) launch();
      }, pauseMs);
    });
  };
  launch();

  return {
    get child() {
      return child;
    },
    get restarts() {
      return restarts;
    },
    stop(graceMs = 5000) {
      stopped = true;
      const current = child;
      if (current.exitCode !== null || current.signalCode !== null) return Promise.resolve();
      return new Promise<void>((resolve) => {
        const kill = setTimeout(() => current.kill('SIGKILL'), graceMs);
        current.once('exit', () => {
          clearTimeout(kill);
          resolve();
        });
        current.kill('SIGTERM');
      });
    },
  };
}
