import { pino, type Logger } from 'pino';

/** Paths pino must never print: secrets, cookies, tokens and passwords. */
export const REDACT_PATHS = [
  'req.headers.authorization',
  'req.headers.cookie',
  'res.headers["set-cookie"]',
  '*.password',
  '*.token',
  '*.secret',
  '*.secretAccessKey',
  'config.databaseUrl',
];

export function createLogger(level: string = 'info'): Logger {
  return pino({ level, redact: { paths: REDACT_PATHS, censor: '[redacted]' }, base: { app: 'tangentry' } });
}
