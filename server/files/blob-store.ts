/**
 * Where file bytes live. Blobs are named by the SHA-256 of their content (64 lower-case hex
 * digits), so a name can only ever hold one content; the file store on top re-checks that.
 */
export interface BlobStore {
  /** Stores the bytes under the name atomically: a reader sees the old content or all of the new, never part. */
  put(sha256: string, data: Buffer): Promise<void>;
  /** The bytes under the name, or null when nothing is stored there. */
  get(sha256: string): Promise<Buffer | null>;
}

const SHA256_HEX = /^[0-9a-f]{64}$/;

/**
 * `ab/cd/abcd…`: two levels of fan-out keep any one folder (or key prefix) small. Refuses
 * anything but a hex digest, so a name can never climb out of the store.
 */
export function blobKey(sha256: string): string {
  if (!SHA256_HEX.test(sha256)) throw new Error(`Not a SHA-256 hex digest: ${JSON.stringify(sha256)}`);
  return `${sha256.slice(0, 2)}/${sha256.slice(2, 4)}/${sha256}`;
}
