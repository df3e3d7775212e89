import { createApp } from './app';
import { loadConfig } from './config';
import { createDb } from './db';
import { createLogger } from './logger';
import { createMailer } from './mail/mailer';

const config = loadConfig();
const logger = createLogger(config.logLevel);
const db = createDb(config.databaseUrl, config.databasePoolMax);
const mailer = createMailer(config);
const tailroom = createApp({ config, db, mailer, logger });

const listen = () =>
  tailroom.app.listen(config.port, config.host, () => {
    logger.info({ url: config.publicUrl }, 'Tailroom is listening');
  });

// `--standby` (started by the supervisor with an IPC channel): load everything, then wait to be told
// to listen, so that a server that stops can be replaced at once rather than after a cold start.
const standby = process.argv.includes('--standby') && typeof process.send === 'function';
let server: ReturnType<typeof listen> | null = standby ? null : listen();
if (standby) {
  process.on('message', (message: unknown) => {
    if (
      server === null &&
      typeof message === 'object' &&
      message !== null &&
      (message as { type?: unknown }).type === 'listen'
    ) {
      server = listen();
      server.once('listening', () => process.send?.({ type: 'listening' }));
    }
  });
  // A standby whose supervisor is gone has no one to serve.
  process.on('disconnect', () => {
    if (server === null) process.exit(0);
  });
  process.send?.({ type: 'ready' });
}

let stopping = false;
function stop(signal: string) {
  if (stopping) return;
  stopping = true;
  logger.info({ signal }, 'stopping');
  const finish = () => {
    void Promise.all([db.destroy(), tailroom.close()]).finally(() => {
      mailer.close();
      process.exit(0);
    });
  };
  if (server === null) return finish();
  // Finish the requests in flight; close idle keep-alive connections so that nothing waits on them.
  server.close(finish);
  server.closeIdleConnections();
  setTimeout(() => {
    logger.warn('requests still running after 20 s; exiting');
    process.exit(1);
  }, 20_000).unref();
}
process.on('SIGINT', () => stop('SIGINT'));
process.on('SIGTERM', () => stop('SIGTERM'));

// Anything thrown outside a request's handling leaves the process in an unknown state: log it, stop
// taking requests and exit non-zero, so that the supervisor (`npm start`, or the host's) starts a clean one.
function fatal(kind: string, err: unknown) {
  logger.fatal({ err, kind }, 'unexpected failure; the server stops and is restarted');
  if (!stopping) {
    stopping = true;
    server?.close();
    server?.closeIdleConnections();
  }
  setTimeout(() => process.exit(70), 3000);
  void Promise.allSettled([db.destroy(), tailroom.close()]).finally(() => process.exit(70));
}
process.on('uncaughtException', (err) => fatal('uncaughtException', err));
process.on('unhandledRejection', (reason) => fatal('unhandledRejection', reason));
