/**
 * GET over the global fetch with what a build script needs: a timeout per attempt, retries with backoff on
 * network failures and 502/503/504, Retry-After on 429 (RFC 6585 §4, RFC 9110 §10.2.3: seconds or an
 * HTTP-date), redirects followed by hand so the bearer token is never sent to another origin (a presigned S3
 * URL carries its own signature), and RFC 9457 problem details turned into one-line messages and exit codes.
 */
import { EXIT, PullError } from './exit-codes';

export interface HttpDeps {
  fetch: typeof fetch;
  sleep: (ms: number) => Promise<void>;
}

export interface GetOptions {
  headers: Record<string, string>;
  timeoutMs: number;
  retries: number;
  /** What is being fetched, for messages: "channel shipping", "handheld.tgpk". */
  what: string;
}

export interface GetResult {
  status: number;
  headers: Headers;
  body: Uint8Array;
  /** The URL that answered (after redirects). */
  url: string;
}

const MAX_REDIRECTS = 5;
const RETRY_AFTER_CAP_MS = 30_000;
export const backoffMs = (attempt: number) => 300 * 3 ** attempt;

/** Retry-After as milliseconds: delay-seconds or an HTTP-date (RFC 9110 §10.2.3); null when absent or unreadable. */
export function retryAfterMs(value: string | null, now = Date.now()): number | null {
  if (value === null || value.trim() === '') return null;
  const v = value.trim();
  if (/^\d+$/.test(v)) return Number(v) * 1000;
  const at = Date.parse(v);
  return Number.isNaN(at) ? null : Math.max(0, at - now);
}

/** The reason of a failed fetch, from undici's `cause` (ECONNREFUSED, ENOTFOUND …) or the abort. */
function networkReason(err: unknown, timeoutMs: number): string {
  const e = err as { name?: string; message?: string; cause?: { code?: string; message?: string } };
  if (e?.name === 'TimeoutError' || e?.name === 'AbortError') return `no answer within ${timeoutMs / 1000} s`;
  return e?.cause?.code ?? e?.cause?.message ?? e?.message ?? String(err);
}

/** `code: detail` from an RFC 9457 problem (or the app's `{ error: { code, message } }`), else the status text. */
export function problemMessage(status: number, headers: Headers, body: Uint8Array): string {
  const type = headers.get('content-type') ?? '';
  if (/json/.test(type)) {
    try {
      const j = JSON.parse(new TextDecoder().decode(body)) as { code?: string; detail?: string; title?: string; error?: { code?: string; message?: string } };
      const code = j.code ?? j.error?.code;
      const detail = j.detail ?? j.error?.message ?? j.title;
      if (code || detail) return [code, detail].filter(Boolean).join(': ');
    } catch {
      /* not JSON after all: fall through */
    }
  }
  return `HTTP ${status}`;
}

/** The exit code and message for an answer that is neither 2xx nor 304. */
export function failureFor(what: string, r: GetResult): PullError {
  const text = problemMessage(r.status, r.headers, r.body);
  if (r.status === 401 || r.status === 403) return new PullError(EXIT.auth, `${what}: authentication failed (${r.status} ${text})`);
  if (r.status === 404) return new PullError(EXIT.notFound, `${what}: not found (404 ${text})`);
  if (r.status === 502 || r.status === 503 || r.status === 504) return new PullError(EXIT.network, `${what}: server unavailable (${r.status} ${text})`);
  if (r.status === 429) return new PullError(EXIT.other, `${what}: rate limited (429 ${text}); try again later`);
  return new PullError(EXIT.other, `${what}: unexpected answer ${r.status} (${text})`);
}

async function once(deps: HttpDeps, url: string, o: GetOptions): Promise<GetResult> {
  let current = new URL(url);
  const origin = current.origin;
  for (let hop = 0; ; hop++) {
    // same origin: every header; another origin (a presigned S3 URL): no Authorization, no If-None-Match
    // (S3's ETag is not our SHA-256)
    const headers = current.origin === origin ? o.headers : {};
    const res = await deps.fetch(current, { headers, redirect: 'manual', signal: AbortSignal.timeout(o.timeoutMs) });
    const location = res.headers.get('location');
    if ([301, 302, 303, 307, 308].includes(res.status) && location) {
      await res.body?.cancel();
      if (hop >= MAX_REDIRECTS) throw new PullError(EXIT.other, `${o.what}: more than ${MAX_REDIRECTS} redirects`);
      current = new URL(location, current);
      continue;
    }
    const body = new Uint8Array(await res.arrayBuffer());
    return { status: res.status, headers: res.headers, body, url: current.href };
  }
}

/** GET with retries; resolves to any answer that is not retried (the caller maps failures with failureFor). */
export async function get(deps: HttpDeps, url: string, o: GetOptions): Promise<GetResult> {
  for (let attempt = 0; ; attempt++) {
    const last = attempt >= o.retries;
    let r: GetResult;
    try {
      r = await once(deps, url, o);
    } catch (err) {
      if (err instanceof PullError) throw err;
      if (last) throw new PullError(EXIT.network, `${o.what}: network failure reaching ${new URL(url).origin} (${networkReason(err, o.timeoutMs)}) after ${attempt + 1} attempt${attempt ? 's' : ''}`);
      await deps.sleep(backoffMs(attempt));
      continue;
    }
    if (!last && r.status === 429) {
      await deps.sleep(Math.min(RETRY_AFTER_CAP_MS, retryAfterMs(r.headers.get('retry-after')) ?? backoffMs(attempt)));
      continue;
    }
    if (!last && (r.status === 502 || r.status === 503 || r.status === 504)) {
      await deps.sleep(backoffMs(attempt));
      continue;
    }
    return r;
  }
}
