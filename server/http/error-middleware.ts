import type { ErrorRequestHandler, RequestHandler } from 'express';
import { ZodError } from 'zod';
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

export function errorMiddleware(logger: Logger): ErrorRequestHandler {
  return (err, req, res, _next) => {
    if (err instanceof HttpError) {
      res.status(err.status).json({ error: { code: err.code, message: err.message, ...(err.fields ? { fields: err.fields } : {}) } });
      return;
    }
    if (err instanceof ZodError) {
      const fields = zodFields(err);
      const first = Object.entries(fields)[0];
      res.status(400).json({
        error: { code: 'invalid_request', message: first ? `${first[0]}: ${first[1]}` : 'Invalid request.', fields },
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
