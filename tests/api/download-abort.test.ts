/**
 * A client that hangs up mid-download. The app listens on an ephemeral loopback port over the real
 * PostgreSQL and the S3 fake; a 12 MiB artifact is stored, node:http starts downloading it through
 * /api/v1 and destroys the request after the first chunk. The stream pipeline then rejects after the
 * headers went out: the error handlers must close the response (no second answer, which would throw
 * ERR_HTTP_HEADERS_SENT) and log a client abort at debug, and the server must go on answering.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createServer, get as httpGet, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { createHash, randomBytes } from 'node:crypto';
import { loadConfig } from '../../server/config';
import { createContext, closeContext, type AppContext } from '../../server/context';
import { createApp } from '../../server/app';
import { createLogger } from '../../server/logger';
import { ensureBucket } from '../../server/storage/s3-client';
import { seedDemoIfEmpty } from '../../server/seed/demo';
import { freshDatabaseUrl } from '../support/database';
import { createPerson, teamId, uniqueEmail } from '../support/accounts';
import { createToken } from '../../server/tokens/tokens.service';
import { getPack } from '../../server/packs/packs.service';
import { insertVersion } from '../../server/versions/versions.repository';
import { putContentAddressed } from '../../server/storage/content-store';

const SIZE = 12 * 1024 * 1024;

describe('a download the client abandons mid-stream', () => {
  let ctx: AppContext;
  let server: Server;
  let base = '';
  let token = '';
  let team = '';
  let sha = '';
  const logs: { level: number; msg: string; code?: string; err?: { message?: string; code?: string } }[] = [];

  beforeAll(async () => {
    const config = loadConfig({ ...process.env, NODE_ENV: 'test', LOG_LEVEL: 'debug', DATABASE_URL: await freshDatabaseUrl('download-abort'), PUBLIC_URL: 'http://127.0.0.1:3000', S3_BUCKET: `abort-${randomBytes(4).toString('hex')}` });
    ctx = createContext(config, createLogger('debug', { write: (line: string) => void logs.push(JSON.parse(line)) }));
    await ensureBucket(ctx.s3, config.s3.bucket);
    await seedDemoIfEmpty(ctx);
    team = await teamId('ui-motion');
    const adminId = await createPerson({ email: uniqueEmail('abort-admin'), password: 'abort password 1', teams: { 'ui-motion': 'admin' } });
    token = (await createToken(team, { name: 'build farm' }, adminId)).secret;
    const bytes = randomBytes(SIZE);
    sha = createHash('sha256').update(bytes).digest('hex');
    const big = await putContentAddressed(ctx.s3, config.s3.bucket, bytes, 'application/octet-stream');
    const src = await putContentAddressed(ctx.s3, config.s3.bucket, new TextEncoder().encode('{"curves":[]}'), 'application/json');
    const pack = await getPack({ kind: 'anonymous' }, team, 'menu-transitions');
    await insertVersion({
      packId: pack.id, changelog: 'Large.', proposedBy: adminId, curveCount: 0, source: { key: src.key, sha256: src.sha256, size: src.size }, bakeSummary: [],
      artifacts: [
        { profileName: null, format: 'source', fileName: 'source.json', mediaType: 'application/json', key: src.key, sha256: src.sha256, size: src.size },
        { profileName: 'Handheld', format: 'binary', fileName: 'handheld.bin', mediaType: 'application/octet-stream', key: big.key, sha256: big.sha256, size: big.size },
      ],
    });
    server = createServer(createApp(ctx));
    await new Promise<void>((r) => server.listen(0, '127.0.0.1', () => r()));
    base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  }, 120_000);
  afterAll(async () => {
    await new Promise((r) => server?.close(r));
    if (ctx) await closeContext(ctx);
  });

  const url = () => `${base}/api/v1/teams/${team}/packs/menu-transitions/versions/1/artifacts/handheld/binary`;
  const auth = () => ({ Authorization: `Bearer ${token}` });

  it('closes the response, logs a client abort at debug (no unhandled error, no ERR_HTTP_HEADERS_SENT) and answers the next request', async () => {
    const firstChunk = await new Promise<{ status: number; bytes: number }>((resolve, reject) => {
      const req = httpGet(url(), { headers: auth() }, (res) => {
        res.once('data', (chunk: Buffer) => {
          resolve({ status: res.statusCode ?? 0, bytes: chunk.length });
          req.destroy();
        });
      });
      req.on('error', (err) => {
        if (!req.destroyed) reject(err);
      });
    });
    expect(firstChunk.status).toBe(200);
    expect(firstChunk.bytes).toBeLessThan(SIZE);

    // the server notices the hang-up when its next write fails or the socket closes
    const deadline = Date.now() + 10_000;
    while (!logs.some((l) => l.msg === 'client aborted the response') && Date.now() < deadline) await new Promise((r) => setTimeout(r, 50));
    const abort = logs.find((l) => l.msg === 'client aborted the response');
    expect(abort, JSON.stringify(logs.filter((l) => l.level >= 40))).toBeDefined();
    expect(abort!.level).toBe(20); // pino debug
    expect(['ERR_STREAM_PREMATURE_CLOSE', 'ECONNRESET', 'EPIPE']).toContain(abort!.code);
    const text = JSON.stringify(logs);
    expect(text).not.toContain('ERR_HTTP_HEADERS_SENT');
    expect(logs.filter((l) => /unhandled error/.test(l.msg))).toEqual([]);
    expect(logs.filter((l) => l.level >= 50)).toEqual([]);

    // the server still answers: the whole artifact, byte for byte (SHA-256 by node:crypto)
    const whole = await fetch(url(), { headers: auth() });
    expect(whole.status).toBe(200);
    const body = new Uint8Array(await whole.arrayBuffer());
    expect(body.length).toBe(SIZE);
    expect(createHash('sha256').update(body).digest('hex')).toBe(sha);
    expect(whole.headers.get('etag')).toBe(`"${sha}"`);
  }, 60_000);
});
