/**
 * The one way the client talks to Tangentry's API: JSON in and out, cookies on the same origin,
 * and every failure turned into an {@link ApiError} that carries the HTTP status and the server's
 * JSON error body `{ error: { code, message, fields? } }` when there is one.
 */

/** Per-field messages from the server, keyed by field path (e.g. `"email"`, `"keys.3.time"`). */
export type ApiErrorFields = Record<string, string>;

/** The JSON error body the server sends with every 4xx/5xx. */
export interface ApiErrorBody {
  error: { code: string; message: string; fields?: ApiErrorFields };
}

/** Status 0 means the request never got an HTTP answer (network down, server not running). */
export const NETWORK_ERROR_STATUS = 0;

export class ApiError extends Error {
  override readonly name = 'ApiError';
  /** HTTP status, or {@link NETWORK_ERROR_STATUS} when no response arrived. */
  readonly status: number;
  /** The server's error code, or a client-side one: `network_error`, `bad_response`, `http_<status>`. */
  readonly code: string;
  readonly fields?: ApiErrorFields;
  /** The parsed JSON body of the failed response (whatever shape it had), if it was JSON. */
  readonly body: unknown;

  constructor(init: {
    status: number;
    code: string;
    message: string;
    fields?: ApiErrorFields;
    body?: unknown;
    cause?: unknown;
  }) {
    super(init.message, init.cause === undefined ? undefined : { cause: init.cause });
    this.status = init.status;
    this.code = init.code;
    this.fields = init.fields;
    this.body = init.body;
  }
}

export function isApiError(value: unknown): value is ApiError {
  return value instanceof ApiError;
}

function isErrorBody(value: unknown): value is ApiErrorBody {
  if (typeof value !== 'object' || value === null || !('error' in value)) return false;
  const error = (value as { error: unknown }).error;
  return (
    typeof error === 'object' &&
    error !== null &&
    typeof (error as { code?: unknown }).code === 'string' &&
    typeof (error as { message?: unknown }).message === 'string'
  );
}

export interface ApiRequestOptions {
  method?: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';
  /** Sent as JSON. */
  body?: unknown;
  headers?: Record<string, string>;
  signal?: AbortSignal;
}

/**
 * Sends a request to `path` (same origin, e.g. `/api/health`) and resolves with the parsed JSON body
 * of a 2xx response (`undefined` for 204). Rejects with an {@link ApiError} otherwise.
 */
export async function apiRequest<T = unknown>(path: string, options: ApiRequestOptions = {}): Promise<T> {
  const headers: Record<string, string> = { Accept: 'application/json', ...options.headers };
  if (options.body !== undefined) headers['Content-Type'] = 'application/json';

  let response: Response;
  try {
    response = await fetch(path, {
      method: options.method ?? 'GET',
      credentials: 'same-origin',
      headers,
      body: options.body === undefined ? undefined : JSON.stringify(options.body),
      signal: options.signal,
    });
  } catch (cause) {
    if (options.signal?.aborted) throw cause;
    throw new ApiError({
      status: NETWORK_ERROR_STATUS,
      code: 'network_error',
      message: `Could not reach the server for ${path}.`,
      cause,
    });
  }

  if (response.status === 204) return undefined as T;

  const text = await response.text();
  let body: unknown = undefined;
  let parsed = false;
  if (text.length > 0) {
    try {
      body = JSON.parse(text);
      parsed = true;
    } catch {
      parsed = false;
    }
  }

  if (response.ok) {
    if (!parsed) {
      throw new ApiError({
        status: response.status,
        code: 'bad_response',
        message: `The server's answer for ${path} was not JSON.`,
      });
    }
    return body as T;
  }

  if (isErrorBody(body)) {
    throw new ApiError({
      status: response.status,
      code: body.error.code,
      message: body.error.message,
      fields: body.error.fields,
      body,
    });
  }
  throw new ApiError({
    status: response.status,
    code: `http_${response.status}`,
    message: `${path} answered HTTP ${response.status}${response.statusText ? ` ${response.statusText}` : ''}.`,
    body: parsed ? body : undefined,
  });
}
