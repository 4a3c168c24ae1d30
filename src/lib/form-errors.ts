/**
 * Form errors beside the field: from the shared zod schema (checked in the browser before sending) and
 * from the server's `{ error: { fields } }` (which uses the same field names).
 */
import type { z } from 'zod';
import { isApiError } from './api-client';

export type FieldErrors = Record<string, string>;

/** Parses with the shared schema; returns the data or the first message per field. */
export function checkForm<S extends z.ZodType>(schema: S, value: unknown): { ok: true; data: z.output<S> } | { ok: false; fields: FieldErrors } {
  const r = schema.safeParse(value);
  if (r.success) return { ok: true, data: r.data };
  const fields: FieldErrors = {};
  for (const issue of r.error.issues) {
    const key = issue.path.map(String).join('.') || 'form';
    fields[key] ??= issue.message;
  }
  return { ok: false, fields };
}

/** The server's per-field messages, keyed like ours (`packSlugs[0]` → `packSlugs.0`). */
export function serverFields(error: unknown): FieldErrors {
  if (!isApiError(error) || !error.fields) return {};
  return Object.fromEntries(Object.entries(error.fields).map(([k, v]) => [k.replace(/\[(\d+)\]/g, '.$1'), v]));
}

/** The message to show above a form when the server refused without naming a field. */
export function formMessage(error: unknown): string | null {
  if (!error) return null;
  if (isApiError(error)) return error.message;
  return error instanceof Error ? error.message : 'Something went wrong.';
}
