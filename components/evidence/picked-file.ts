import type { UploadFile } from '@/hooks/upload-with-progress';

/** A file chosen for upload, with what the device already knows about it. */
export interface PickedFile extends UploadFile {
  byteSize: number | null;
  widthPx: number | null;
  heightPx: number | null;
}

/** "2.4 MB", "812 kB": sizes as a phone's file list shows them (decimal units). */
export function formatBytes(bytes: number): string {
  if (bytes >= 1_000_000) return `${(bytes / 1_000_000).toFixed(1)} MB`;
  if (bytes >= 1_000) return `${Math.round(bytes / 1_000)} kB`;
  return `${bytes} bytes`;
}
