/**
 * Hostile files and paths: a compressed file that unpacks far past the limit ("zip bomb"), an upload
 * that declares more than the limit, file names that claim folders, and paths that try to climb out
 * of the served client folder. Each is refused (or reduced to its base name) and nothing is stored.
 */
import assert from 'node:assert/strict';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { request as httpRequest } from 'node:http';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { after, describe, it } from 'node:test';
import { gzipSync } from 'node:zlib';
import request from 'supertest';
import { CLIMATE_UPLOAD_MAX_BYTES, climateSiteSchema } from '../../shared/climate/climate-schemas';
import { DEMO_SITES, generateDemoSeries, seriesToCsv } from '../../shared/climate/demo-weather';
import { baseName } from '../../server/modules/climate/uploads-service';
import { parseBody } from '../support/parse-body';
import { createTestApp, PASSWORD, signUp, useTestApp } from '../support/test-app';

const t = useTestApp();
const csv = seriesToCsv(generateDemoSeries(DEMO_SITES[0]!, { years: 2, endYear: 2023 }));
const count = async (table: string) => (await t.db(table).count<{ n: number }[]>('* as n'))[0]?.n;

async function hourlySite(agent: request.Agent): Promise<string> {
  const res = await agent
    .post('/api/v1/climate-sites')
    .send({ name: 'Hostile files', sourceKind: 'hourly' })
    .expect(201);
  return parseBody(climateSiteSchema, res).id;
}

describe('hostile uploads', () => {
  it('refuses a compressed file that unpacks past the limit with 413, and stores nothing', async () => {
    const { agent } = await signUp(t);
    const siteId = await hourlySite(agent);
    // One byte over the limit once unpacked; about 60 kB packed.
    const bomb = gzipSync(Buffer.alloc(CLIMATE_UPLOAD_MAX_BYTES + 1, 0x41), { level: 9 });
    assert.ok(bomb.length < 200_000, `${bomb.length} bytes packed`);
    const res = await agent
      .post(`/api/v1/climate-sites/${siteId}/uploads`)
      .attach('files', bomb, 'weather.csv.gz')
      .expect(413);
    assert.equal(res.body.error.code, 'file_too_large');
    assert.match(res.body.error.message, /unpacks to more than 60 MB/);
    assert.equal(await count('climate_uploads'), 0);
  });

  it('refuses many small compressed files that together unpack past the upload limit', async () => {
    const { agent } = await signUp(t);
    const siteId = await hourlySite(agent);
    // Five files of 55 MB unpacked each: each within the per-file limit, together over 240 MB.
    const part = gzipSync(Buffer.alloc(55 * 1024 * 1024, 'not weather\n'), { level: 9 });
    let req = agent.post(`/api/v1/climate-sites/${siteId}/uploads`);
    for (let i = 0; i < 5; i++) req = req.attach('files', part, `part-${i}.csv.gz`);
    const res = await req.expect(413);
    assert.equal(res.body.error.code, 'file_too_large');
    assert.match(res.body.error.message, /at most 240 MB of text unpacked/);
    assert.equal(await count('climate_uploads'), 0);
  });

  it('answers 413 before reading an upload that declares more than the limit', async () => {
    const { agent, email } = await signUp(t);
    const siteId = await hourlySite(agent);
    const signIn = await request(t.app).post('/api/v1/auth/sign-in').send({ email, password: PASSWORD }).expect(200);
    const cookie = ((signIn.headers['set-cookie'] as unknown as string[] | undefined) ?? [])
      .map((c) => c.split(';')[0])
      .join('; ');
    const server = t.app.listen(0, '127.0.0.1');
    try {
      await new Promise<void>((resolve) => server.once('listening', () => resolve()));
      const { port } = server.address() as AddressInfo;
      const status = await new Promise<number>((resolve, reject) => {
        const req = httpRequest(
          {
            host: '127.0.0.1',
            port,
            method: 'POST',
            path: `/api/v1/climate-sites/${siteId}/uploads`,
            headers: {
              cookie,
              'x-requested-with': 'tailroom',
              'content-type': 'multipart/form-data; boundary=x',
              'content-length': String(200 * 1024 * 1024),
            },
          },
          (res) => {
            res.resume();
            resolve(res.statusCode ?? 0);
            req.destroy();
          },
        );
        req.on('error', (err) => (err.message.includes('socket hang up') ? undefined : reject(err)));
        // Only the headers and a first chunk are sent: the answer must not wait for the other 200 MB.
        req.write('--x\r\n');
        setTimeout(() => {
          req.destroy();
          reject(new Error('no answer within 10 s: the server waited for the body'));
        }, 10_000).unref();
      });
      assert.equal(status, 413);
    } finally {
      server.closeAllConnections();
      await new Promise<void>((resolve) => server.close(() => resolve()));
    }
    assert.equal(await count('climate_uploads'), 0);
  });

  it('keeps only the base name of an uploaded file, whatever folders it claims', async () => {
    const { agent } = await signUp(t);
    const siteId = await hourlySite(agent);
    const cases: [string, string][] = [
      ['../../../etc/passwd.csv', 'passwd.csv'],
      ['C:\\temp\\..\\station.csv', 'station.csv'],
      ['line\r\nbreak.csv', 'linebreak.csv'],
    ];
    for (const [claimed, shown] of cases) {
      const res = await agent
        .post(`/api/v1/climate-sites/${siteId}/uploads`)
        .attach('files', Buffer.from(csv), claimed);
      assert.equal(res.status, 201, `${claimed}: ${JSON.stringify(res.body)}`);
      assert.equal(res.body.fileName, shown, claimed);
    }
    // Names a multipart parser may pass through as they are.
    assert.equal(baseName('..'), 'upload');
    assert.equal(baseName('a/b/.'), 'upload');
    assert.equal(baseName('x'.repeat(500)).length, 200);
    const stored = await t.db('climate_uploads').pluck('file_name');
    assert.ok(
      stored.every((n: string) => !n.includes('/') && !n.includes('\\')),
      stored.join(' | '),
    );
  });
});

describe('paths outside the served client', () => {
  const dist = mkdtempSync(path.join(tmpdir(), 'tailroom-dist-'));
  writeFileSync(path.join(dist, 'index.html'), '<!doctype html><title>Tailroom</title>');
  writeFileSync(path.join(dist, 'main.js'), 'console.log("client")');
  after(() => rmSync(dist, { recursive: true, force: true }));

  it('never serves a file from outside the client folder, however the path is written', async () => {
    const served = await createTestApp({ CLIENT_DIST: dist });
    try {
      await request(served.app).get('/main.js').expect(200, 'console.log("client")');
      const secret = 'SESSION_SECRET';
      for (const p of [
        '/../package.json',
        '/%2e%2e/%2e%2e/package.json',
        '/..%2f..%2fpackage.json',
        '/%2e%2e%5c%2e%2e%5cpackage.json',
        '/main.js/../../package.json',
        '/....//....//etc/passwd',
      ]) {
        const res = await request(served.app).get(p);
        const body = res.text ?? '';
        assert.ok(
          !body.includes('"dependencies"') && !body.includes('root:') && !body.includes(secret),
          `${p} → ${res.status}`,
        );
        assert.ok(
          res.status === 200 ? body.includes('<title>Tailroom</title>') : res.status >= 400 && res.status < 500,
          `${p} → ${res.status}`,
        );
      }
      // Ids in API paths are checked as ids: a path-like id is a 4xx, not a file.
      const { agent } = await signUp(served);
      for (const id of ['..%2F..%2Fpackage.json', '%2e%2e', 'a'.repeat(300)]) {
        const res = await agent.get(`/api/v1/projects/${id}`);
        assert.ok(res.status >= 400 && res.status < 500, `${id} → ${res.status}`);
      }
    } finally {
      await served.close();
    }
  });
});

/** A gzip of about 125 kB that unpacks to about 50 MB of one repeated CSV row, with a bad last line. */
function bigRefusedUpload(): Buffer {
  const row = '2021-01-01T00:00Z,-5.0\n';
  const rows = Math.ceil((50 * 1024 * 1024) / row.length);
  return gzipSync(
    Buffer.concat([
      Buffer.from('time,dry_bulb_c\n'),
      Buffer.alloc(rows * row.length, row),
      Buffer.from('2021-01-01T01:00Z,warm\n'),
    ]),
    { level: 9 },
  );
}

describe('a large upload being read', () => {
  it('leaves the server answering others while it is read, and a second one of the organisation waits its turn', async () => {
    const { agent } = await signUp(t);
    const siteId = await hourlySite(agent);
    const gz = bigRefusedUpload();
    assert.ok(gz.length < 200_000, `${gz.length} bytes packed`);
    const send = () =>
      agent
        .post(`/api/v1/climate-sites/${siteId}/uploads`)
        .attach('files', gz, 'big.csv.gz')
        .then((res) => res);
    let answered = 0;
    const first = send().finally(() => answered++);
    const second = send().finally(() => answered++);

    // Ask for /api/health, one request after another, until both uploads are answered; note each
    // answer that came while a file was being read in the upload pool, and whether one was waiting.
    let healthDuringParse = 0;
    let sawWaiting = false;
    let healthAnswers = 0;
    while (answered < 2) {
      const health = await request(t.app).get('/api/health');
      assert.equal(health.status, 200);
      healthAnswers++;
      const pending = t.uploadsPending();
      if (pending.running > 0 && answered < 2) healthDuringParse++;
      if (pending.waiting > 0) sawWaiting = true;
    }
    assert.ok(
      healthDuringParse > 0,
      `the server answered ${healthAnswers} health checks, none while a file was being read`,
    );
    assert.ok(sawWaiting, 'the second upload of the organisation waited for the first');

    for (const res of [await first, await second]) {
      assert.equal(res.status, 400, 'the bad last line refuses the whole file');
      assert.equal(res.body.error.code, 'invalid_file');
      assert.match(res.body.error.details[0].path, /^line \d+$/);
    }
    assert.deepEqual(t.uploadsPending(), { running: 0, waiting: 0 });
    assert.equal(await count('climate_uploads'), 0);
    // The pool is whole afterwards: a good file is read as before.
    await agent
      .post(`/api/v1/climate-sites/${siteId}/uploads`)
      .attach('files', Buffer.from(csv), 'good.csv')
      .expect(201);
  });
});
