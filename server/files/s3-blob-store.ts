import { GetObjectCommand, NoSuchKey, PutObjectCommand, S3Client } from '@aws-sdk/client-s3';
import { type BlobStore, blobKey } from './blob-store';

export interface S3Settings {
  endpoint: string;
  bucket: string;
  region: string;
  accessKeyId: string;
  secretAccessKey: string;
}

/**
 * Blobs as objects in an S3-compatible bucket. A PUT replaces an object as a whole, so readers
 * never see part of one. Path-style addressing (`endpoint/bucket/key`) works with every
 * S3-compatible server, including self-hosted ones without per-bucket host names. The SDK's
 * optional request checksums are sent only where the protocol requires them, since not every
 * compatible server understands them; the file store checks SHA-256 on every read anyway.
 */
export function s3BlobStore(settings: S3Settings): BlobStore & { client: S3Client } {
  const client = new S3Client({
    endpoint: settings.endpoint,
    region: settings.region,
    forcePathStyle: true,
    credentials: { accessKeyId: settings.accessKeyId, secretAccessKey: settings.secretAccessKey },
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
  });
  const Bucket = settings.bucket;

  return {
    client,
    async put(sha256, data) {
      await client.send(new PutObjectCommand({ Bucket, Key: blobKey(sha256), Body: data, ContentLength: data.length }));
    },

    async get(sha256) {
      try {
        const response = await client.send(new GetObjectCommand({ Bucket, Key: blobKey(sha256) }));
        if (!response.Body) return null;
        return Buffer.from(await response.Body.transformToByteArray());
      } catch (error) {
        if (error instanceof NoSuchKey || (error as { name?: string }).name === 'NoSuchKey') return null;
        throw error;
      }
    },
  };
}
