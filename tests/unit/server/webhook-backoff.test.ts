import { describe, expect, it } from 'vitest';
import { DEFAULT_RETRY_SCHEDULE_SECONDS, maxAttempts, parseRetrySchedule, retryDelayMs } from '../../../server/webhooks/backoff';
import { loadConfig } from '../../../server/config';
import { isPrivateAddress, targetProblem } from '../../../server/webhooks/target-policy';

describe('webhook retry schedule', () => {
  it('the default waits 10 s, 1 min, 5 min, 30 min, 2 h, then gives up after the sixth attempt', () => {
    expect([1, 2, 3, 4, 5, 6].map((n) => retryDelayMs(n, DEFAULT_RETRY_SCHEDULE_SECONDS))).toEqual([10_000, 60_000, 300_000, 1_800_000, 7_200_000, null]);
    expect(maxAttempts(DEFAULT_RETRY_SCHEDULE_SECONDS)).toBe(6);
    // each wait is longer than the last (backoff), about ×6 per step
    const s = DEFAULT_RETRY_SCHEDULE_SECONDS;
    for (let i = 1; i < s.length; i++) expect(s[i]! / s[i - 1]!).toBeGreaterThanOrEqual(4);
  });

  it('a configured schedule, fractional seconds allowed; bad lists refused', () => {
    expect(parseRetrySchedule('0.2, 0.4')).toEqual([0.2, 0.4]);
    expect(retryDelayMs(2, [0.2, 0.4])).toBe(400);
    expect(retryDelayMs(3, [0.2, 0.4])).toBeNull();
    for (const bad of ['', '10,,60', '10,-1', 'ten', '0', Array(21).fill('1').join(',')]) expect(parseRetrySchedule(bad), bad).toBeNull();
    expect(() => retryDelayMs(0, [1])).toThrow(RangeError);
  });

  it('comes from WEBHOOK_RETRY_SCHEDULE, and a bad value names the variable', () => {
    const base = { DATABASE_URL: 'postgres://x@127.0.0.1/db' };
    expect(loadConfig(base).webhooks).toEqual({ pollMs: 2000, retryScheduleSeconds: [10, 60, 300, 1800, 7200], timeoutMs: 10_000, allowPrivateTargets: false });
    expect(loadConfig({ ...base, WEBHOOK_RETRY_SCHEDULE: '0.1,0.1', WEBHOOK_POLL_MS: '100', WEBHOOK_ALLOW_PRIVATE_TARGETS: 'true' }).webhooks).toEqual({ pollMs: 100, retryScheduleSeconds: [0.1, 0.1], timeoutMs: 10_000, allowPrivateTargets: true });
    expect(() => loadConfig({ ...base, WEBHOOK_RETRY_SCHEDULE: 'soon' })).toThrow(/WEBHOOK_RETRY_SCHEDULE/);
  });
});

describe('webhook target policy', () => {
  it('private, loopback and link-local addresses (RFC 1918, RFC 6890, RFC 4193)', () => {
    for (const ip of ['127.0.0.1', '10.1.2.3', '172.16.0.1', '172.31.255.255', '192.168.1.1', '169.254.169.254', '100.64.0.1', '0.0.0.0', '::1', 'fd00::1', 'fe80::1', '::ffff:127.0.0.1']) expect(isPrivateAddress(ip), ip).toBe(true);
    for (const ip of ['8.8.8.8', '172.32.0.1', '192.169.0.1', '2001:db8::1', '1.1.1.1']) expect(isPrivateAddress(ip), ip).toBe(false);
  });

  it('by default only https:// to public hosts; the flag allows http:// and loopback', () => {
    expect(targetProblem('https://builds.corvid-lantern.test/hooks', false)).toBeNull();
    expect(targetProblem('http://builds.corvid-lantern.test/hooks', false)).toMatch(/https/);
    expect(targetProblem('https://127.0.0.1:8443/hooks', false)).toMatch(/public address/);
    expect(targetProblem('https://localhost/hooks', false)).toMatch(/public address/);
    expect(targetProblem('https://[::1]/hooks', false)).toMatch(/public address/);
    expect(targetProblem('http://127.0.0.1:9999/hooks', true)).toBeNull();
  });
});
