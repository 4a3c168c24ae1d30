import { describe, expect, it } from 'vitest';
import { createHmac } from 'node:crypto';
import { hmacSha256Hex, signDelivery, signedContent, verifySignature } from '../../../server/webhooks/signature';

/**
 * RFC 4231 §4.2–§4.8, test cases 1–7, HMAC-SHA-256 rows. The key and data bytes and the outputs are
 * recalled from memory of the RFC text, then compared digit for digit with several independent public
 * test suites that quote the same RFC (all agreed); case 5's output is truncated to 128 bits as in §4.6.
 */
const hex = (h: string) => Buffer.from(h, 'hex');
const ascii = (s: string) => Buffer.from(s, 'ascii');

const RFC4231 = [
  { section: '4.2 (test case 1)', key: hex('0b'.repeat(20)), data: ascii('Hi There'), mac: 'b0344c61d8db38535ca8afceaf0bf12b881dc200c9833da726e9376c2e32cff7' },
  { section: '4.3 (test case 2, key shorter than the output)', key: ascii('Jefe'), data: ascii('what do ya want for nothing?'), mac: '5bdcc146bf60754e6a042426089575c75a003f089d2739839dec58b964ec3843' },
  { section: '4.4 (test case 3)', key: hex('aa'.repeat(20)), data: hex('dd'.repeat(50)), mac: '773ea91e36800e46854db8ebd09181a72959098b3ef8c122d9635514ced565fe' },
  { section: '4.5 (test case 4)', key: hex('0102030405060708090a0b0c0d0e0f10111213141516171819'), data: hex('cd'.repeat(50)), mac: '82558a389a443c0ea4cc819899f2083a85f0faa3e578f8077a2e3ff46729665b' },
  { section: '4.7 (test case 6, 131-byte key hashed first)', key: hex('aa'.repeat(131)), data: ascii('Test Using Larger Than Block-Size Key - Hash Key First'), mac: '60e431591ee0b67f0d8a26aacbf5b77f8e0bc6213728c5140546040f0ee37f54' },
  {
    section: '4.8 (test case 7, long key and long data)',
    key: hex('aa'.repeat(131)),
    data: ascii('This is a test using a larger than block-size key and a larger than block-size data. The key needs to be hashed before being used by the HMAC algorithm.'),
    mac: '9b09ffa71b942fcb27635fbcd5b0e944bfdc63644f0713938a7f51535c3a35e2',
  },
];

describe('hmacSha256Hex against RFC 4231', () => {
  for (const v of RFC4231) {
    it(`§${v.section}`, () => {
      expect(hmacSha256Hex(v.key, v.data)).toBe(v.mac);
    });
  }

  it('§4.6 (test case 5): the first 128 bits', () => {
    // RFC 4231 §4.6: "Test With Truncation", key 20 × 0x0c, output truncated to 128 bits
    expect(hmacSha256Hex(hex('0c'.repeat(20)), ascii('Test With Truncation')).slice(0, 32)).toBe('a3b6167473100ee06e0c796c2955552b');
  });

  it('a string key is its UTF-8 bytes (how webhook secrets are used)', () => {
    expect(hmacSha256Hex('Jefe', 'what do ya want for nothing?')).toBe(RFC4231[1]!.mac);
  });
});

describe('delivery signatures', () => {
  const secret = 'whsec_test-secret-for-the-unit-test';
  const body = '{"id":"e1","type":"channel.moved","data":{"from":1,"to":2}}';
  const ts = 1_780_000_000;
  const now = new Date(ts * 1000);

  it('sign `${timestamp}.${body}`, the same as an independent createHmac call', () => {
    expect(signedContent(ts, body)).toBe(`1780000000.${body}`);
    expect(signDelivery(secret, ts, body)).toBe(createHmac('sha256', Buffer.from(secret, 'utf8')).update(`${ts}.${body}`, 'utf8').digest('hex'));
  });

  it('verifies a good signature, upper-case hex too', () => {
    const sig = signDelivery(secret, ts, body);
    expect(verifySignature({ secret, body, timestamp: String(ts), signature: sig, now })).toEqual({ ok: true });
    expect(verifySignature({ secret, body, timestamp: ts, signature: sig.toUpperCase(), now })).toEqual({ ok: true });
  });

  it('refuses a changed body, a changed timestamp, another secret and a one-digit change', () => {
    const sig = signDelivery(secret, ts, body);
    expect(verifySignature({ secret, body: body.replace('2}', '3}'), timestamp: ts, signature: sig, now })).toEqual({ ok: false, reason: 'mismatch' });
    expect(verifySignature({ secret, body, timestamp: ts + 1, signature: sig, now })).toEqual({ ok: false, reason: 'mismatch' });
    expect(verifySignature({ secret: `${secret}x`, body, timestamp: ts, signature: sig, now })).toEqual({ ok: false, reason: 'mismatch' });
    const flipped = (sig[63] === '0' ? sig.slice(0, 63) + '1' : sig.slice(0, 63) + '0');
    expect(verifySignature({ secret, body, timestamp: ts, signature: flipped, now })).toEqual({ ok: false, reason: 'mismatch' });
  });

  it('timestamp tolerance: 300 s either way by default, configurable; older or newer is stale', () => {
    const sig = signDelivery(secret, ts, body);
    const at = (dt: number) => new Date((ts + dt) * 1000);
    expect(verifySignature({ secret, body, timestamp: ts, signature: sig, now: at(300) }).ok).toBe(true);
    expect(verifySignature({ secret, body, timestamp: ts, signature: sig, now: at(-300) }).ok).toBe(true);
    expect(verifySignature({ secret, body, timestamp: ts, signature: sig, now: at(301) })).toEqual({ ok: false, reason: 'stale' });
    expect(verifySignature({ secret, body, timestamp: ts, signature: sig, now: at(-301) })).toEqual({ ok: false, reason: 'stale' });
    expect(verifySignature({ secret, body, timestamp: ts, signature: sig, now: at(61), toleranceSeconds: 60 })).toEqual({ ok: false, reason: 'stale' });
  });

  it('malformed input is refused without comparing: short, non-hex, or a non-numeric timestamp', () => {
    const sig = signDelivery(secret, ts, body);
    expect(verifySignature({ secret, body, timestamp: ts, signature: sig.slice(0, 62), now }).ok).toBe(false);
    expect(verifySignature({ secret, body, timestamp: ts, signature: `${sig.slice(0, 63)}g`, now })).toEqual({ ok: false, reason: 'malformed' });
    expect(verifySignature({ secret, body, timestamp: '17800e5', signature: sig, now })).toEqual({ ok: false, reason: 'malformed' });
    expect(verifySignature({ secret, body, timestamp: '', signature: sig, now })).toEqual({ ok: false, reason: 'malformed' });
  });
});
