import {
  launchCameraAsync,
  launchImageLibraryAsync,
  requestCameraPermissionsAsync,
  type ImagePickerAsset,
} from 'expo-image-picker';
import type { PickedFile } from './picked-file';

export type ImageSource = 'camera' | 'library';
export type ImagePick = { kind: 'picked'; file: PickedFile } | { kind: 'cancelled' } | { kind: 'camera_denied' };

const BY_EXTENSION: Record<string, string> = {
  jpg: 'image/jpeg',
  jpeg: 'image/jpeg',
  png: 'image/png',
  tif: 'image/tiff',
  tiff: 'image/tiff',
};

function asPicked(asset: ImagePickerAsset): PickedFile {
  const name = asset.fileName ?? asset.uri.split('/').pop() ?? 'micrograph';
  const extension = name.split('.').pop()?.toLowerCase() ?? '';
  return {
    name,
    // Only a hint for the multipart part: the server reads the type from the bytes themselves.
    mediaType: asset.mimeType ?? BY_EXTENSION[extension] ?? 'application/octet-stream',
    blob: asset.file,
    uri: asset.file ? undefined : asset.uri,
    byteSize: asset.fileSize ?? asset.file?.size ?? null,
    widthPx: asset.width > 0 ? asset.width : null,
    heightPx: asset.height > 0 ? asset.height : null,
  };
}

/**
 * A micrograph from the phone's camera or from the photo library / a file. Full quality and no
 * cropping: contrast is measured on the pixels as the camera saved them.
 */
export async function pickImage(source: ImageSource): Promise<ImagePick> {
  const options = { mediaTypes: ['images' as const], quality: 1, allowsEditing: false, exif: false };
  if (source === 'camera') {
    const permission = await requestCameraPermissionsAsync();
    if (!permission.granted) return { kind: 'camera_denied' };
  }
  const result = source === 'camera' ? await launchCameraAsync(options) : await launchImageLibraryAsync(options);
  const asset = result.canceled ? null : result.assets[0];
  return asset ? { kind: 'picked', file: asPicked(asset) } : { kind: 'cancelled' };
}
