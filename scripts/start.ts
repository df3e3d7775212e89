/**
 * `npm start`: every set-up step, then the product. PostgreSQL (on loopback, as
 * a non-root user), migrations, demo data, the client build, the local e-mail
 * sink and the server. Ctrl-C stops everything this started; data is kept in .data/. A server
 * that exits unexpectedly is started again (PostgreSQL and the rest keep running).
 */
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { createHash, randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, realpathSync, symlinkSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { createDb } from '../server/db';
import { migrateLatest } from '../server/migrate';
import { DEMO_ACCOUNTS, DEMO_ORGANIZATION, DEMO_PASSWORD, seedDemo } from '../server/seed/demo-seed';
import { ensurePostgresInstalled, PgCluster, reachableByPostgres } from './pg-cluster';
import { supervise, type Supervisor } from './supervise';

const log = (s: string) => console.log(s);
const repo = process.cwd();
const dataDir = path.join(repo, '.data');
const port = Number(process.env['PORT'] ?? 3000);
const pgPort = Number(process.env['PG_PORT'] ?? 54329);
const smtpPort = Number(process.env['SMTP_PORT'] ?? 2525);
const outboxPort = Number(process.env['OUTBOX_PORT'] ?? 2526);
const paymentsPort = Number(process.env['PAYMENTS_FAKE_PORT'] ?? 12111);

function secret(file: string, bytes: number): string {
  const p = path.join(dataDir, file);
  if (!existsSync(p)) writeFileSync(p, randomBytes(bytes).toString('base64url'), { mode: 0o600 });
  return readFileSync(p, 'utf8').trim();
}

/** The cluster's folder: .data/pg, or (as root, where the repo's parents are closed to `postgres`) a link to /var/lib. */
function clusterDir(): string {
  const inRepo = path.join(dataDir, 'pg');
  if (existsSync(inRepo)) return realpathSync(inRepo);
  if (reachableByPostgres(dataDir)) return inRepo;
  const outside = path.join('/var/lib/tailroom', createHash('sha256').update(repo).digest('hex').slice(0, 16));
  mkdirSync(outside, { recursive: true });
  symlinkSync(outside, inRepo);
  log(`» ${dataDir} is not reachable by the postgres user; the cluster lives in ${outside} (linked as .data/pg)`);
  return outside;
}

const children: ChildProcess[] = [];
let supervised: Supervisor | undefined;
let cluster: PgCluster | undefined;
let startedCluster = false;
let stopping = false;

function shutdown(code: number): void {
  if (stopping) return;
  stopping = true;
  log('\n» Stopping…');
  for (const child of children) child.kill('SIGTERM');
  void supervised?.stop(700);
  setTimeout(() => {
    if (cluster && startedCluster) {
      try {
        cluster.stop('fast');
        log('» PostgreSQL stopped (data kept in .data/pg)');
      } catch (err) {
        console.error(String(err));
      }
    }
    process.exit(code);
  }, 800);
}
process.on('SIGINT', () => shutdown(0));
process.on('SIGTERM', () => shutdown(0));

function startChild(name: string, args: string[], env: NodeJS.ProcessEnv): ChildProcess {
  const child = spawn(process.execPath, ['--import', 'tsx', ...args], { env, stdio: 'inherit' });
  child.on('exit', (code) => {
    if (!stopping) {
      console.error(`» ${name} exited (${code ?? 'signal'}); stopping the rest`);
      shutdown(1);
    }
  });
  children.push(child);
  return child;
}

async function main(): Promise<void> {
  mkdirSync(dataDir, { recursive: true });
  const bin = ensurePostgresInstalled(log);
  cluster = new PgCluster(clusterDir(), pgPort, secret('pg-password', 24), bin);
  if (!cluster.initialised) {
    log('» Creating the PostgreSQL cluster in .data/pg…');
    cluster.init();
  }
  if (cluster.isRunning()) {
    log('» PostgreSQL is already running for this folder; using it');
  } else {
    cluster.start();
    startedCluster = true;
    log(`» PostgreSQL listening on 127.0.0.1:${pgPort}`);
  }
  await cluster.createDatabase('tailroom');
  const databaseUrl = cluster.url('tailroom');

  const db = createDb(databaseUrl);
  try {
    const applied = await migrateLatest(db);
    log(applied.length ? `» Migrations applied: ${applied.length}` : '» Database schema is up to date');
    const { created } = await seedDemo(db);
    log(created ? '» Demo organisation created' : '» Demo organisation already present');
  } finally {
    await db.destroy();
  }

  log('» Building the client (ng build)…');
  const build = spawnSync(process.execPath, ['node_modules/@angular/cli/bin/ng.js', 'build'], { stdio: 'inherit' });
  if (build.status !== 0) throw new Error('the client build failed');

  const env: NodeJS.ProcessEnv = {
    ...process.env,
    NODE_ENV: 'development',
    PORT: String(port),
    DATABASE_URL: cluster.localUrl('tailroom'),
    SESSION_SECRET: secret('session-secret', 48),
    SMTP_HOST: '127.0.0.1',
    SMTP_PORT: String(smtpPort),
    DEV_OUTBOX_URL: `http://127.0.0.1:${outboxPort}`,
    CLIENT_DIST: path.join(repo, 'dist', 'tailroom', 'browser'),
    // The payment provider's SDK talks to the local fake (test keys only).
    STRIPE_API_HOST: '127.0.0.1',
    STRIPE_API_PORT: String(paymentsPort),
    STRIPE_API_PROTOCOL: 'http',
    // New on every start, never written down: the fake provider's signing secret and the Dev outbox's token.
    STRIPE_WEBHOOK_SECRET: `whsec_${randomBytes(24).toString('base64url')}`,
    DEV_OUTBOX_TOKEN: randomBytes(24).toString('base64url'),
  };
  startChild(
    'payment provider (fake)',
    ['server/fakes/payment-fake-main.ts', String(paymentsPort), `http://127.0.0.1:${port}/api/v1/billing/webhook`],
    env,
  );
  startChild('e-mail sink', ['server/fakes/smtp-sink-main.ts', String(smtpPort), String(outboxPort)], env);
  supervised = supervise({
    name: 'server',
    // A second server is kept loaded, so that one that stops is replaced at once.
    standby: true,
    start: (standby) =>
      standby
        ? spawn(process.execPath, ['--import', 'tsx', 'server/main.ts', '--standby'], {
            env,
            stdio: ['inherit', 'inherit', 'inherit', 'ipc'],
          })
        : spawn(process.execPath, ['--import', 'tsx', 'server/main.ts'], { env, stdio: 'inherit' }),
    log: (line) => console.error(line),
    onGiveUp: () => shutdown(1),
  });

  const url = `http://127.0.0.1:${port}`;
  for (let i = 0; i < 100 && !stopping; i++) {
    try {
      if ((await fetch(`${url}/api/health`)).ok) break;
    } catch {
      /* not up yet */
    }
    await new Promise((r) => setTimeout(r, 200));
  }
  if (supervised.child.exitCode === null) {
    log('');
    log(`  Tailroom is running at ${url}`);
    log(`  Demo sign-in (${DEMO_ORGANIZATION}, invented data):`);
    for (const a of DEMO_ACCOUNTS) log(`    ${a.role.padEnd(8)} ${a.email}`);
    log(`    password  ${DEMO_PASSWORD}`);
    log(
      `  Dev outbox (e-mails sent locally; this link holds a token new on every start): ${url}/dev/outbox?token=${env['DEV_OUTBOX_TOKEN'] ?? ''}`,
    );
    log(`  Payments: a local fake of the provider on 127.0.0.1:${paymentsPort}; test card 4242 4242 4242 4242`);
    log('  Press Ctrl-C to stop.');
    log('');
  }
}

main().catch((err: unknown) => {
  console.error(`» npm start failed: ${err instanceof Error ? err.message : String(err)}`);
  shutdown(1);
});
