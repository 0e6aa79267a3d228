// The object-storage adapter: S3 or any S3-compatible store, chosen by configuration alone.
// Streams files with multipart upload and hands out short-lived presigned GET URLs.
import { createReadStream } from 'node:fs';
import type { Readable } from 'node:stream';
import {
  S3Client,
  HeadBucketCommand,
  DeleteObjectsCommand,
  DeleteObjectCommand,
  ListObjectsV2Command,
  GetObjectCommand,
  PutObjectCommand,
} from '@aws-sdk/client-s3';
import { Upload } from '@aws-sdk/lib-storage';
import { getSignedUrl } from '@aws-sdk/s3-request-presigner';
import { config } from '../config';

export interface StorageSettings {
  endpoint: string | undefined;
  bucket: string;
  region: string;
  accessKeyId: string;
  secretAccessKey: string;
  forcePathStyle: boolean;
}

let settings: StorageSettings | null = null;
let client: S3Client | null = null;

function fromConfig(): StorageSettings {
  const c = config();
  return {
    endpoint: c.S3_ENDPOINT,
    bucket: c.S3_BUCKET,
    region: c.S3_REGION,
    accessKeyId: c.S3_ACCESS_KEY_ID,
    secretAccessKey: c.S3_SECRET_ACCESS_KEY,
    forcePathStyle: c.S3_FORCE_PATH_STYLE,
  };
}

/**
 * Points the adapter somewhere else: the local fake once it knows its port, or a test's own
 * fake S3. Later calls use a fresh client.
 */
export function configureStorage(change: Partial<StorageSettings>) {
  client?.destroy();
  client = null;
  settings = { ...(settings ?? fromConfig()), ...change };
}

export function storageSettings(): StorageSettings {
  settings ??= fromConfig();
  return settings;
}

/** True when objects go to the in-process fake (no S3_ENDPOINT configured). */
export const usesLocalFake = () => !config().S3_ENDPOINT;

export function s3(): S3Client {
  if (client) return client;
  const s = storageSettings();
  if (!s.endpoint && usesLocalFake()) throw new Error('the local fake S3 has not started yet');
  client = new S3Client({
    endpoint: s.endpoint,
    region: s.region,
    forcePathStyle: s.forcePathStyle,
    credentials: { accessKeyId: s.accessKeyId, secretAccessKey: s.secretAccessKey },
    // Without these the SDK frames streamed bodies as aws-chunked with trailing checksums,
    // which S3-compatible stores such as s3rver store corrupted (STACK-NOTES "Fake S3").
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
    // A store that is down should fail the request quickly, not hang the person's upload.
    maxAttempts: 2,
    requestHandler: { connectionTimeout: 3000, requestTimeout: 120_000 },
  });
  return client;
}

const bucket = () => storageSettings().bucket;

/**
 * Streams a file from disk into the store with multipart upload: 8 MiB parts, 3 in flight, so
 * at most ~24 MiB of a file is in memory whatever its size.
 */
export async function putFile(key: string, file: string, contentType: string): Promise<void> {
  const upload = new Upload({
    client: s3(),
    params: { Bucket: bucket(), Key: key, Body: createReadStream(file), ContentType: contentType },
    partSize: 8 * 1024 * 1024,
    queueSize: 3,
    leavePartsOnError: false,
  });
  await upload.done();
}

export interface StreamUpload {
  key: string;
  done: Promise<void>;
  /** Stops a multipart upload in progress (its parts are discarded) and removes a finished object. */
  abort: () => Promise<void>;
}

/** Starts a multipart upload that reads `body` as it arrives (same part size and queue as putFile). */
export function putStream(key: string, body: Readable, contentType: string): StreamUpload {
  const upload = new Upload({
    client: s3(),
    params: { Bucket: bucket(), Key: key, Body: body, ContentType: contentType },
    partSize: 8 * 1024 * 1024,
    queueSize: 3,
    leavePartsOnError: false,
  });
  const done = upload.done().then(() => undefined);
  done.catch(() => undefined); // the caller awaits it; never an unhandled rejection
  return {
    key,
    done,
    abort: async () => {
      await upload.abort().catch(() => undefined);
      await done.catch(() => undefined);
      await removeObject(key).catch(() => undefined);
    },
  };
}

export async function putBuffer(key: string, body: Buffer, contentType: string): Promise<void> {
  await s3().send(
    new PutObjectCommand({
      Bucket: bucket(),
      Key: key,
      Body: body,
      ContentType: contentType,
      ContentLength: body.length,
    }),
  );
}

export async function getStream(key: string): Promise<Readable> {
  const r = await s3().send(new GetObjectCommand({ Bucket: bucket(), Key: key }));
  return r.Body as Readable;
}

export async function removeObject(key: string): Promise<void> {
  await s3().send(new DeleteObjectCommand({ Bucket: bucket(), Key: key }));
}

/** Removes keys in batches of up to 1000 (the S3 limit per request). */
export async function removeObjects(keys: string[]): Promise<void> {
  for (let i = 0; i < keys.length; i += 1000) {
    const batch = keys.slice(i, i + 1000);
    if (!batch.length) continue;
    await s3().send(
      new DeleteObjectsCommand({ Bucket: bucket(), Delete: { Objects: batch.map((Key) => ({ Key })), Quiet: true } }),
    );
  }
}

/** Every object key under `prefix`, page by page. */
export async function* listKeys(prefix = ''): AsyncGenerator<{ key: string; size: number; lastModified?: Date }> {
  let token: string | undefined;
  do {
    const r = await s3().send(new ListObjectsV2Command({ Bucket: bucket(), Prefix: prefix, ContinuationToken: token }));
    for (const o of r.Contents ?? []) if (o.Key) yield { key: o.Key, size: o.Size ?? 0, lastModified: o.LastModified };
    token = r.IsTruncated ? r.NextContinuationToken : undefined;
  } while (token);
}

/** A short-lived GET URL; the store answers it with our Content-Disposition and type. */
export async function presignGet(
  key: string,
  opts: { expiresIn: number; disposition?: string; contentType?: string },
): Promise<string> {
  return getSignedUrl(
    s3(),
    new GetObjectCommand({
      Bucket: bucket(),
      Key: key,
      ResponseContentDisposition: opts.disposition,
      ResponseContentType: opts.contentType,
    }),
    { expiresIn: opts.expiresIn },
  );
}

/** The health check: can we reach the bucket? */
export async function bucketReachable(): Promise<boolean> {
  await s3().send(new HeadBucketCommand({ Bucket: bucket() }));
  return true;
}
