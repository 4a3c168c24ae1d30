/**
 * Refuses JSON bodies whose strings (or keys) PostgreSQL cannot store: the NUL character U+0000 (not
 * allowed in text or jsonb — PostgreSQL documentation, "Character Types" and "JSON Types") and lone
 * UTF-16 surrogates (JSON.parse accepts "\ud800", but it is no Unicode scalar value, RFC 8259 §8.2, and
 * jsonb refuses the escape). Such bodies used to pass validation and fail at the INSERT with a 500; they
 * are answered here with a 400 naming the field, before any route runs. The walk is iterative, so
 * deeply nested bodies cannot overflow the stack.
 */
import type { RequestHandler } from 'express';
import { badRequest } from './errors';
import { fieldPath } from './error-middleware';

const UNSTORABLE = /\u0000|[\ud800-\udbff](?![\udc00-\udfff])|(?<![\ud800-\udbff])[\udc00-\udfff]/;

export function firstUnstorablePath(body: unknown): (string | number)[] | null {
  const stack: [unknown, (string | number)[]][] = [[body, []]];
  while (stack.length) {
    const [v, path] = stack.pop()!;
    if (typeof v === 'string') {
      if (UNSTORABLE.test(v)) return path;
    } else if (Array.isArray(v)) {
      for (let i = v.length - 1; i >= 0; i--) stack.push([v[i], [...path, i]]);
    } else if (v && typeof v === 'object') {
      for (const [k, x] of Object.entries(v)) {
        if (UNSTORABLE.test(k)) return [...path, k.replace(/[\u0000\ud800-\udfff]/g, '?')];
        stack.push([x, [...path, k]]);
      }
    }
  }
  return null;
}

export const refuseUnstorableText: RequestHandler = (req, _res, next) => {
  const path = firstUnstorablePath(req.body);
  if (!path) return next();
  const field = fieldPath(path);
  const message = `${field}: must be plain Unicode text, without the NUL character (U+0000) or a lone surrogate`;
  throw badRequest(message, { [field]: message });
};
