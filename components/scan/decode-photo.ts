import { scanFromURLAsync } from 'expo-camera';
import type { ImagePickerAsset } from 'expo-image-picker';

/** The text of the first QR code in a picked photo, or null when none can be read. */
export async function decodeQrInPhoto(asset: ImagePickerAsset): Promise<string | null> {
  const found = await scanFromURLAsync(asset.uri, ['qr']);
  return found[0]?.data ?? null;
}
