/**
 * Content-addressed objects in the library bucket: the key is `sha256/<hex of the bytes>`, so identical
 * content is stored once. HeadObject first: an object already there with the same size is reused, not
 * uploaded again. The hex digest is also kept in the object's metadata (x-amz-meta-sha256).
 */
import { createHash } from 'node:crypto';
import { HeadObjectCommand, PutObjectCommand, GetObjectCommand, type S3Client } from '@aws-sdk/client-s3';
import type { Readable } from 'node:stream';

export interface StoredObject {
  key: string;
  sha256: string;
  size: number;
  /** true when the object was already in the bucket. */
  reused: boolean;
}

export const contentKey = (sha256Hex: string) => `sha256/${sha256Hex}`;

export function sha256Hex(bytes: Uint8Array): string {
  return createHash('sha256').update(bytes).digest('hex');
}

function isNotFound(err: unknown): boolean {
  const e = err as { name?: string; $metadata?: { httpStatusCode?: number } };
  return e?.name === 'NotFound' || e?.name === 'NoSuchKey' || e?.$metadata?.httpStatusCode === 404;
}

export async function putContentAddressed(s3: S3Client, bucket: string, bytes: Uint8Array, mediaType: string): Promise<StoredObject> {
  const sha256 = sha256Hex(bytes);
  const key = contentKey(sha256);
  try {
    const head = await s3.send(new HeadObjectCommand({ Bucket: bucket, Key: key }));
    if (head.ContentLength === bytes.length) return { key, sha256, size: bytes.length, reused: true };
  } catch (err) {
    if (!isNotFound(err)) throw err;
  }
  await s3.send(new PutObjectCommand({ Bucket: bucket, Key: key, Body: bytes, ContentType: mediaType, ContentLength: bytes.length, Metadata: { sha256 } }));
  return { key, sha256, size: bytes.length, reused: false };
}

/** The object's bytes as a stream, for downloads. */
export async function openObject(s3: S3Client, bucket: string, key: string): Promise<{ body: Readable; size: number | undefined }> {
  const r = await s3.send(new GetObjectCommand({ Bucket: bucket, Key: key }));
  return { body: r.Body as Readable, size: r.ContentLength };
}

/** The whole object, checked against the SHA-256 its key names (a corrupted object is an error, not data). */
export async function readContentAddressed(s3: S3Client, bucket: string, key: string): Promise<Uint8Array> {
  const r = await s3.send(new GetObjectCommand({ Bucket: bucket, Key: key }));
  const bytes = new Uint8Array(await r.Body!.transformToByteArray());
  const expected = key.startsWith('sha256/') ? key.slice('sha256/'.length) : null;
  if (expected && sha256Hex(bytes) !== expected) throw new Error(`stored object ${key} does not match its SHA-256`);
  return bytes;
}
