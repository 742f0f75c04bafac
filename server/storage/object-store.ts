import {
  DeleteObjectCommand, DeleteObjectsCommand, GetObjectCommand, HeadBucketCommand, ListObjectsV2Command, PutObjectCommand, S3Client,
} from '@aws-sdk/client-s3';
import { Upload } from '@aws-sdk/lib-storage';
import type { Readable } from 'node:stream';
import type { Config } from '../config.ts';

/** The S3-compatible store holding uploaded trajectories and report curves. */
/** S3 and compatible stores take at most this many parts in one multipart upload. */
export const MAX_UPLOAD_PARTS = 10_000;
const DEFAULT_PART_BYTES = 8 * 1024 * 1024;

/**
 * Bytes per part of a multipart upload: 8 MiB, or more when the largest
 * allowed file would otherwise need more parts than the store accepts
 * (8 MiB parts reach only 78 GiB).
 */
export function uploadPartBytes(largestBytes: number): number {
  return Math.max(DEFAULT_PART_BYTES, Math.ceil(largestBytes / MAX_UPLOAD_PARTS / 1024 ** 2) * 1024 ** 2);
}

export class ObjectStore {
  readonly client: S3Client;

  constructor(readonly bucket: string, client: S3Client) {
    this.client = client;
  }

  static fromConfig(config: Config): ObjectStore {
    // The SDK version is pinned by the lock file to one that supports Node 20;
    // its notice about future releases would only repeat in every log.
    process.env['AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED'] ??= 'true';
    const client = new S3Client({
      endpoint: config.S3_ENDPOINT,
      region: config.S3_REGION,
      forcePathStyle: true,
      credentials: { accessKeyId: config.S3_ACCESS_KEY_ID, secretAccessKey: config.S3_SECRET_ACCESS_KEY },
      // With the SDK defaults a streamed body is stored with its aws-chunked framing by S3-compatible fakes.
      requestChecksumCalculation: 'WHEN_REQUIRED',
      responseChecksumValidation: 'WHEN_REQUIRED',
    });
    return new ObjectStore(config.S3_BUCKET, client);
  }

  async ping(): Promise<void> {
    await this.client.send(new HeadBucketCommand({ Bucket: this.bucket }));
  }

  async putBytes(key: string, body: Uint8Array, contentType = 'application/octet-stream'): Promise<void> {
    await this.client.send(new PutObjectCommand({ Bucket: this.bucket, Key: key, Body: body, ContentType: contentType }));
  }

  /**
   * Multipart upload of a stream of unknown length, at most `largestBytes`
   * long; abort() removes the parts already sent.
   */
  streamUpload(key: string, body: Readable, contentType = 'application/octet-stream', largestBytes = 0): Upload {
    return new Upload({
      client: this.client,
      params: { Bucket: this.bucket, Key: key, Body: body, ContentType: contentType },
      queueSize: 2,
      partSize: uploadPartBytes(largestBytes),
      leavePartsOnError: false,
    });
  }

  async getStream(key: string, range?: { start: number; end?: number }): Promise<Readable> {
    const out = await this.client.send(new GetObjectCommand({
      Bucket: this.bucket,
      Key: key,
      Range: range ? `bytes=${range.start}-${range.end ?? ''}` : undefined,
    }));
    return out.Body as Readable;
  }

  async getBytes(key: string): Promise<Uint8Array> {
    const out = await this.client.send(new GetObjectCommand({ Bucket: this.bucket, Key: key }));
    if (!out.Body) throw new Error(`object ${key} has no body`);
    return out.Body.transformToByteArray();
  }

  /** `length` bytes of an object from byte `start` (one ranged request). */
  async getRange(key: string, start: number, length: number): Promise<Uint8Array> {
    if (length <= 0) return new Uint8Array(0);
    const out = await this.client.send(new GetObjectCommand({ Bucket: this.bucket, Key: key, Range: `bytes=${start}-${start + length - 1}` }));
    if (!out.Body) throw new Error(`object ${key} has no body`);
    const bytes = await out.Body.transformToByteArray();
    if (bytes.length !== length) throw new Error(`object ${key}: asked for ${length} bytes at ${start}, got ${bytes.length}`);
    return bytes;
  }

  async delete(key: string): Promise<void> {
    await this.client.send(new DeleteObjectCommand({ Bucket: this.bucket, Key: key }));
  }

  /** Every key under a prefix, in pages of up to 1000. */
  async listKeys(prefix: string): Promise<string[]> {
    const keys: string[] = [];
    let token: string | undefined;
    do {
      const page = await this.client.send(new ListObjectsV2Command({ Bucket: this.bucket, Prefix: prefix, ContinuationToken: token }));
      for (const item of page.Contents ?? []) if (item.Key) keys.push(item.Key);
      token = page.IsTruncated ? page.NextContinuationToken : undefined;
    } while (token);
    return keys;
  }

  /** Deletes everything under a prefix; returns how many objects went. */
  async deletePrefix(prefix: string): Promise<number> {
    if (!prefix) throw new Error('refusing to delete the whole bucket');
    const keys = await this.listKeys(prefix);
    for (let i = 0; i < keys.length; i += 1000) {
      const batch = keys.slice(i, i + 1000);
      const out = await this.client.send(new DeleteObjectsCommand({
        Bucket: this.bucket, Delete: { Objects: batch.map((Key) => ({ Key })), Quiet: true },
      }));
      if (out.Errors?.length) throw new Error(`could not delete ${out.Errors.length} objects under ${prefix}: ${out.Errors[0]?.Message ?? 'unknown error'}`);
    }
    return keys.length;
  }

  close(): void {
    this.client.destroy();
  }
}
