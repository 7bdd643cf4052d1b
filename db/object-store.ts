/**
 * Raw capture files in S3-compatible object storage, through the AWS SDK v3: CAPTURE_STORE=s3://bucket/prefix
 * turns it on; the endpoint, region and credentials come from the SDK's usual variables (AWS_ENDPOINT_URL_S3 or
 * AWS_ENDPOINT_URL, AWS_REGION, AWS_ACCESS_KEY_ID, AWS_SECRET_ACCESS_KEY, or any other source the SDK's default
 * chain reads). Large files go up in parts (lib-storage) and come back as a stream. Objects are written once under
 * a new capture id and never overwritten, so several instances can share one bucket.
 */
import { Readable } from 'node:stream';
import { DeleteObjectsCommand, GetObjectCommand, HeadObjectCommand, ListObjectsV2Command, NotFound, PutObjectCommand, S3Client } from '@aws-sdk/client-s3';
import { Upload } from '@aws-sdk/lib-storage';
import { processShared } from './process-state.mjs';

export interface ObjectLocation {
  bucket: string;
  key: string;
}

/** The bucket and key prefix new captures go to, or null when captures stay in the database. */
export function captureStoreTarget(env: NodeJS.ProcessEnv = process.env): { bucket: string; prefix: string } | null {
  const value = env.CAPTURE_STORE?.trim();
  if (!value || value === 'database') return null;
  const m = /^s3:\/\/([a-z0-9][a-z0-9.-]{1,61}[a-z0-9])(?:\/(.*))?$/.exec(value);
  if (!m) throw new Error(`CAPTURE_STORE must be s3://bucket/prefix (or unset for the database); it is "${value}".`);
  const prefix = (m[2] ?? '').replace(/^\/+|\/+$/g, '');
  return { bucket: m[1], prefix: prefix ? `${prefix}/` : '' };
}

/** Where a new capture of a shop goes: s3://bucket/prefix/shopId/captureId. */
export function newCaptureUrl(target: { bucket: string; prefix: string }, shopId: string, captureId: string): string {
  return `s3://${target.bucket}/${target.prefix}${shopId}/${captureId}.txt`;
}

export function parseObjectUrl(url: string): ObjectLocation {
  const m = /^s3:\/\/([^/]+)\/(.+)$/.exec(url);
  if (!m) throw new Error(`Not an object address: ${url}`);
  return { bucket: m[1], key: m[2] };
}

const g = processShared<{ s3?: S3Client; s3DownUntil?: number }>('objectStore', () => ({}));

/** How long object storage may take to accept a connection, and stay silent during a request, before it fails. */
export const STORAGE_TIMEOUTS = { connectMs: 5_000, idleMs: 15_000 };
/** After a storage call failed only after the connect timeout (a silent endpoint), new requests fail at once for this long instead of each waiting out the timeouts. */
const DOWN_FOR_MS = 15_000;

/** Object storage did not answer (or refused): the routes answer 503 with this sentence. */
export class StorageUnavailableError extends Error {
  constructor(cause?: unknown) {
    super('The capture storage is not answering; try again in a minute. Nothing was changed.', { cause });
  }
}

/** The process's one S3 client. A custom endpoint (a local stand-in, MinIO, another provider) is addressed path-style. */
export function s3(): S3Client {
  const endpoint = process.env.AWS_ENDPOINT_URL_S3 || process.env.AWS_ENDPOINT_URL;
  return (g.s3 ??= new S3Client({
    region: process.env.AWS_REGION || process.env.AWS_DEFAULT_REGION || 'us-east-1',
    ...(endpoint ? { endpoint, forcePathStyle: true } : {}),
    // A stalled endpoint fails the request after 5 s (connect) or 15 s of silence (per attempt, two attempts), never minutes.
    requestHandler: { connectionTimeout: STORAGE_TIMEOUTS.connectMs, socketTimeout: STORAGE_TIMEOUTS.idleMs },
    maxAttempts: 2,
    // Checksums only where S3 requires them: the SHA-256 of every file is ours, kept in the database and checked by db:check.
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
  }));
}

/**
 * Runs one storage call: while storage was recently found not answering it fails at once; a failure other than
 * the caller's own abort becomes StorageUnavailableError (and marks storage down for a few seconds).
 */
async function guarded<T>(op: () => Promise<T>, signal?: AbortSignal): Promise<T> {
  if ((g.s3DownUntil ?? 0) > Date.now()) throw new StorageUnavailableError();
  const started = Date.now();
  try {
    return await op();
  } catch (e) {
    if (signal?.aborted || e instanceof StorageUnavailableError) throw e;
    // A refused connection fails at once anyway; a silent endpoint would hold every request for the timeouts.
    if (Date.now() - started >= STORAGE_TIMEOUTS.connectMs) g.s3DownUntil = Date.now() + DOWN_FOR_MS;
    throw new StorageUnavailableError(e);
  }
}

const PART_BYTES = 8 << 20;

/** Writes one capture's bytes (pieces in order) to its address; several parts at once for a large file. */
export async function putObject(url: string, pieces: Uint8Array[], meta: { sha256: string; contentType: string }, signal?: AbortSignal): Promise<void> {
  const { bucket, key } = parseObjectUrl(url);
  const size = pieces.reduce((n, p) => n + p.length, 0);
  const params = { Bucket: bucket, Key: key, ContentType: meta.contentType, Metadata: { sha256: meta.sha256 } };
  if (size <= PART_BYTES) {
    await guarded(() => s3().send(new PutObjectCommand({ ...params, Body: Buffer.concat(pieces, size), ContentLength: size }), { abortSignal: signal }), signal);
    return;
  }
  const upload = new Upload({ client: s3(), params: { ...params, Body: Readable.from(pieces) }, partSize: PART_BYTES, queueSize: 4, leavePartsOnError: false });
  signal?.addEventListener('abort', () => void upload.abort().catch(() => {}), { once: true });
  await guarded(() => upload.done(), signal);
}

/** The object's bytes as a web stream, with its length. */
export async function objectStream(url: string, signal?: AbortSignal): Promise<{ stream: ReadableStream<Uint8Array>; size: number }> {
  const { bucket, key } = parseObjectUrl(url);
  const r = await guarded(() => s3().send(new GetObjectCommand({ Bucket: bucket, Key: key }), { abortSignal: signal }), signal);
  if (!r.Body) throw new StorageUnavailableError(new Error(`${url} has no body`));
  return { stream: r.Body.transformToWebStream() as ReadableStream<Uint8Array>, size: Number(r.ContentLength ?? 0) };
}

/** The object's bytes as the pieces they arrive in. */
export async function readObject(url: string, signal?: AbortSignal): Promise<Uint8Array[]> {
  const { stream } = await objectStream(url, signal);
  const pieces: Uint8Array[] = [];
  for await (const piece of stream as unknown as AsyncIterable<Uint8Array>) pieces.push(piece);
  return pieces;
}

/** Size and recorded SHA-256 of an object, or null when there is none. */
export async function headObject(url: string): Promise<{ size: number; sha256?: string } | null> {
  const { bucket, key } = parseObjectUrl(url);
  try {
    const r = await s3().send(new HeadObjectCommand({ Bucket: bucket, Key: key }));
    return { size: Number(r.ContentLength ?? 0), sha256: r.Metadata?.sha256 };
  } catch (e) {
    if (e instanceof NotFound || (e as { name?: string }).name === 'NotFound' || (e as { $metadata?: { httpStatusCode?: number } }).$metadata?.httpStatusCode === 404) return null;
    throw new StorageUnavailableError(e);
  }
}

/** Whether the bucket answers a cheap listing of the capture prefix within `timeoutMs` (for the health check). */
export async function storageAnswers(target: { bucket: string; prefix: string }, timeoutMs = 2_000): Promise<boolean> {
  try {
    await s3().send(new ListObjectsV2Command({ Bucket: target.bucket, Prefix: target.prefix, MaxKeys: 1 }), { abortSignal: AbortSignal.timeout(timeoutMs) });
    return true;
  } catch {
    return false;
  }
}

/** Removes objects (a missing one is not an error), up to 1000 per request as S3 allows. */
export async function deleteObjects(urls: string[]): Promise<void> {
  const byBucket = new Map<string, string[]>();
  for (const u of urls) {
    const { bucket, key } = parseObjectUrl(u);
    const keys = byBucket.get(bucket);
    if (keys) keys.push(key);
    else byBucket.set(bucket, [key]);
  }
  for (const [bucket, keys] of byBucket) {
    for (let i = 0; i < keys.length; i += 1000) {
      const r = await guarded(() => s3().send(new DeleteObjectsCommand({ Bucket: bucket, Delete: { Objects: keys.slice(i, i + 1000).map((Key) => ({ Key })), Quiet: true } })));
      if (r.Errors?.length) throw new StorageUnavailableError(new Error(`Object storage kept ${r.Errors.length} object(s): ${r.Errors[0].Message ?? r.Errors[0].Code}`));
    }
  }
}

/** The bucket would not let these credentials list it: the sentence names the permission to grant. */
export class ListDeniedError extends Error {
  constructor(target: { bucket: string; prefix: string }, code: string) {
    super(`Object storage refused to list s3://${target.bucket}/${target.prefix} (${code}): give these credentials the s3:ListBucket permission on the bucket "${target.bucket}" (for the prefix "${target.prefix}"), then run this again.`);
    this.name = 'ListDeniedError';
  }
}

/** Every object under the target's prefix, a page of up to 1000 at a time. */
export async function* listObjects(target: { bucket: string; prefix: string }): AsyncGenerator<{ url: string; size: number; lastModified: Date }> {
  let token: string | undefined;
  do {
    let page;
    try {
      page = await s3().send(new ListObjectsV2Command({ Bucket: target.bucket, Prefix: target.prefix, ContinuationToken: token }));
    } catch (e) {
      const status = (e as { $metadata?: { httpStatusCode?: number } }).$metadata?.httpStatusCode;
      if (status === 403) throw new ListDeniedError(target, (e as { name?: string }).name ?? 'AccessDenied');
      throw new StorageUnavailableError(e);
    }
    for (const o of page.Contents ?? []) if (o.Key) yield { url: `s3://${target.bucket}/${o.Key}`, size: Number(o.Size ?? 0), lastModified: o.LastModified ?? new Date(0) };
    token = page.IsTruncated ? page.NextContinuationToken : undefined;
  } while (token);
}
