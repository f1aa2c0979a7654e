import { randomBytes } from 'node:crypto';
import { mkdir, open, readFile, rename, rm } from 'node:fs/promises';
import path from 'node:path';
import { type BlobStore, blobKey } from './blob-store';

/**
 * Blobs as files under one folder (`STORAGE_DIR`, by default `storage/blobs/` in the checkout).
 * A write goes to a temporary file in the blob's own folder, is flushed to disk, then renamed
 * over the final name: rename within one file system is atomic, so a crash or a full disk leaves
 * either no blob or a whole one, and the temporary file is removed on any error.
 */
export function localBlobStore(rootDir: string): BlobStore {
  const pathOf = (sha256: string) => path.join(rootDir, ...blobKey(sha256).split('/'));

  return {
    async put(sha256, data) {
      const finalPath = pathOf(sha256);
      const dir = path.dirname(finalPath);
      await mkdir(dir, { recursive: true });
      const tempPath = path.join(dir, `.${sha256}.${randomBytes(6).toString('hex')}.tmp`);
      try {
        const handle = await open(tempPath, 'wx', 0o640);
        try {
          await handle.writeFile(data);
          await handle.sync();
        } finally {
          await handle.close();
        }
        await rename(tempPath, finalPath);
      } catch (error) {
        await rm(tempPath, { force: true });
        throw error;
      }
    },

    async get(sha256) {
      try {
        return await readFile(pathOf(sha256));
      } catch (error) {
        if ((error as NodeJS.ErrnoException).code === 'ENOENT') return null;
        throw error;
      }
    },
  };
}
