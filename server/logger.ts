import { pino, type Logger } from 'pino';

export function createLogger(level: string): Logger {
  return pino({
    level,
    base: { service: 'tailroom' },
    redact: { paths: ['req.headers.cookie', 'password', '*.password', 'token'], remove: true },
  });
}
