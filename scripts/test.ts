/**
 * `npm test`: every set-up step, then every suite, then one closing line
 * `N passed, N failed`. Starts a throwaway PostgreSQL on a free loopback port in
 * a temporary folder, and stops everything it started, also on failure.
 */
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { chmodSync, existsSync, mkdtempSync, readdirSync, rmSync, type Dirent } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { randomBytes } from 'node:crypto';
import { createDb } from '../server/db';
import { migrateLatest, rollbackAll } from '../server/migrate';
import { ensurePostgresInstalled, isRoot, PgCluster } from './pg-cluster';

interface Tally {
  suite: string;
  passed: number;
  failed: number;
}
const tallies: Tally[] = [];
const children: ChildProcess[] = [];
let cluster: PgCluster | undefined;
let tempDir: string | undefined;
const log = (s: string) => console.log(s);
const only = process.env['TEST_ONLY']?.split(',');
const wanted = (suite: string) => !only || only.includes(suite);

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = createServer();
    srv.once('error', reject);
    srv.listen(0, '127.0.0.1', () => {
      const { port } = srv.address() as { port: number };
      srv.close(() => resolve(port));
    });
  });
}

function teardown(): void {
  for (const child of children) if (child.exitCode === null) child.kill('SIGKILL');
  try {
    cluster?.stop('immediate');
  } catch {
    /* already down */
  }
  if (tempDir) rmSync(tempDir, { recursive: true, force: true });
  tempDir = undefined;
}
process.on('SIGINT', () => {
  teardown();
  process.exit(130);
});
process.on('SIGTERM', () => {
  teardown();
  process.exit(143);
});

/** Runs a command, echoing its output, and returns the output and the exit code. */
function run(
  cmd: string,
  args: string[],
  env: NodeJS.ProcessEnv = process.env,
): Promise<{ code: number; out: string }> {
  return new Promise((resolve) => {
    const child = spawn(cmd, args, { env, stdio: ['ignore', 'pipe', 'pipe'] });
    children.push(child);
    let out = '';
    child.stdout.on('data', (d: Buffer) => {
      out += d.toString();
      process.stdout.write(d);
    });
    child.stderr.on('data', (d: Buffer) => {
      out += d.toString();
      process.stderr.write(d);
    });
    child.on('close', (code) => resolve({ code: code ?? 1, out }));
  });
}

/** A check that counts as one test: passes when the command exits 0. */
async function check(suite: string, cmd: string, args: string[], env?: NodeJS.ProcessEnv): Promise<void> {
  if (!wanted(suite)) return;
  log(`\n━━ ${suite}`);
  const { code } = await run(cmd, args, env);
  tallies.push({ suite, passed: code === 0 ? 1 : 0, failed: code === 0 ? 0 : 1 });
}

/** node:test suites: counts are read from the TAP summary. */
async function nodeTests(suite: string, files: string[], env: NodeJS.ProcessEnv): Promise<void> {
  if (!wanted(suite)) return;
  log(`\n━━ ${suite}`);
  if (files.length === 0) {
    tallies.push({ suite, passed: 0, failed: 1 });
    log(`no test files for ${suite}`);
    return;
  }
  const { code, out } = await run(
    process.execPath,
    ['--import', 'tsx', '--test', '--test-concurrency=1', '--test-reporter=tap', ...files],
    env,
  );
  const passed = Number(/^# pass (\d+)/m.exec(out)?.[1] ?? 0);
  const failed = Number(/^# fail (\d+)/m.exec(out)?.[1] ?? 0) + Number(/^# cancelled (\d+)/m.exec(out)?.[1] ?? 0);
  // A crash before the summary still counts as a failure.
  tallies.push({ suite, passed, failed: code !== 0 && failed === 0 ? 1 : failed });
}

function testFiles(dir: string, suffix: string): string[] {
  const out: string[] = [];
  const walk = (d: string) => {
    for (const entry of readdirSyncSafe(d)) {
      const p = path.join(d, entry.name);
      if (entry.isDirectory()) walk(p);
      else if (entry.name.endsWith(suffix)) out.push(p);
    }
  };
  walk(dir);
  const filter = process.env['TEST_FILES'];
  return out.filter((f) => !filter || new RegExp(filter).test(f)).sort();
}
function readdirSyncSafe(d: string): Dirent[] {
  return existsSync(d) ? readdirSync(d, { withFileTypes: true }) : [];
}

function ensureChromium(): void {
  if (existsSync('/usr/bin/chromium')) return;
  if (!isRoot) throw new Error('Chromium is missing: run `sudo apt-get install -y chromium` once.');
  log('» Installing Chromium from Debian packages…');
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  spawnSync('apt-get', ['update', '-qq'], { stdio: 'inherit', env });
  const r = spawnSync('apt-get', ['install', '-y', '-qq', 'chromium'], { stdio: 'inherit', env });
  if (r.status !== 0) throw new Error('apt-get install chromium failed');
}

async function main(): Promise<number> {
  const started = Date.now();
  const bin = ensurePostgresInstalled(log);
  ensureChromium();

  tempDir = mkdtempSync(path.join(tmpdir(), 'tailroom-test-'));
  chmodSync(tempDir, 0o755); // the postgres user must traverse it
  const pgPort = await freePort();
  cluster = new PgCluster(path.join(tempDir, 'pg'), pgPort, randomBytes(18).toString('base64url'), bin);
  cluster.init({ throwaway: true });
  cluster.start();
  log(`» Throwaway PostgreSQL on 127.0.0.1:${pgPort}`);
  await cluster.createDatabase('tailroom_api');
  await cluster.createDatabase('tailroom_e2e');

  // Migrations: up, all the way down, and up again.
  if (wanted('migrations')) {
    log('\n━━ migrations');
    const db = createDb(cluster.url('tailroom_api'));
    try {
      const up = await migrateLatest(db);
      const down = await rollbackAll(db);
      const again = await migrateLatest(db);
      const ok = up.length > 0 && down.length === up.length && again.length === up.length;
      log(`up ${up.length}, down ${down.length}, up again ${again.length}`);
      tallies.push({ suite: 'migrations', passed: ok ? 1 : 0, failed: ok ? 0 : 1 });
    } catch (err) {
      console.error(err);
      tallies.push({ suite: 'migrations', passed: 0, failed: 1 });
    } finally {
      await db.destroy();
    }
  }
  for (const name of ['tailroom_api', 'tailroom_e2e']) {
    const db = createDb(cluster.url(name));
    await migrateLatest(db).finally(() => db.destroy());
  }

  const ng = ['node_modules/@angular/cli/bin/ng.js'];
  await check('typecheck', 'npm', ['run', '--silent', 'typecheck']);
  await check('lint', 'npm', ['run', '--silent', 'lint']);
  // Prettier's layout (120 columns) everywhere but prose: a Markdown file is written by people and by
  // `npm run bench -- --readme` / `npm run glossary:doc`.
  await check('format', 'npm', ['run', '--silent', 'format:check']);
  await nodeTests('api and engine', testFiles('tests', '.test.ts'), {
    ...process.env,
    DATABASE_URL: cluster.url('tailroom_api'),
  });

  if (wanted('client')) {
    log('\n━━ client (karma)');
    const { out, code } = await run(process.execPath, [...ng, 'test', '--watch=false'], {
      ...process.env,
      CHROME_BIN: '/usr/bin/chromium',
    });
    const total = /TOTAL: (?:(\d+) FAILED, )?(\d+) SUCCESS/.exec(out);
    const executed = [...out.matchAll(/Executed (\d+) of (\d+)(?: \((\d+) FAILED\))?/g)].pop();
    let passed = 0;
    let failed = 0;
    if (total) {
      failed = Number(total[1] ?? 0);
      passed = Number(total[2]);
    } else if (executed) {
      failed = Number(executed[3] ?? 0);
      passed = Number(executed[1]) - failed;
    }
    if (code !== 0 && failed === 0) failed = 1;
    tallies.push({ suite: 'client', passed, failed });
  }

  await check('build', process.execPath, [...ng, 'build']);

  if (wanted('e2e')) {
    if (!existsSync('dist/tailroom/browser/index.html')) {
      log('\n━━ e2e: skipped work because the build failed');
      tallies.push({ suite: 'e2e', passed: 0, failed: 1 });
    } else {
      await nodeTests('e2e', testFiles('e2e', '.e2e.ts'), {
        ...process.env,
        DATABASE_URL: cluster.url('tailroom_e2e'),
        CLIENT_DIST: path.resolve('dist/tailroom/browser'),
      });
    }
  }

  log('\n━━ summary');
  for (const t of tallies) log(`  ${t.suite.padEnd(16)} ${t.passed} passed, ${t.failed} failed`);
  log(`  (${Math.round((Date.now() - started) / 1000)} s)`);
  const passed = tallies.reduce((s, t) => s + t.passed, 0);
  const failed = tallies.reduce((s, t) => s + t.failed, 0);
  teardown();
  log(`${passed} passed, ${failed} failed`);
  return failed === 0 && passed > 0 ? 0 : 1;
}

main()
  .then((code) => process.exit(code))
  .catch((err: unknown) => {
    console.error(err);
    teardown();
    console.log(`0 passed, 1 failed`);
    process.exit(1);
  });
