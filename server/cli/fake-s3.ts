import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import S3rver from 's3rver';

/** What a client needs to reach the fake, in the names STORAGE_BACKEND=s3 reads. */
export interface FakeS3 {
  env: { S3_ENDPOINT: string; S3_BUCKET: string; S3_REGION: string; S3_ACCESS_KEY_ID: string; S3_SECRET_ACCESS_KEY: string };
  close: () => Promise<void>;
}

/**
 * A local S3-compatible server (s3rver) on a free loopback port, keeping objects in a temporary
 * folder, with one empty bucket. For tests of the S3 storage path only.
 */
export async function startFakeS3(bucket = 'flakeline-test'): Promise<FakeS3> {
  const directory = mkdtempSync(path.join(os.tmpdir(), 'flakeline-s3-'));
  const server = new S3rver({
    address: '127.0.0.1',
    port: 0,
    silent: true,
    directory,
    vhostBuckets: false,
    configureBuckets: [{ name: bucket }],
  });
  const { port } = await server.run();
  return {
    env: {
      S3_ENDPOINT: `http://127.0.0.1:${port}`,
      S3_BUCKET: bucket,
      S3_REGION: 'us-east-1',
      // s3rver accepts the credentials it was started with; these are its documented defaults.
      S3_ACCESS_KEY_ID: 'S3RVER',
      S3_SECRET_ACCESS_KEY: 'S3RVER',
    },
    close: async () => {
      await server.close();
      rmSync(directory, { recursive: true, force: true });
    },
  };
}
