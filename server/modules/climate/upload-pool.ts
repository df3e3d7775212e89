/**
 * The upload pool: weather files are read and checked in worker threads, so that one user's large
 * file (or a small gzip that unpacks large) never holds up anyone else's requests. At most `max`
 * files are read at once over all organisations and `perOrganization` for one organisation; the
 * others wait their turn, in order. A full waiting line answers 503 with a time to retry.
 */
import { Piscina } from 'piscina';
import { HttpError } from '../../http/http-error';
import type { UploadParseResult, UploadParseTask } from './upload-worker';

export interface UploadPool {
  /** Reads an upload in the pool once the organisation's turn comes. */
  parse(organizationId: string, task: UploadParseTask): Promise<UploadParseResult>;
  /** Uploads being read and waiting, over all organisations (for the bench and the tests). */
  pending(): { running: number; waiting: number };
  /** One organisation's uploads being read and waiting their turn. */
  pendingFor(organizationId: string): { reading: number; waiting: number };
  close(): Promise<void>;
}

/** Uploads one organisation may have waiting behind its running ones before it is told to retry. */
const MAX_WAITING_PER_ORG = 4;
const RETRY_AFTER_S = 10;

export function createUploadPool(options: { max: number; perOrganization: number }): UploadPool {
  const piscina = new Piscina<UploadParseTask, UploadParseResult>({
    filename: new URL('./upload-worker.ts', import.meta.url).href,
    // Started on the first upload and kept for a minute: most servers read a file now and then.
    minThreads: 0,
    maxThreads: options.max,
    maxQueue: options.max * MAX_WAITING_PER_ORG * 4,
    idleTimeout: 60_000,
  });
  const turns = new Map<string, { running: number; waiting: (() => void)[] }>();
  let running = 0;

  const busy = () =>
    new HttpError(
      503,
      'uploads_busy',
      `Too many weather files are waiting to be read; try again in ${RETRY_AFTER_S} seconds`,
    );

  async function take(organizationId: string): Promise<void> {
    let turn = turns.get(organizationId);
    if (!turn) {
      turn = { running: 0, waiting: [] };
      turns.set(organizationId, turn);
    }
    if (turn.running < options.perOrganization) {
      turn.running++;
      return;
    }
    if (turn.waiting.length >= MAX_WAITING_PER_ORG) throw busy();
    const mine = turn;
    await new Promise<void>((resolve) => mine.waiting.push(resolve));
    // `give` passed its place to this one without lowering the count.
  }

  function give(organizationId: string): void {
    const turn = turns.get(organizationId);
    if (!turn) return;
    const next = turn.waiting.shift();
    if (next) {
      next();
      return;
    }
    turn.running--;
    if (turn.running === 0) turns.delete(organizationId);
  }

  return {
    async parse(organizationId, task) {
      await take(organizationId);
      running++;
      try {
        // The files' bytes move to the worker rather than being copied, when they own their memory.
        const transferList = task.files
          .map((f) => f.content.buffer)
          .filter((b): b is ArrayBuffer => b instanceof ArrayBuffer)
          .filter(
            (b, i, all) =>
              all.indexOf(b) === i &&
              task.files.every((f) => f.content.buffer !== b || f.content.byteLength === b.byteLength),
          );
        return await piscina.run(task, { transferList });
      } catch (err) {
        if (err instanceof Error && /queue is at limit/i.test(err.message)) throw busy();
        throw err;
      } finally {
        running--;
        give(organizationId);
      }
    },
    pending: () => ({
      running,
      waiting: [...turns.values()].reduce((n, t) => n + t.waiting.length, 0) + piscina.queueSize,
    }),
    pendingFor: (organizationId) => {
      const turn = turns.get(organizationId);
      return { reading: turn?.running ?? 0, waiting: turn?.waiting.length ?? 0 };
    },
    async close() {
      await piscina.destroy();
    },
  };
}
