import { describe, expect, it } from 'vitest';
import { ConfigError, loadConfig } from '../../../server/config';

const base = { DATABASE_URL: 'postgres://u@127.0.0.1:5432/db' };

describe('loadConfig', () => {
  it('fills the embedded defaults', () => {
    const c = loadConfig(base);
    expect(c.port).toBe(3000);
    expect(c.publicUrl).toBe('http://127.0.0.1:3000');
    expect(c.s3.bucket).toBe('tangentry-library');
    expect(c.session.secureCookie).toBe(false);
  });

  it('PORT overrides, and an https PUBLIC_URL makes the session cookie Secure', () => {
    const c = loadConfig({ ...base, PORT: '8123', PUBLIC_URL: 'https://curves.corvid-lantern.test/' });
    expect(c.port).toBe(8123);
    expect(c.publicUrl).toBe('https://curves.corvid-lantern.test');
    expect(c.session.secureCookie).toBe(true);
  });

  it.each([
    [{ PORT: 'eighty' }, 'PORT'],
    [{ DATABASE_URL: 'mysql://x' }, 'DATABASE_URL'],
    [{ S3_BUCKET: 'ab' }, 'S3_BUCKET'],
    [{ S3_ENDPOINT: 'not a url' }, 'S3_ENDPOINT'],
    [{ SMTP_URL: 'http://mail' }, 'SMTP_URL'],
    [{ S3_ENDPOINT: 'http://127.0.0.1:4569' }, 'S3_ACCESS_KEY_ID'],
    [{ SESSION_TTL_HOURS: '0' }, 'SESSION_TTL_HOURS'],
  ])('a bad value stops start-up naming the variable: %o', (env, variable) => {
    let caught: unknown;
    try {
      loadConfig({ ...base, ...env });
    } catch (e) {
      caught = e;
    }
    expect(caught).toBeInstanceOf(ConfigError);
    expect((caught as ConfigError).problems.map((p) => p.variable)).toContain(variable);
    expect((caught as ConfigError).message).toContain(variable);
  });

  it('DATABASE_URL is required', () => {
    expect(() => loadConfig({})).toThrow(/DATABASE_URL/);
  });
});
