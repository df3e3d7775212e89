/**
 * The server under `npm start`'s supervisor: killed outright in the middle of a request, it is
 * replaced by the loaded standby and answers within 5 s, with every committed change and the signed-in session
 * still there and nothing of the cut-off request stored. A child that keeps failing is given up on.
 */
import assert from 'node:assert/strict';
import { spawn } from 'node:child_process';
import { createServer, request as httpRequest } from 'node:http';
import type { AddressInfo } from 'node:net';
import { after, before, describe, it } from 'node:test';
import request from 'supertest';
import { CSRF_HEADER, CSRF_HEADER_VALUE } from '../../shared/api/csrf';
import { projectListSchema } from '../../shared/projects/project-schemas';
import { startSmtpSink, type SmtpSink } from '../../server/fakes/smtp-sink';
import { supervise } from '../../scripts/supervise';
import { parseBody } from '../support/parse-body';
import { linkToken, PASSWORD, uniqueEmail } from '../support/test-app';

const freePort = () =>
  new Promise<number>((resolve) => {
    const s = createServer();
    s.listen(0, '127.0.0.1', () => {
      const { port } = s.address() as AddressInfo;
      s.close(() => resolve(port));
    });
  });

async function healthy(url: string): Promise<boolean> {
  try {
    return (await fetch(`${url}/api/health`)).ok;
  } catch {
    return false;
  }
}

let sink: SmtpSink;
before(async () => {
  sink = await startSmtpSink();
});
after(async () => {
  await sink.close();
});

describe('the supervisor', () => {
  it('replaces the server killed mid-request; it answers within 5 s and nothing committed is lost', async (context) => {
    const databaseUrl = process.env['DATABASE_URL'];
    if (!databaseUrl) throw new Error('DATABASE_URL is not set: run the tests through `npm test`');
    const port = await freePort();
    const url = `http://127.0.0.1:${port}`;
    const lines: string[] = [];
    const supervisor = supervise({
      name: 'server',
      standby: true,
      start: (standby) =>
        spawn(process.execPath, ['--import', 'tsx', 'server/main.ts', ...(standby ? ['--standby'] : [])], {
          env: {
            ...process.env,
            NODE_ENV: 'test',
            DATABASE_URL: databaseUrl,
            SESSION_SECRET: 'supervisor-test-session-secret-0123456789',
            PORT: String(port),
            PUBLIC_URL: url,
            LOG_LEVEL: 'silent',
            CLIENT_DIST: '',
            SMTP_PORT: String(sink.smtpPort),
          },
          stdio: ['ignore', 'ignore', 'ignore', 'ipc'],
        }),
      log: (line) => lines.push(line),
    });

    try {
      for (let i = 0; i < 1200 && !(await healthy(url)); i++) await new Promise((r) => setTimeout(r, 100));
      assert.ok(await healthy(url), 'the server came up');
      for (let i = 0; i < 1200 && !supervisor.standbyReady; i++) await new Promise((r) => setTimeout(r, 100));
      assert.ok(supervisor.standbyReady, 'the standby server is loaded');

      // An account, signed in, and a project: all committed before the kill.
      const agent = request.agent(url).set(CSRF_HEADER, CSRF_HEADER_VALUE);
      const email = uniqueEmail('supervised');
      const mail = sink.waitFor((m) => m.to.includes(email));
      await agent.post('/api/v1/auth/sign-up').send({ email, name: 'Supervised Person' }).expect(202);
      const signedIn = await agent
        .post(`/api/v1/auth/sign-ups/${linkToken((await mail).text, '/finish-sign-up/')}`)
        .send({ password: PASSWORD })
        .expect(201);
      const cookie = ((signedIn.headers['set-cookie'] as unknown as string[] | undefined) ?? [])
        .map((c) => c.split(';')[0])
        .join('; ');
      await agent.post('/api/v1/projects').send({ name: 'Kept house' }).expect(201);

      // A request whose body is still arriving when the process is killed.
      const first = supervisor.child;
      const body = JSON.stringify({ name: 'Half-sent house' });
      const cut = new Promise<string>((resolve) => {
        const req = httpRequest(
          {
            host: '127.0.0.1',
            port,
            method: 'POST',
            path: '/api/v1/projects',
            headers: {
              cookie,
              [CSRF_HEADER]: CSRF_HEADER_VALUE,
              'content-type': 'application/json',
              'content-length': Buffer.byteLength(body),
            },
          },
          (res) => resolve(`answered ${res.statusCode}`),
        );
        req.on('error', (err) => resolve(`cut: ${err.message}`));
        req.write(body.slice(0, 8));
      });
      await new Promise((r) => setTimeout(r, 200));
      const killedAt = Date.now();
      first.kill('SIGKILL');
      assert.match(await cut, /^cut: /);

      let backAfterMs = Infinity;
      while (Date.now() - killedAt < 15_000) {
        if (supervisor.child !== first && (await healthy(url))) {
          backAfterMs = Date.now() - killedAt;
          break;
        }
        await new Promise((r) => setTimeout(r, 50));
      }
      context.diagnostic(`serving again ${backAfterMs} ms after the kill`);
      assert.ok(backAfterMs < 5000, `back after ${backAfterMs} ms`);
      assert.equal(supervisor.restarts, 1);
      assert.ok(
        lines.some((l) => l.includes('server exited (SIGKILL); the standby takes over')),
        lines.join('\n'),
      );

      // The same session, the committed project, and nothing of the cut-off one.
      const projects = parseBody(projectListSchema, await agent.get('/api/v1/projects').expect(200));
      assert.deepEqual(
        projects.map((p) => p.name),
        ['Kept house'],
      );
    } finally {
      await supervisor.stop();
    }
  });

  it('gives up on a child that keeps failing, and says so once', async () => {
    const lines: string[] = [];
    const gaveUp = new Promise<number | null>((resolve) => {
      supervise({
        name: 'failing child',
        start: () => spawn(process.execPath, ['-e', 'process.exit(3)'], { stdio: 'ignore' }),
        log: (line) => lines.push(line),
        maxRestarts: 2,
        windowMs: 60_000,
        onGiveUp: resolve,
      });
    });
    assert.equal(await gaveUp, 3);
    assert.equal(lines.filter((l) => l.includes('; starting it again')).length, 2);
    assert.equal(lines.filter((l) => l.includes('not starting it again')).length, 1);
  });
});
