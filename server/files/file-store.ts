import { createHash } from 'node:crypto';
import type { StorageConfig } from '../config';
import { fileAltered, fileMissing } from '../errors';
import type { BlobStore } from './blob-store';
import { localBlobStore } from './local-blob-store';
import { s3BlobStore } from './s3-blob-store';

export type FileIntegrity = 'intact' | 'missing' | 'altered';

export const sha256Of = (data: Uint8Array): string => createHash('sha256').update(data).digest('hex');

/**
 * Content-addressed files: a file's SHA-256 is its name, and every read hashes the bytes again,
 * so a file changed or damaged behind Flakeline's back is reported, never handed out.
 */
export class FileStore {
  constructor(private readonly blobs: BlobStore) {}

  /**
   * Stores the bytes and returns their SHA-256. Content that is already stored intact is not
   * written again; a stored copy that no longer matches is replaced by these (correct) bytes.
   */
  async save(data: Buffer): Promise<{ sha256: string; written: boolean }> {
    const sha256 = sha256Of(data);
    if ((await this.verify(sha256)) === 'intact') return { sha256, written: false };
    await this.blobs.put(sha256, data);
    return { sha256, written: true };
  }

  /** The bytes, re-checked: throws `file_missing` or `file_altered` instead of returning wrong ones. */
  async read(sha256: string): Promise<Buffer> {
    const data = await this.blobs.get(sha256);
    if (!data) throw fileMissing(sha256);
    if (sha256Of(data) !== sha256) throw fileAltered(sha256);
    return data;
  }

  async verify(sha256: string): Promise<FileIntegrity> {
    const data = await this.blobs.get(sha256);
    if (!data) return 'missing';
    return sha256Of(data) === sha256 ? 'intact' : 'altered';
  }
}

export function createFileStore(storage: StorageConfig): FileStore {
  return new FileStore(storage.backend === 's3' ? s3BlobStore(storage) : localBlobStore(storage.dir));
}
