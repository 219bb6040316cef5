import { DeleteObjectCommand, GetObjectCommand, HeadBucketCommand, PutObjectCommand, S3Client } from '@aws-sdk/client-s3';
import { getSignedUrl } from '@aws-sdk/s3-request-presigner';
import type { Config } from '../config';
import { unavailable } from '../errors';

export type Bucket = keyof Config['s3']['buckets'];

export type Storage = {
  client: S3Client;
  buckets: Config['s3']['buckets'];
  /** Every bucket answers; throws with the reason otherwise. */
  check(): Promise<void>;
  /** Stores bytes under a key; a store that cannot be reached becomes a clear 503. */
  put(bucket: Bucket, key: string, body: Buffer, contentType: string): Promise<void>;
  /** Removes an object (a missing one is fine); a store that cannot be reached becomes a clear 503. */
  remove(bucket: Bucket, key: string): Promise<void>;
  /** A download link that works for a few minutes (never more than 5), naming the file. */
  signedUrl(bucket: Bucket, key: string, fileName: string, seconds?: number): Promise<string>;
  close(): void;
};

/** Downloads are handed out for at most this long after the access check. */
export const SIGNED_URL_SECONDS = 300;

export function createStorage(config: Config['s3']): Storage {
  const client = new S3Client({
    endpoint: config.endpoint,
    region: config.region,
    forcePathStyle: config.forcePathStyle,
    credentials: { accessKeyId: config.accessKeyId, secretAccessKey: config.secretAccessKey },
    // Newer SDKs add streaming checksums that some S3-compatible servers (s3rver among them)
    // store corrupted; real S3 accepts either way.
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
    maxAttempts: 2,
  });
  const name = (bucket: Bucket) => config.buckets[bucket];
  return {
    client,
    buckets: config.buckets,
    async check() {
      for (const bucket of Object.values(config.buckets)) {
        await client.send(new HeadBucketCommand({ Bucket: bucket }), { abortSignal: AbortSignal.timeout(3000) });
      }
    },
    async put(bucket, key, body, contentType) {
      try {
        await client.send(new PutObjectCommand({ Bucket: name(bucket), Key: key, Body: body, ContentType: contentType }), {
          abortSignal: AbortSignal.timeout(30_000),
        });
      } catch (error) {
        console.error('[storage] put failed:', error instanceof Error ? error.message : error);
        throw unavailable('The file store cannot be reached just now, so nothing was saved. Please try again in a few minutes.');
      }
    },
    async remove(bucket, key) {
      try {
        await client.send(new DeleteObjectCommand({ Bucket: name(bucket), Key: key }), { abortSignal: AbortSignal.timeout(10_000) });
      } catch (error) {
        console.error('[storage] remove failed:', error instanceof Error ? error.message : error);
        throw unavailable('The file store cannot be reached just now, so nothing was removed. Please try again in a few minutes.');
      }
    },
    async signedUrl(bucket, key, fileName, seconds = SIGNED_URL_SECONDS) {
      // RFC 6266: a plain-ASCII name for old clients, and the real name, UTF-8, in filename*.
      const safe = fileName.replace(/[^\w.\- ]+/g, '_');
      const disposition = `attachment; filename="${safe}"; filename*=UTF-8''${encodeURIComponent(fileName).replace(/['()*]/g, (c) => `%${c.charCodeAt(0).toString(16).toUpperCase()}`)}`;
      return getSignedUrl(
        client,
        new GetObjectCommand({ Bucket: name(bucket), Key: key, ResponseContentDisposition: disposition }),
        { expiresIn: Math.min(seconds, SIGNED_URL_SECONDS) },
      );
    },
    close() {
      client.destroy();
    },
  };
}
