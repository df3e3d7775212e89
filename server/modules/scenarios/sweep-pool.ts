/**
 * The sweep worker pool: sweeps run in worker threads so that a long one never holds up other
 * requests. Identical sweeps asked for at the same time share one run.
 */
import { availableParallelism } from 'node:os';
import { Piscina } from 'piscina';
import type { SweepTask, SweepTaskResult } from './sweep-worker';

export interface SweepPool {
  run(hash: string, task: SweepTask): Promise<SweepTaskResult>;
  close(): Promise<void>;
}

export function createSweepPool(options: { maxThreads?: number } = {}): SweepPool {
  const maxThreads = options.maxThreads ?? Math.max(1, Math.min(4, availableParallelism() - 1));
  const piscina = new Piscina<SweepTask, SweepTaskResult>({
    filename: new URL('./sweep-worker.ts', import.meta.url).href,
    minThreads: 0,
    maxThreads,
    idleTimeout: 60_000,
  });
  const inFlight = new Map<string, Promise<SweepTaskResult>>();
  return {
    run(hash, task) {
      let p = inFlight.get(hash);
      if (p === undefined) {
        p = piscina.run(task).finally(() => inFlight.delete(hash));
        inFlight.set(hash, p);
      }
      return p;
    },
    async close() {
      await piscina.destroy();
    },
  };
}
