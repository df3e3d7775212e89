/**
 * The server in a process of its own on a throwaway PostgreSQL, for the benchmarks (`npm run bench`,
 * `npm run load`): as in production, so that the load generator does not share its event loop.
 */
import { spawn } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { createServer } from 'node:http';
import type { AddressInfo } from 'node:net';

export function freePort(): Promise<number> {
  return new Promise((resolve) => {
    const s = createServer();
    s.listen(0, '127.0.0.1', () => {
      const { port } = s.address() as AddressInfo;
      s.close(() => resolve(port));
    });
  });
}

export async function waitForHealth(url: string): Promise<void> {
  const until = Date.now() + 60_000;
  for (;;) {
    try {
      if ((await fetch(url)).ok) return;
    } catch {
      // not listening yet
    }
    if (Date.now() > until) throw new Error(`the server did not answer ${url} within 60 s`);
    await new Promise((r) => setTimeout(r, 200));
  }
}

export interface ServerProcess {
  base: string;
  pid: number;
  stop(): Promise<void>;
}

/** `server/main.ts` on a free port against `databaseUrl`, answering /api/health. */
export async function startServerProcess(databaseUrl: string, nodeArgs: string[] = []): Promise<ServerProcess> {
  const port = await freePort();
  const env: NodeJS.ProcessEnv = {
    ...process.env,
    NODE_ENV: 'test',
    DATABASE_URL: databaseUrl,
    SESSION_SECRET: randomBytes(32).toString('hex'),
    PORT: String(port),
    LOG_LEVEL: 'silent',
  };
  const child = spawn(process.execPath, [...nodeArgs, '--import', 'tsx', 'server/main.ts'], {
    env,
    stdio: ['ignore', 'inherit', 'inherit'],
  });
  const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
  const base = `http://127.0.0.1:${port}`;
  await waitForHealth(`${base}/api/health`);
  return {
    base,
    pid: child.pid ?? 0,
    async stop() {
      // A load generator drops its connections at the end of a run; let the server finish what it was doing.
      await new Promise((r) => setTimeout(r, 1000));
      child.kill('SIGTERM');
      await exited;
    },
  };
}
