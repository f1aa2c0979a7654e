import { createHash } from 'node:crypto';
import { DeleteObjectCommand, PutObjectCommand } from '@aws-sdk/client-s3';
import { configFromEnv, type StorageConfig } from '../../server/config';
import { blobKey } from '../../server/files/blob-store';
import { FileStore } from '../../server/files/file-store';
import { s3BlobStore } from '../../server/files/s3-blob-store';
import { encodePng, MONOLAYER_MOS2_RAMAN, paintMicrograph, upload } from '../helpers/evidence-fixtures';
import { buildPerson } from '../helpers/factories';
import { insertSample } from '../helpers/sample-factories';
import { signedInAgent } from '../helpers/session-agent';
import { resetDatabase, startTestApp, type TestApp } from '../helpers/test-app';

/**
 * The S3-compatible storage path, against the local fake S3 server that `npm test` starts
 * (server/cli/test.ts passes its address as TEST_S3_*).
 */
function fakeS3Settings(): Extract<StorageConfig, { backend: 's3' }> {
  const env = process.env;
  if (!env.TEST_S3_ENDPOINT || !env.TEST_S3_BUCKET || !env.TEST_S3_ACCESS_KEY_ID || !env.TEST_S3_SECRET_ACCESS_KEY) {
    throw new Error(
      'TEST_S3_ENDPOINT and friends are not set: run the suites through `npm test`, which starts the fake S3 server.',
    );
  }
  return {
    backend: 's3',
    endpoint: env.TEST_S3_ENDPOINT,
    bucket: env.TEST_S3_BUCKET,
    region: env.TEST_S3_REGION ?? 'us-east-1',
    accessKeyId: env.TEST_S3_ACCESS_KEY_ID,
    secretAccessKey: env.TEST_S3_SECRET_ACCESS_KEY,
  };
}

const sha256 = (data: Buffer | string) => createHash('sha256').update(data).digest('hex');

let settings: ReturnType<typeof fakeS3Settings>;
let blobs: ReturnType<typeof s3BlobStore>;
let store: FileStore;
let lab: TestApp;

beforeAll(async () => {
  settings = fakeS3Settings();
  blobs = s3BlobStore(settings);
  store = new FileStore(blobs);
  lab = await startTestApp({ config: { storage: settings } });
});
afterAll(async () => {
  await lab?.close();
  blobs?.client.destroy();
});
beforeEach(() => resetDatabase());

/** Writes bytes under a blob's key behind the file store's back, as a tamperer with bucket access would. */
const overwriteObject = (sha: string, body: Buffer | string) =>
  blobs.client.send(new PutObjectCommand({ Bucket: settings.bucket, Key: blobKey(sha), Body: body }));

describe('configuration', () => {
  it('STORAGE_BACKEND=s3 reads the S3 settings; a missing one is named', () => {
    const base = { DATABASE_URL: 'postgres://x', SESSION_SECRET: 'x', STORAGE_BACKEND: 's3', S3_ENDPOINT: settings.endpoint };
    const full = { ...base, S3_BUCKET: 'b', S3_REGION: 'eu-central-1', S3_ACCESS_KEY_ID: 'k', S3_SECRET_ACCESS_KEY: 's' };
    expect(configFromEnv(full).storage).toEqual({
      backend: 's3',
      endpoint: settings.endpoint,
      bucket: 'b',
      region: 'eu-central-1',
      accessKeyId: 'k',
      secretAccessKey: 's',
    });
    expect(() => configFromEnv({ ...full, S3_BUCKET: '' })).toThrow('S3_BUCKET is not set (needed with STORAGE_BACKEND=s3).');
    expect(() => configFromEnv({ ...base, STORAGE_BACKEND: 'ftp' })).toThrow('STORAGE_BACKEND is "local" or "s3", got "ftp"');
    expect(
      configFromEnv({ DATABASE_URL: 'postgres://x', SESSION_SECRET: 'x', STORAGE_DIR: '/srv/flakeline-files' }).storage,
    ).toEqual({
      backend: 'local',
      dir: '/srv/flakeline-files',
    });
  });
});

describe('FileStore on an S3-compatible bucket', () => {
  it('stores content under its SHA-256, does not write it twice, and reads it back checked', async () => {
    const data = Buffer.from(`spectrum ${Date.now()}\n`);
    expect(await store.verify(sha256(data))).toBe('missing');
    expect(await store.save(data)).toEqual({ sha256: sha256(data), written: true });
    expect(await store.save(data)).toEqual({ sha256: sha256(data), written: false });
    expect(await store.verify(sha256(data))).toBe('intact');
    expect(Buffer.compare(await store.read(sha256(data)), data)).toBe(0);
  });

  it('reports an object changed behind its back as altered and refuses to read it; a removed one as missing', async () => {
    const data = Buffer.from(`profile ${Date.now()}\n`);
    const { sha256: sha } = await store.save(data);
    await overwriteObject(sha, 'something else');
    expect(await store.verify(sha)).toBe('altered');
    await expect(store.read(sha)).rejects.toMatchObject({ status: 409, code: 'file_altered' });
    // Saving the right bytes again repairs it.
    expect(await store.save(data)).toEqual({ sha256: sha, written: true });
    expect(await store.verify(sha)).toBe('intact');
    await blobs.client.send(new DeleteObjectCommand({ Bucket: settings.bucket, Key: blobKey(sha) }));
    expect(await store.verify(sha)).toBe('missing');
    await expect(store.read(sha)).rejects.toMatchObject({ status: 409, code: 'file_missing' });
  });
});

describe('the evidence API with STORAGE_BACKEND=s3', () => {
  it('uploads, serves and thumbnails through the bucket, and never serves an altered object', async () => {
    const person = await buildPerson(lab.knex);
    const { agent, csrfToken } = await signedInAgent(lab.app, person.email);
    const flake = await insertSample(lab.knex, person, {
      kind: 'flake',
      material: 'MoS2',
      properties: { substrate: 'si_sio2', oxideThicknessNm: 285 },
    });
    const png = encodePng(
      paintMicrograph({ width: 500, height: 400, substrate: { red: 160, green: 110, blue: 190 }, noise: 5, seed: Date.now() }),
    );
    const micrograph = await upload(
      agent,
      csrfToken,
      `/api/samples/${flake.code}/evidence`,
      { data: png, name: 'scan.png' },
      'micrograph',
    );
    expect(micrograph.status).toBe(201);
    expect(await store.verify(sha256(png))).toBe('intact');
    const served = await agent.get(micrograph.body.evidence.file.url).buffer(true);
    expect(served.status).toBe(200);
    expect(Buffer.compare(served.body as Buffer, png)).toBe(0);
    expect((await agent.get(micrograph.body.evidence.file.thumbnailUrl)).status).toBe(200);

    const raman = await upload(
      agent,
      csrfToken,
      `/api/samples/${flake.code}/evidence`,
      { data: MONOLAYER_MOS2_RAMAN(), name: 'r.csv' },
      'raman',
    );
    expect(raman.status).toBe(201);
    expect(raman.body.evidence.estimate).toMatchObject({ layers: 1, method: 'raman' });

    await overwriteObject(sha256(png), Buffer.from('not the micrograph'));
    const altered = await agent.get(micrograph.body.evidence.file.url);
    expect(altered.status).toBe(409);
    expect(altered.body.error.code).toBe('file_altered');
  });
});
