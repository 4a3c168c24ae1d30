/**
 * The local S3-compatible fake: a thin wrapper over s3rver 3.7.1, data kept in
 * a folder, listening on loopback. s3rver's default credentials are S3RVER/S3RVER.
 */
import { mkdirSync } from 'node:fs';
import S3rver from 's3rver';

export interface S3Fake {
  endpoint: string;
  accessKeyId: string;
  secretAccessKey: string;
  close(): Promise<void>;
}

export async function startS3Fake(opts: { directory: string; port?: number; bucket: string }): Promise<S3Fake> {
  mkdirSync(opts.directory, { recursive: true });
  const server = new S3rver({
    address: '127.0.0.1',
    port: opts.port ?? 0,
    silent: true,
    directory: opts.directory,
    configureBuckets: [{ name: opts.bucket, configs: [] }],
  });
  const addr = (await server.run()) as { port: number };
  return {
    endpoint: `http://127.0.0.1:${addr.port}`,
    accessKeyId: 'S3RVER',
    secretAccessKey: 'S3RVER',
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}
