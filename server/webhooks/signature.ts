/**
 * Webhook signatures: HMAC-SHA256 (RFC 2104 with SHA-256; test vectors RFC 4231 §4) over node:crypto.
 *
 * What is signed, exactly: the ASCII decimal Unix timestamp in seconds (the `Tangentry-Timestamp`
 * header), one full stop, then the request body's bytes as sent:
 *
 *     signed  = `${timestamp}.${body}`
 *     header  Tangentry-Signature: hex(HMAC-SHA256(key = UTF-8 bytes of the webhook secret, signed))
 *
 * Putting the timestamp inside the MAC lets a receiver refuse old deliveries (replay) without trusting
 * an unsigned header; `verifySignature` allows 5 minutes either way by default (common practice).
 */
import { createHmac, timingSafeEqual } from 'node:crypto';

/** HMAC-SHA256 of `data` under `key`, lower-case hex (64 digits). Strings are taken as UTF-8. */
export function hmacSha256Hex(key: string | Uint8Array, data: string | Uint8Array): string {
  return createHmac('sha256', key).update(data).digest('hex');
}

/** The exact bytes that are signed for a delivery: `${timestamp}.${body}`. */
export function signedContent(timestamp: number, body: string): string {
  return `${timestamp}.${body}`;
}

/** The value of the Tangentry-Signature header for a body sent at `timestamp` (Unix seconds). */
export function signDelivery(secret: string, timestamp: number, body: string): string {
  return hmacSha256Hex(secret, signedContent(timestamp, body));
}

export const DEFAULT_TOLERANCE_SECONDS = 300;

export type VerifyResult = { ok: true } | { ok: false; reason: 'malformed' | 'stale' | 'mismatch' };

/**
 * A receiver's check: the timestamp is a whole number of seconds within `toleranceSeconds` of `now`,
 * and the signature equals our HMAC, compared in constant time (crypto.timingSafeEqual over the raw
 * 32 bytes, so neither the position of the first wrong digit nor hex case leaks through timing).
 */
export function verifySignature(opts: {
  secret: string;
  body: string;
  timestamp: string | number;
  signature: string;
  now?: Date;
  toleranceSeconds?: number;
}): VerifyResult {
  const ts = typeof opts.timestamp === 'number' ? opts.timestamp : /^\d{1,12}$/.test(opts.timestamp) ? Number(opts.timestamp) : NaN;
  if (!Number.isInteger(ts) || !/^[0-9a-fA-F]{64}$/.test(opts.signature)) return { ok: false, reason: 'malformed' };
  const nowSeconds = Math.floor((opts.now ?? new Date()).getTime() / 1000);
  if (Math.abs(nowSeconds - ts) > (opts.toleranceSeconds ?? DEFAULT_TOLERANCE_SECONDS)) return { ok: false, reason: 'stale' };
  const expected = Buffer.from(signDelivery(opts.secret, ts, opts.body), 'hex');
  const given = Buffer.from(opts.signature, 'hex');
  return expected.length === given.length && timingSafeEqual(expected, given) ? { ok: true } : { ok: false, reason: 'mismatch' };
}
