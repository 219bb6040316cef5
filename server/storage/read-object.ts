import { GetObjectCommand } from '@aws-sdk/client-s3';
import type { Bucket, Storage } from './storage';

/**
 * The bytes of one stored object, for the server's own use (a photo in a PDF or a data export);
 * files going to people leave through signed links instead.
 */
export async function readObject(storage: Storage, bucket: Bucket, key: string): Promise<Buffer> {
  const out = await storage.client.send(new GetObjectCommand({ Bucket: storage.buckets[bucket], Key: key }), { abortSignal: AbortSignal.timeout(30_000) });
  if (!out.Body) throw new Error(`stored object ${key} has no body`);
  return Buffer.from(await out.Body.transformToByteArray());
}
