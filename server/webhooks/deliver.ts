/**
 * One HTTP attempt of a delivery: POST the stored body with its signature headers, no redirects
 * followed, a timeout, and the time to the answer's status line measured.
 *
 * Headers sent:
 *   Content-Type: application/json
 *   User-Agent: Tangentry-Webhooks/1
 *   Tangentry-Delivery: <delivery id>      (differs on a redelivery; the body's `id` is the event's)
 *   Tangentry-Event: <event type>
 *   Tangentry-Timestamp: <Unix seconds>
 *   Tangentry-Signature: hex HMAC-SHA256(secret, `${timestamp}.${body}`)   (./signature.ts)
 */
import { signDelivery } from './signature';
import { resolvedTargetProblem } from './target-policy';

export const HEADERS = {
  delivery: 'Tangentry-Delivery',
  event: 'Tangentry-Event',
  timestamp: 'Tangentry-Timestamp',
  signature: 'Tangentry-Signature',
} as const;

export interface AttemptOutcome {
  statusCode: number | null;
  responseMs: number;
  error: string | null;
}

export async function postDelivery(opts: {
  url: string;
  secret: string;
  body: string;
  deliveryId: string;
  eventType: string;
  timeoutMs: number;
  allowPrivateTargets: boolean;
  now?: () => Date;
}): Promise<AttemptOutcome> {
  const refused = await resolvedTargetProblem(opts.url, opts.allowPrivateTargets);
  if (refused) return { statusCode: null, responseMs: 0, error: refused };
  const timestamp = Math.floor((opts.now?.() ?? new Date()).getTime() / 1000);
  const started = performance.now();
  try {
    const res = await fetch(opts.url, {
      method: 'POST',
      redirect: 'manual',
      signal: AbortSignal.timeout(opts.timeoutMs),
      headers: {
        'Content-Type': 'application/json',
        'User-Agent': 'Tangentry-Webhooks/1',
        [HEADERS.delivery]: opts.deliveryId,
        [HEADERS.event]: opts.eventType,
        [HEADERS.timestamp]: String(timestamp),
        [HEADERS.signature]: signDelivery(opts.secret, timestamp, opts.body),
      },
      body: opts.body,
    });
    const responseMs = Math.round(performance.now() - started);
    // the answer's body is not kept; release the connection
    await res.body?.cancel().catch(() => undefined);
    if (res.status >= 200 && res.status < 300) return { statusCode: res.status, responseMs, error: null };
    const why = res.status >= 300 && res.status < 400 ? ` (redirects are not followed)` : '';
    return { statusCode: res.status, responseMs, error: `The receiver answered ${res.status}${why}.` };
  } catch (err) {
    const responseMs = Math.round(performance.now() - started);
    const e = err as Error & { cause?: { code?: string; message?: string } };
    if (e.name === 'TimeoutError' || e.name === 'AbortError') return { statusCode: null, responseMs, error: `No answer within ${opts.timeoutMs} ms.` };
    return { statusCode: null, responseMs, error: `Could not deliver: ${e.cause?.code ?? e.cause?.message ?? e.message}.` };
  }
}
