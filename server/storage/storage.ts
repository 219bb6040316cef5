import { HeadBucketCommand, S3Client } from '@aws-sdk/client-s3';
import type { Config } from '../config';

export type Storage = {
  client: S3Client;
  buckets: Config['s3']['buckets'];
  /** Every bucket answers; throws with the reason otherwise. */
  check(): Promise<void>;
  close(): void;
};

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
  return {
    client,
    buckets: config.buckets,
    async check() {
      for (const bucket of Object.values(config.buckets)) {
        await client.send(new HeadBucketCommand({ Bucket: bucket }), { abortSignal: AbortSignal.timeout(3000) });
      }
    },
    close() {
      client.destroy();
    },
  };
}
