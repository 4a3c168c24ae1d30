/**
 * RFC 9457 problem details for /api/v1 only (the older /api routes keep `{ error: { code, message } }`).
 * Body members (RFC 9457 §3.1): type (a URI naming the problem type), title (short, the same for every
 * occurrence of the type), status, detail (this occurrence, for a person), instance (the request path);
 * extension members (§3.2): `code`, our stable machine-readable name, and `errors` per field when
 * validation fails. Media type application/problem+json (§6.1).
 */
import type { ErrorRequestHandler, RequestHandler, Response } from 'express';
import { ZodError } from 'zod';
import type { Logger } from 'pino';
import { HttpError } from '../http/errors';
import { endAfterHeadersSent, isDatabaseUnavailable, zodFields } from '../http/error-middleware';
import { PROBLEM_MEDIA_TYPE, type ProblemDto } from '../../shared/schemas/api-v1';

/** Titles per stable code; a code not listed here takes its status's title. */
const TITLES: Record<string, string> = {
  unauthenticated: 'Authentication required',
  forbidden: 'Not allowed',
  token_read_only: 'Service tokens are read-only',
  not_found: 'Not found',
  invalid_request: 'Invalid request',
  rate_limited: 'Too many requests',
  storage_unavailable: 'Storage unavailable',
  database_unavailable: 'Database unavailable',
  internal: 'Internal server error',
};
const STATUS_TITLES: Record<number, string> = { 400: 'Bad request', 401: 'Authentication required', 403: 'Not allowed', 404: 'Not found', 409: 'Conflict', 429: 'Too many requests', 500: 'Internal server error', 503: 'Service unavailable' };

/** The type URI: an anchor on the in-app API reference page, which lists every code. */
export function problemType(publicUrl: string, code: string): string {
  return `${publicUrl}/api-reference#problem-${code}`;
}

export function problem(publicUrl: string, status: number, code: string, detail: string, extra: { instance?: string; errors?: { field: string; detail: string }[] } = {}): ProblemDto {
  return {
    type: problemType(publicUrl, code),
    title: TITLES[code] ?? STATUS_TITLES[status] ?? 'Error',
    status,
    detail,
    code,
    ...(extra.instance ? { instance: extra.instance } : {}),
    ...(extra.errors && extra.errors.length ? { errors: extra.errors } : {}),
  };
}

export function sendProblem(res: Response, p: ProblemDto): void {
  res.status(p.status).type(PROBLEM_MEDIA_TYPE).set('Cache-Control', 'no-store').send(JSON.stringify(p));
}

const fieldsToErrors = (fields: Record<string, string>) => Object.entries(fields).map(([field, detail]) => ({ field, detail }));

/** Error handler mounted for /api/v1: every error becomes a problem detail. */
export function problemErrorHandler(publicUrl: string, logger: Logger): ErrorRequestHandler {
  return (err, req, res, _next) => {
    // a download the client abandoned: headers are out, so close the response instead of answering
    if (endAfterHeadersSent(err, req, res, logger)) return;
    const instance = req.originalUrl.split('?')[0];
    if (isDatabaseUnavailable(err)) {
      logger.warn({ err: (err as Error)?.message, method: req.method, path: req.path }, 'database unavailable');
      res.set('Retry-After', '5');
      return sendProblem(res, problem(publicUrl, 503, 'database_unavailable', 'The database cannot be reached right now, so the request was not carried out. Try again in a few seconds.', { instance }));
    }
    if (err instanceof HttpError) {
      return sendProblem(res, problem(publicUrl, err.status, err.code, err.message, { instance, errors: err.fields ? fieldsToErrors(err.fields) : undefined }));
    }
    if (err instanceof ZodError) {
      const errors = fieldsToErrors(zodFields(err));
      return sendProblem(res, problem(publicUrl, 400, 'invalid_request', errors[0]?.detail ?? 'Invalid request.', { instance, errors }));
    }
    const status = typeof err?.status === 'number' ? err.status : 500;
    if (status >= 400 && status < 500) return sendProblem(res, problem(publicUrl, status, 'invalid_request', String(err?.message ?? 'Bad request.'), { instance }));
    logger.error({ err, method: req.method, path: req.path }, 'unhandled error in /api/v1');
    sendProblem(res, problem(publicUrl, 500, 'internal', 'Something went wrong on the server. It has been logged.', { instance }));
  };
}

/** Unknown paths under /api/v1. */
export function problemNotFound(publicUrl: string): RequestHandler {
  return (req, res) => sendProblem(res, problem(publicUrl, 404, 'not_found', `No API route ${req.method} ${req.originalUrl.split('?')[0]}.`, { instance: req.originalUrl.split('?')[0] }));
}
