import { S3Client, HeadBucketCommand, CreateBucketCommand } from '@aws-sdk/client-s3';
import type { Config } from '../config';

/**
 * The S3 client for the library bucket. forcePathStyle and checksum settings
 * WHEN_REQUIRED are needed for S3-compatible stores such as s3rver: with the
 * SDK's default flexible checksums, streamed uploads are silently corrupted there.
 */
export function createS3Client(s3: Config['s3']): S3Client {
  return new S3Client({
    endpoint: s3.endpoint,
    region: s3.region,
    forcePathStyle: s3.forcePathStyle,
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
    credentials:
      s3.accessKeyId && s3.secretAccessKey ? { accessKeyId: s3.accessKeyId, secretAccessKey: s3.secretAccessKey } : undefined,
    maxAttempts: 2,
  });
}

/** Create the bucket when it is missing (embedded fake, or a fresh real bucket we may create). */
export async function ensureBucket(client: S3Client, bucket: string): Promise<void> {
  try {
    await client.send(new HeadBucketCommand({ Bucket: bucket }));
  } catch {
    await client.send(new CreateBucketCommand({ Bucket: bucket }));
  }
}
