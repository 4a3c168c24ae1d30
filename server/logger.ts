import { pino, type DestinationStream, type Logger } from 'pino';

/**
 * Paths pino must never print: secrets, cookies, tokens and passwords, wherever the app (or a library
 * error it logs) might carry them — request headers, bodies, a config object, a token row. pino's
 * redaction (fast-redact) matches `*` as one level, so the shapes we log are listed at each depth.
 */
const SECRET_KEYS = ['password', 'currentPassword', 'newPassword', 'passwordHash', 'password_hash', 'token', 'secret', 'tokenHash', 'token_hash', 'secretAccessKey', 'authorization', 'cookie'];

export const REDACT_PATHS = [
  'req.headers.authorization',
  'req.headers.cookie',
  'req.headers["x-api-key"]',
  'res.headers["set-cookie"]',
  'headers.authorization',
  'headers.cookie',
  'headers["set-cookie"]',
  ...SECRET_KEYS,
  ...SECRET_KEYS.map((k) => `*.${k}`),
  ...SECRET_KEYS.map((k) => `*.*.${k}`),
  'config.databaseUrl',
  'config.smtpUrl',
  'config.s3.secretAccessKey',
  'databaseUrl',
  'smtpUrl',
];

/** The app's logger; `destination` lets a test capture what would be written. */
export function createLogger(level: string = 'info', destination?: DestinationStream): Logger {
  const opts = { level, redact: { paths: REDACT_PATHS, censor: '[redacted]' }, base: { app: 'tangentry' } };
  return destination ? pino(opts, destination) : pino(opts);
}
