/**
 * The sweep worker pool: sweeps run in worker threads so that a long one never holds up other
 * requests. Identical sweeps asked for at the same time share one run. One worker starts with the
 * pool and opens its database connection at once, so that the first sweep finds it ready.
 */
import { availableParallelism } from 'node:os';
import { Piscina } from 'piscina';
import type { SweepTask, SweepTaskResult, WarmUpTask } from './sweep-worker';

export interface SweepPool {
  run(hash: string, task: SweepTask): Promise<SweepTaskResult>;
  /** Resolves once the first worker has started and connected (at once without a database to warm). */
  ready(): Promise<void>;
  close(): Promise<void>;
}

export function createSweepPool(options: { maxThreads?: number; databaseUrl?: string } = {}): SweepPool {
  const maxThreads = options.maxThreads ?? Math.max(1, Math.min(4, availableParallelism() - 1));
  const piscina = new Piscina<SweepTask | WarmUpTask, SweepTaskResult | null>({
    filename: new URL('./sweep-worker.ts', import.meta.url).href,
    minThreads: 1,
    maxThreads,
    idleTimeout: 60_000,
  });
  // A failed warm-up (database not up yet) is harmless: the first sweep connects instead.
  const warm = options.databaseUrl
    ? piscina.run({ warmUp: true, databaseUrl: options.databaseUrl }).then(
        () => undefined,
        () => undefined,
      )
    : Promise.resolve();
  const inFlight = new Map<string, Promise<SweepTaskResult>>();
  return {
    run(hash, task) {
      let p = inFlight.get(hash);
      if (p === undefined) {
        p = piscina
          .run(task)
          .then((r) => {
            if (r === null) throw new Error('the sweep worker answered a sweep with nothing');
            return r;
          })
          .finally(() => inFlight.delete(hash));
        inFlight.set(hash, p);
      }
      return p;
    },
    ready: () => warm,
    async close() {
      await piscina.destroy();
    },
  };
}
