import type { RequestHandler } from 'express';
import type { z } from 'zod';

/**
 * Validation at the edge with the shared zod schemas. The parsed value replaces
 * the raw one (req.body) or is kept on res.locals (query, params: Express 5 makes
 * req.query a getter). Errors reach the error middleware as ZodError → 400 with fields.
 */
export function validateBody<S extends z.ZodType>(schema: S): RequestHandler {
  return (req, _res, next) => {
    req.body = schema.parse(req.body ?? {});
    next();
  };
}

export function validateQuery<S extends z.ZodType>(schema: S): RequestHandler {
  return (req, res, next) => {
    res.locals.query = schema.parse(req.query ?? {});
    next();
  };
}
