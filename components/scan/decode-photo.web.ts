import { BarcodeDetector } from 'barcode-detector';
import type { ImagePickerAsset } from 'expo-image-picker';
import { configureQrDecoder } from './configure-decoder';

async function imageFrom(asset: ImagePickerAsset): Promise<ImageBitmap | HTMLImageElement> {
  // The picked file itself, when the picker hands it over: no request, so the CSP's
  // connect-src (which does not list blob: or data:) is never involved.
  if (asset.file) return createImageBitmap(asset.file);
  const image = new Image();
  image.src = asset.uri;
  await image.decode();
  return image;
}

/** The text of the first QR code in a picked photo, or null when none can be read. */
export async function decodeQrInPhoto(asset: ImagePickerAsset): Promise<string | null> {
  configureQrDecoder();
  const detector = new BarcodeDetector({ formats: ['qr_code'] });
  const image = await imageFrom(asset);
  try {
    const found = await detector.detect(image);
    return found[0]?.rawValue ?? null;
  } finally {
    if ('close' in image) image.close();
  }
}
