import type { ErrorRequestHandler, Request, RequestHandler, Response } from 'express';
import { ZodError } from 'zod';
import { ConnectionError, DatabaseError } from 'sequelize';
import type { Logger } from 'pino';
import { HttpError } from './errors';

/** Turns a zod issue path into the field name shown beside the input: keys[3].time */
export function fieldPath(path: readonly PropertyKey[]): string {
  return path
    .map((p, i) => (typeof p === 'number' ? `[${p}]` : i === 0 ? String(p) : `.${String(p)}`))
    .join('') || '(body)';
}

export function zodFields(err: ZodError): Record<string, string> {
  const fields: Record<string, string> = {};
  for (const issue of err.issues) {
    const key = fieldPath(issue.path);
    fields[key] ??= issue.message;
  }
  return fields;
}

export const notFoundApi: RequestHandler = (req, res) => {
  res.status(404).json({ error: { code: 'not_found', message: `No API route ${req.method} ${req.path}.` } });
};

/**
 * PostgreSQL error classes that mean "the database is not there right now" (PostgreSQL documentation,
 * Appendix A: class 08 connection exception, 57P01–57P03 admin/crash shutdown and cannot connect now,
 * 53300 too many connections), and the socket errors node-postgres passes through.
 */
const DB_DOWN_CODES = new Set(['57P01', '57P02', '57P03', '53300', 'ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EPIPE', 'ENOTFOUND', 'EHOSTUNREACH']);
const DB_DOWN_MESSAGES = /Connection terminated|connection timeout|terminating connection|the database system is (starting up|shutting down)|Client has encountered a connection error|Connection terminated unexpectedly/i;

/** Whether `err` says the database cannot be reached (a Sequelize ConnectionError, or a pg/socket error). */
export function isDatabaseUnavailable(err: unknown): boolean {
  if (err instanceof ConnectionError) return true;
  for (let e: unknown = err, depth = 0; e && typeof e === 'object' && depth < 4; depth++) {
    const code = String((e as { code?: unknown }).code ?? '');
    if (DB_DOWN_CODES.has(code) || code.startsWith('08')) return true;
    if (e instanceof DatabaseError || e instanceof Error) {
      if (DB_DOWN_MESSAGES.test((e as Error).message)) return true;
    }
    e = (e as { parent?: unknown; original?: unknown; cause?: unknown }).parent ?? (e as { original?: unknown }).original ?? (e as { cause?: unknown }).cause;
  }
  return false;
}

/** Errors a response stream fails with when the client went away (Node stream and socket codes). */
const CLIENT_ABORT_CODES = new Set(['ERR_STREAM_PREMATURE_CLOSE', 'ECONNRESET', 'EPIPE']);

/**
 * An error after the status line and headers went out (a download the client abandoned mid-stream):
 * no error answer can be sent any more (it would throw ERR_HTTP_HEADERS_SENT), so the response is
 * destroyed, which closes the connection and tells the client the body is incomplete. A client abort is
 * logged at debug, anything else as an error. Returns false when headers were not sent yet.
 */
export function endAfterHeadersSent(err: unknown, req: Request, res: Response, logger: Logger): boolean {
  if (!res.headersSent) return false;
  const code = String((err as { code?: unknown })?.code ?? '');
  if (CLIENT_ABORT_CODES.has(code)) logger.debug({ code, method: req.method, path: req.path }, 'client aborted the response');
  else logger.error({ err, method: req.method, path: req.path }, 'error after the response headers were sent');
  res.destroy();
  return true;
}

export function errorMiddleware(logger: Logger): ErrorRequestHandler {
  return (err, req, res, _next) => {
    if (endAfterHeadersSent(err, req, res, logger)) return;
    if (isDatabaseUnavailable(err)) {
      logger.warn({ err: (err as Error)?.message, method: req.method, path: req.path }, 'database unavailable');
      res.set('Retry-After', '5');
      res.status(503).json({ error: { code: 'database_unavailable', message: 'The database cannot be reached right now, so the request was not carried out. Try again in a few seconds.' } });
      return;
    }
    if (err instanceof HttpError) {
      res.status(err.status).json({ error: { code: err.code, message: err.message, ...(err.fields ? { fields: err.fields } : {}) } });
      return;
    }
    if (err instanceof ZodError) {
      const fields = zodFields(err);
      const first = Object.entries(fields)[0];
      res.status(400).json({
        // schemas that already name the field in their message ("against: must be …") are not prefixed twice
        error: { code: 'invalid_request', message: first ? (first[1].startsWith(`${first[0]}: `) ? first[1] : `${first[0]}: ${first[1]}`) : 'Invalid request.', fields },
      });
      return;
    }
    // body-parser errors (malformed JSON, too large) carry status and type
    const status = typeof err?.status === 'number' ? err.status : typeof err?.statusCode === 'number' ? err.statusCode : 500;
    if (status >= 400 && status < 500) {
      const message =
        err?.type === 'entity.parse.failed'
          ? 'The request body is not valid JSON.'
          : err?.type === 'entity.too.large'
            ? 'The request body is too large.'
            : String(err?.message ?? 'Bad request.');
      res.status(status).json({ error: { code: err?.type === 'entity.too.large' ? 'too_large' : 'invalid_request', message } });
      return;
    }
    logger.error({ err, method: req.method, path: req.path }, 'unhandled error');
    res.status(500).json({ error: { code: 'internal', message: 'Something went wrong on the server. It has been logged.' } });
  };
}
