import { defaultFormats, Jimp } from 'jimp';
import { IMAGE_MAX_PIXELS, THUMBNAIL_MAX_EDGE_PX } from '../../shared/schemas/evidence';
import { imageCorrupt } from '../errors';

/** A decoded micrograph: 8-bit RGBA, row by row from the top-left corner. */
export interface DecodedImage {
  rgba: Uint8Array;
  width: number;
  height: number;
}

// The codecs jimp ships, used directly: jimp's own type detection loads an ESM-only module at run
// time, and the type is already known from the content by then (see sniff.ts).
interface Codec {
  decode: (
    data: Buffer,
    options?: Record<string, unknown>,
  ) => { data: Uint8Array; width: number; height: number } | Promise<{ data: Uint8Array; width: number; height: number }>;
}
const CODECS = new Map<string, Codec>(
  defaultFormats.map((format) => format()).map((codec) => [codec.mime, codec as unknown as Codec]),
);

const JPEG_OPTIONS = {
  tolerantDecoding: false,
  maxResolutionInMP: IMAGE_MAX_PIXELS / 1e6,
  // 4 bytes a pixel for the output plus the decoder's own component planes.
  maxMemoryUsageInMB: Math.ceil((IMAGE_MAX_PIXELS * 8) / 1e6),
};

/**
 * EXIF orientations 2–8 (EXIF 2.3, tag 0x0112) as "which source pixel lands at (x, y)" on an
 * image `w` × `h` before turning. 5–8 swap width and height.
 */
const ORIENTATIONS: Record<number, (x: number, y: number, w: number, h: number) => [number, number]> = {
  2: (x, y, w) => [w - 1 - x, y],
  3: (x, y, w, h) => [w - 1 - x, h - 1 - y],
  4: (x, y, _w, h) => [x, h - 1 - y],
  5: (x, y) => [y, x],
  6: (x, y, _w, h) => [y, h - 1 - x],
  7: (x, y, w, h) => [w - 1 - y, h - 1 - x],
  8: (x, y, w) => [w - 1 - y, x],
};

function applyOrientation(image: DecodedImage, orientation: number | undefined): DecodedImage {
  const source = orientation ? ORIENTATIONS[orientation] : undefined;
  if (!source) return image;
  const swapped = orientation! >= 5;
  const width = swapped ? image.height : image.width;
  const height = swapped ? image.width : image.height;
  const rgba = new Uint8Array(image.rgba.length);
  const view32 = new Uint32Array(image.rgba.buffer, image.rgba.byteOffset, image.rgba.length / 4);
  const out32 = new Uint32Array(rgba.buffer);
  for (let y = 0; y < height; y += 1) {
    for (let x = 0; x < width; x += 1) {
      const [sx, sy] = source(x, y, image.width, image.height);
      out32[y * width + x] = view32[sy * image.width + sx];
    }
  }
  return { rgba, width, height };
}

/**
 * Decodes a JPEG, PNG or TIFF whose header has already passed the pixel limit. JPEG decoding is
 * strict: a file cut short is refused rather than shown with a grey bottom. A JPEG's EXIF
 * orientation is applied, as browsers do when they show it, so regions marked on screen and
 * pixels here agree.
 */
export async function decodeImage(
  data: Buffer,
  expected: { mediaType: string; widthPx: number; heightPx: number; orientation?: number },
): Promise<DecodedImage> {
  const codec = CODECS.get(expected.mediaType);
  if (!codec) throw imageCorrupt(`Flakeline cannot decode ${expected.mediaType} images.`);
  let bitmap: { data: Uint8Array; width: number; height: number };
  try {
    bitmap = await codec.decode(data, expected.mediaType === 'image/jpeg' ? JPEG_OPTIONS : undefined);
  } catch {
    throw imageCorrupt(
      'The image could not be decoded: the file is damaged, cut short, or uses an encoding Flakeline cannot read.',
    );
  }
  const { width, height } = bitmap;
  const rgba = bitmap.data;
  if (width !== expected.widthPx || height !== expected.heightPx || !rgba || rgba.length !== width * height * 4) {
    throw imageCorrupt(
      `The image decodes to ${width} × ${height} pixels, not the ${expected.widthPx} × ${expected.heightPx} its header says: the file is damaged.`,
    );
  }
  const aligned = rgba.byteOffset % 4 === 0 ? rgba : new Uint8Array(rgba);
  return applyOrientation({ rgba: aligned, width, height }, expected.orientation);
}

/**
 * A PNG no larger than THUMBNAIL_MAX_EDGE_PX on its longer edge. Each thumbnail pixel is the
 * mean of the block of image pixels it covers (area averaging), which keeps thin flakes visible
 * and is faster than a general resampler on a 12-megapixel image.
 */
export async function thumbnailPng(image: DecodedImage): Promise<Buffer> {
  const scale = Math.min(1, THUMBNAIL_MAX_EDGE_PX / Math.max(image.width, image.height));
  const width = Math.max(1, Math.round(image.width * scale));
  const height = Math.max(1, Math.round(image.height * scale));
  const out = Buffer.alloc(width * height * 4);
  const sums = new Float64Array(width * 4);
  const counts = new Uint32Array(width);
  const columnOf = new Uint32Array(image.width);
  for (let x = 0; x < image.width; x += 1) columnOf[x] = Math.min(width - 1, Math.floor((x * width) / image.width));
  let row = 0;
  const flush = (target: number) => {
    for (let tx = 0; tx < width; tx += 1) {
      const n = counts[tx] || 1;
      for (let c = 0; c < 4; c += 1) out[(target * width + tx) * 4 + c] = Math.round(sums[tx * 4 + c] / n);
    }
    sums.fill(0);
    counts.fill(0);
  };
  for (let y = 0; y < image.height; y += 1) {
    const target = Math.min(height - 1, Math.floor((y * height) / image.height));
    if (target !== row) {
      flush(row);
      row = target;
    }
    const base = y * image.width * 4;
    for (let x = 0; x < image.width; x += 1) {
      const tx = columnOf[x];
      const i = base + x * 4;
      sums[tx * 4] += image.rgba[i];
      sums[tx * 4 + 1] += image.rgba[i + 1];
      sums[tx * 4 + 2] += image.rgba[i + 2];
      sums[tx * 4 + 3] += image.rgba[i + 3];
      counts[tx] += 1;
    }
  }
  flush(row);
  return new Jimp({ data: out, width, height }).getBuffer('image/png');
}
